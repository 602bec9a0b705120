import { api, type RequestOptions } from './client';
import type { DevMail } from './types';

/** Mail caught by the development SMTP fake, newest first. 404 outside development. */
export function listMail(options?: RequestOptions): Promise<DevMail[]> {
  return api.get<DevMail[]>('/api/dev/mail', options);
}

export async function clearMail(options?: RequestOptions): Promise<void> {
  await api.delete('/api/dev/mail', options);
}
