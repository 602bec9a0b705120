/** Search, as-you-type suggestions and the browse facets. */
import { api, type RequestOptions } from './client';
import type {
  BrowseAnswer,
  SearchAnswer,
  SearchItem,
  SearchSort,
  Suggestion,
} from '@shared/schemas/search';

export type { BrowseAnswer, SearchAnswer, SearchItem, SearchSort, Suggestion };

/** The parameters of `GET /api/search`, as the lookup page keeps them. */
export interface SearchParams {
  q?: string;
  kind?: string;
  cavities?: number;
  cavitiesMin?: number;
  cavitiesMax?: number;
  component?: string;
  sealed?: boolean;
  housing?: string;
  color?: string;
  role?: string;
  tag?: string;
  sort?: SearchSort;
  limit?: number;
  offset?: number;
}

export function searchDocuments(
  params: SearchParams,
  options: RequestOptions = {},
): Promise<SearchAnswer> {
  return api.get<SearchAnswer>('/api/search', {
    ...options,
    query: params as Record<string, string | number | boolean | undefined>,
  });
}

export async function suggest(q: string, options: RequestOptions = {}): Promise<Suggestion[]> {
  const body = await api.get<{ items: Suggestion[] }>('/api/search/suggest', {
    quiet: true,
    ...options,
    query: { q },
  });
  return body.items;
}

let browseCache: Promise<BrowseAnswer> | null = null;

/** The browse facets; read once per page load (they change only when something is published). */
export function browseFacets(options: RequestOptions = {}): Promise<BrowseAnswer> {
  if (!browseCache) {
    browseCache = api.get<BrowseAnswer>('/api/browse', options);
    browseCache.catch(() => (browseCache = null));
  }
  return browseCache;
}
