/** The look-up of published connector sheets that an adapter end can link. */
import { api, type RequestOptions } from './client';
import type { EntityId } from './types';

/** A published connector sheet as the look-up lists it. */
export interface ConnectorChoice {
  id: EntityId;
  slug: string;
  title: string;
  component: string;
  cavities: number;
  sealed: boolean;
  view: 'mating-face' | 'wire-side' | null;
}

/** `GET /api/connectors?q=`: published sheets whose title, component or tags match every word. */
export async function findConnectors(
  q: string,
  options: RequestOptions = {},
): Promise<ConnectorChoice[]> {
  const body = await api.get<{ items: ConnectorChoice[] }>('/api/connectors', {
    ...options,
    query: { ...options.query, q: q.trim().slice(0, 120), limit: 10 },
  });
  return body.items;
}
