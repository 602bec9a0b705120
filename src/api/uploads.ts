/**
 * Image uploads. The upload itself goes through XMLHttpRequest, the one browser API that
 * reports upload progress; everything else goes through the shared client.
 */
import type { Annotation } from '@shared/schemas/annotations';
import { ApiError, getCsrfToken, resetCsrfToken } from './client';

/** `POST /api/uploads` answer. */
export interface UploadedImage {
  id: string;
  url: string;
  thumbUrl: string;
  width: number;
  height: number;
}

export type UploadPhase = 'sending' | 'processing';

export interface UploadOptions {
  /** Called with the sent fraction (0..1) while sending, then once with 'processing'. */
  onProgress?: (phase: UploadPhase, fraction: number) => void;
  signal?: AbortSignal;
}

export const uploadUrl = (id: string) => `/api/uploads/${encodeURIComponent(id)}`;
export const thumbUrl = (id: string) => `/api/uploads/${encodeURIComponent(id)}/thumb`;

function errorFrom(xhr: XMLHttpRequest): ApiError {
  let body: { error?: { code?: unknown; message?: unknown } } | null;
  try {
    body = JSON.parse(xhr.responseText);
  } catch {
    body = null;
  }
  const status = xhr.status;
  const fallback =
    status === 413
      ? 'That file is too large: send an image smaller than 15 MB.'
      : status === 415
        ? 'That file is not a JPEG, PNG or WebP image.'
        : status === 0
          ? 'Could not reach Loomwright. Check your connection and try again in a moment.'
          : `The upload failed (${status}).`;
  return new ApiError({
    status,
    code:
      typeof body?.error?.code === 'string'
        ? body.error.code
        : status
          ? `HTTP_${status}`
          : 'NETWORK',
    message: typeof body?.error?.message === 'string' ? body.error.message : fallback,
  });
}

function send(file: File | Blob, token: string, opts: UploadOptions): Promise<UploadedImage> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/uploads');
    xhr.withCredentials = true;
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) opts.onProgress?.('sending', e.total ? e.loaded / e.total : 0);
    };
    // Everything is sent: the server now checks and re-encodes the image.
    xhr.upload.onload = () => opts.onProgress?.('processing', 1);
    xhr.onload = () => {
      if (xhr.status === 201 || xhr.status === 200) {
        try {
          resolve(JSON.parse(xhr.responseText) as UploadedImage);
        } catch {
          reject(errorFrom(xhr));
        }
      } else reject(errorFrom(xhr));
    };
    xhr.onerror = () => reject(errorFrom(xhr));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    opts.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    form.append('file', file, file instanceof File ? file.name : 'image');
    xhr.send(form);
  });
}

/** Uploads one image with progress; a stale CSRF token is fetched again once. */
export async function uploadImage(
  file: File | Blob,
  opts: UploadOptions = {},
): Promise<UploadedImage> {
  const token = await getCsrfToken(opts.signal);
  try {
    return await send(file, token, opts);
  } catch (error) {
    if (error instanceof ApiError && error.status === 403 && error.code === 'CSRF_INVALID') {
      resetCsrfToken();
      return send(file, await getCsrfToken(opts.signal), opts);
    }
    throw error;
  }
}

/** The image with its markings drawn in, as a file to save. */
export async function flattenImage(
  id: string,
  annotations: Annotation[],
): Promise<{ blob: Blob; fileName: string }> {
  const token = await getCsrfToken();
  const res = await fetch(`${uploadUrl(id)}/flatten`, {
    method: 'POST',
    credentials: 'same-origin',
    headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token, Accept: 'image/*' },
    body: JSON.stringify({ annotations }),
  });
  if (!res.ok) {
    let message = `The download failed (${res.status}).`;
    let code = `HTTP_${res.status}`;
    try {
      const body = await res.json();
      if (typeof body?.error?.message === 'string') message = body.error.message;
      if (typeof body?.error?.code === 'string') code = body.error.code;
    } catch {
      /* not JSON */
    }
    throw new ApiError({ status: res.status, code, message });
  }
  const disposition = res.headers.get('content-disposition') ?? '';
  const name = /filename="([^"]+)"/.exec(disposition)?.[1] ?? 'image-annotated.jpg';
  return { blob: await res.blob(), fileName: name };
}
