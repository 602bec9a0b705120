import { toValue, type MaybeRefOrGetter } from 'vue';
import type { EntityId } from '@/api/types';
import { listRevisions, type RevisionSummary } from '@/api/documents';
import { useResource, type Resource } from './useResource';

/**
 * The revisions of a document, newest first (author and moderators only). Reloads when
 * the id changes; with no id there is nothing to load.
 */
export function useRevisions(
  documentId: MaybeRefOrGetter<EntityId | null | undefined>,
): Resource<RevisionSummary[]> {
  return useResource(
    async (signal) => {
      const id = toValue(documentId);
      if (id === null || id === undefined || id === '') return [];
      return listRevisions(id, { signal, quiet: true });
    },
    { watch: () => toValue(documentId) },
  );
}
