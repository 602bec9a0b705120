import { api, type RequestOptions } from './client';
import type { SiteMeta } from './types';

export function fetchMeta(options?: RequestOptions): Promise<SiteMeta> {
  return api.get<SiteMeta>('/api/meta', options);
}
