/** Published write-ups. */
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';
import type { PersonRef } from './documents';

export interface WriteupListItem {
  id: EntityId;
  slug: string;
  title: string;
  summary: string;
  owner: PersonRef | null;
  publishedAt: string | null;
  images: number;
  thumbUrl: string | null;
  hasWireRun: boolean;
  hasParts: boolean;
}

export function listWriteups(
  query: { limit?: number; offset?: number } = {},
  options: RequestOptions = {},
): Promise<{ total: number; items: WriteupListItem[] }> {
  return api.get('/api/writeups', { ...options, query: { ...options.query, ...query } });
}
