/**
 * Per-kind pieces of the document pages. The editor page, the public page and the
 * review page are shared by all kinds; each kind plugs in its editor and its reader's
 * view here (adapter sheets and write-ups add theirs when they land).
 */
import { defineAsyncComponent, type Component } from 'vue';
import { emptyConnectorContent } from '@shared/schemas/connector';
import { emptyWriteupContent } from '@shared/schemas/writeup';
import { emptyAdapterContent } from '@/components/adapter/adapterContent';
import type { DocumentKind } from '@/api/documents';

/** Editors take `v-model` of `{ title, content }` and a `readonly` prop. */
export const KIND_EDITORS: Partial<Record<DocumentKind, Component>> = {
  connector: defineAsyncComponent(() => import('@/components/connector/ConnectorEditor.vue')),
  writeup: defineAsyncComponent(() => import('@/components/writeup/WriteupEditor.vue')),
  adapter: defineAsyncComponent(() => import('@/components/adapter/AdapterEditor.vue')),
};

/** Views take `doc` (the document view from GET /api/documents/:idOrSlug) and `headingLevel` (1 on its own page). */
export const KIND_VIEWS: Partial<Record<DocumentKind, Component>> = {
  connector: defineAsyncComponent(() => import('@/components/connector/ConnectorSheet.vue')),
  writeup: defineAsyncComponent(() => import('@/components/writeup/WriteupView.vue')),
  adapter: defineAsyncComponent(() => import('@/components/adapter/AdapterSheet.vue')),
};

/** Content of a blank document of each kind. */
export function emptyContent(kind: DocumentKind): Record<string, unknown> {
  if (kind === 'connector') return emptyConnectorContent() as Record<string, unknown>;
  if (kind === 'writeup') return emptyWriteupContent() as Record<string, unknown>;
  if (kind === 'adapter') return emptyAdapterContent() as Record<string, unknown>;
  return {};
}

/** Words for the kind in headings: "connector sheet". */
export const KIND_NOUNS: Record<DocumentKind, string> = {
  connector: 'connector sheet',
  adapter: 'adapter sheet',
  writeup: 'write-up',
};
