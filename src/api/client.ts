/**
 * The one HTTP client for the Loomwright API.
 *
 * - same-origin cookies on every call
 * - CSRF token fetched once from /api/auth/csrf and sent on state-changing methods,
 *   re-fetched and retried once when the server says CSRF_INVALID (e.g. after the
 *   session was regenerated on sign-in)
 * - error bodies `{error:{code,message,details?}}` become an `ApiError`
 * - errors are shown as a notification unless the caller passes `quiet`
 * - a 401 sends the reader to sign-in, except where a 401 is an ordinary answer
 */
import { Notify } from 'quasar';

export interface FieldIssue {
  /** Field name, or a dotted path for nested fields. */
  path: string;
  message: string;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details?: FieldIssue[];
  /** Seconds from a Retry-After header, when the server sent one (429). */
  readonly retryAfter?: number;

  constructor(init: {
    status: number;
    code: string;
    message: string;
    details?: FieldIssue[];
    retryAfter?: number;
  }) {
    super(init.message);
    this.name = 'ApiError';
    this.status = init.status;
    this.code = init.code;
    this.details = init.details;
    this.retryAfter = init.retryAfter;
  }
}

export function isApiError(value: unknown): value is ApiError {
  return value instanceof ApiError;
}

export type HttpMethod = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  /** Do not show a notification for an error; the caller shows it in place. */
  quiet?: boolean;
  /** Set false to handle a 401 yourself instead of being sent to sign-in. */
  authRedirect?: boolean;
  query?: Record<string, QueryValue | QueryValue[]>;
  headers?: Record<string, string>;
  signal?: AbortSignal;
}

export interface ClientHooks {
  /** Called on a 401 that should send the reader to sign-in. */
  onUnauthenticated?: (error: ApiError) => void;
  /** Shows an error to the reader; defaults to a Quasar notification. */
  notify?: (error: ApiError) => void;
}

const UNSAFE_METHODS = new Set<HttpMethod>(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Calls where a 401 is the expected answer, not an expired session. */
const NO_AUTH_REDIRECT: Array<{ method: HttpMethod | '*'; path: string }> = [
  { method: 'GET', path: '/api/auth/me' },
  { method: 'POST', path: '/api/auth/login' },
  { method: 'POST', path: '/api/auth/logout' },
];

const NETWORK_MESSAGE =
  'Could not reach Loomwright. Check your connection and try again in a moment.';

let hooks: ClientHooks = {};
let csrfToken: string | null = null;
let csrfPending: Promise<string> | null = null;

export function configureApiClient(next: ClientHooks): void {
  hooks = { ...hooks, ...next };
}

/** Use a token the server handed out with another answer (sign-in, password change). */
export function setCsrfToken(token: string | null | undefined): void {
  if (typeof token === 'string' && token) {
    csrfToken = token;
    csrfPending = null;
  }
}

/** Forget the CSRF token, e.g. after sign-in or sign-out regenerated the session. */
export function resetCsrfToken(): void {
  csrfToken = null;
  csrfPending = null;
}

/** Test hook: forget the token and every configured hook. */
export function resetApiClient(): void {
  resetCsrfToken();
  hooks = {};
}

function defaultNotify(error: ApiError): void {
  Notify.create({
    type: 'negative',
    message: error.message,
    caption: error.status >= 500 ? `Server answered ${error.status}` : undefined,
    icon: 'error_outline',
    progress: true,
  });
}

function buildUrl(path: string, query?: RequestOptions['query']): string {
  if (!query) return path;
  const params = new URLSearchParams();
  for (const [key, raw] of Object.entries(query)) {
    const values = Array.isArray(raw) ? raw : [raw];
    for (const value of values) {
      if (value === undefined || value === null || value === '') continue;
      params.append(key, String(value));
    }
  }
  const qs = params.toString();
  if (!qs) return path;
  return path + (path.includes('?') ? '&' : '?') + qs;
}

function normaliseDetails(raw: unknown): FieldIssue[] | undefined {
  if (!Array.isArray(raw)) return undefined;
  const issues: FieldIssue[] = [];
  for (const item of raw) {
    if (!item || typeof item !== 'object') continue;
    const { path, message } = item as { path?: unknown; message?: unknown };
    const joined = Array.isArray(path) ? path.join('.') : path == null ? '' : String(path);
    issues.push({
      path: joined,
      message: typeof message === 'string' ? message : 'Check this field.',
    });
  }
  return issues.length ? issues : undefined;
}

function fallbackMessage(status: number): string {
  if (status === 401) return 'Please sign in to continue.';
  if (status === 403) return 'Your account is not allowed to do that.';
  if (status === 404) return 'We could not find that.';
  if (status === 413) return 'That file is too large.';
  if (status === 429) return 'Too many attempts. Wait a little and try again.';
  if (status >= 500) return 'Something went wrong on our side. Try again in a moment.';
  return `The request failed (${status}).`;
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204 || response.status === 205) return undefined;
  const text = await response.text();
  if (!text) return undefined;
  const type = response.headers.get('content-type') ?? '';
  if (type.includes('json')) {
    try {
      return JSON.parse(text);
    } catch {
      return undefined;
    }
  }
  return text;
}

async function toApiError(response: Response): Promise<ApiError> {
  const body = await readBody(response).catch(() => undefined);
  const err =
    body && typeof body === 'object' && 'error' in body
      ? ((body as { error: unknown }).error as Record<string, unknown> | null)
      : null;
  const retryHeader = response.headers.get('retry-after');
  const retryAfter = retryHeader && /^\d+$/.test(retryHeader) ? Number(retryHeader) : undefined;
  return new ApiError({
    status: response.status,
    code: typeof err?.code === 'string' ? err.code : `HTTP_${response.status}`,
    message:
      typeof err?.message === 'string' && err.message
        ? err.message
        : fallbackMessage(response.status),
    details: normaliseDetails(err?.details),
    retryAfter,
  });
}

async function fetchCsrfToken(signal?: AbortSignal): Promise<string> {
  if (csrfToken) return csrfToken;
  if (!csrfPending) {
    csrfPending = (async () => {
      let response: Response;
      try {
        response = await fetch('/api/auth/csrf', {
          credentials: 'same-origin',
          headers: { Accept: 'application/json' },
          signal,
        });
      } catch (cause) {
        throw networkError(cause);
      }
      if (!response.ok) throw await toApiError(response);
      const body = (await readBody(response)) as { token?: unknown } | undefined;
      if (!body || typeof body.token !== 'string') {
        throw new ApiError({
          status: response.status,
          code: 'CSRF_UNAVAILABLE',
          message: 'Could not start a secure session. Reload the page and try again.',
        });
      }
      csrfToken = body.token;
      return body.token;
    })().finally(() => {
      csrfPending = null;
    });
  }
  return csrfPending;
}

/** The session's CSRF token, for requests made outside this client (uploads with progress). */
export function getCsrfToken(signal?: AbortSignal): Promise<string> {
  return fetchCsrfToken(signal);
}

function networkError(cause: unknown): ApiError | DOMException {
  // An aborted request is the caller's choice, not an error to show.
  if (cause instanceof DOMException && cause.name === 'AbortError') return cause;
  return new ApiError({ status: 0, code: 'NETWORK', message: NETWORK_MESSAGE });
}

function isAbort(value: unknown): boolean {
  return value instanceof DOMException && value.name === 'AbortError';
}

function redirectsOn401(
  method: HttpMethod,
  path: string,
  error: ApiError,
  options: RequestOptions,
): boolean {
  if (options.authRedirect === false) return false;
  // Wrong credentials (e.g. a current password) are not an ended session.
  if (error.code === 'AUTH_FAILED') return false;
  const bare = path.split('?')[0];
  return !NO_AUTH_REDIRECT.some(
    (entry) => (entry.method === '*' || entry.method === method) && entry.path === bare,
  );
}

export async function apiRequest<T = unknown>(
  method: HttpMethod,
  path: string,
  body?: unknown,
  options: RequestOptions = {},
): Promise<T> {
  try {
    return await send<T>(method, path, body, options, true);
  } catch (error) {
    if (isAbort(error)) throw error;
    const apiError =
      error instanceof ApiError
        ? error
        : new ApiError({ status: 0, code: 'CLIENT', message: String(error) });
    if (apiError.status === 401 && redirectsOn401(method, path, apiError, options)) {
      // The hook moves the reader to sign-in and says why, even for quiet calls:
      // a page that vanishes without a word is worse than one notice.
      if (hooks.onUnauthenticated) {
        hooks.onUnauthenticated(apiError);
        throw apiError;
      }
    }
    if (!options.quiet) (hooks.notify ?? defaultNotify)(apiError);
    throw apiError;
  }
}

async function send<T>(
  method: HttpMethod,
  path: string,
  body: unknown,
  options: RequestOptions,
  mayRetryCsrf: boolean,
): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let payload: BodyInit | undefined;
  if (body instanceof FormData || body instanceof Blob) {
    payload = body;
  } else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  if (UNSAFE_METHODS.has(method)) {
    headers['X-CSRF-Token'] = await fetchCsrfToken(options.signal);
  }

  let response: Response;
  try {
    response = await fetch(buildUrl(path, options.query), {
      method,
      headers,
      body: payload,
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (cause) {
    throw networkError(cause);
  }

  if (response.ok) return (await readBody(response)) as T;

  const error = await toApiError(response);
  if (mayRetryCsrf && error.status === 403 && error.code === 'CSRF_INVALID') {
    resetCsrfToken();
    return send<T>(method, path, body, options, false);
  }
  throw error;
}

export const api = {
  get: <T = unknown>(path: string, options?: RequestOptions) =>
    apiRequest<T>('GET', path, undefined, options),
  post: <T = unknown>(path: string, body?: unknown, options?: RequestOptions) =>
    apiRequest<T>('POST', path, body, options),
  put: <T = unknown>(path: string, body?: unknown, options?: RequestOptions) =>
    apiRequest<T>('PUT', path, body, options),
  patch: <T = unknown>(path: string, body?: unknown, options?: RequestOptions) =>
    apiRequest<T>('PATCH', path, body, options),
  delete: <T = unknown>(path: string, options?: RequestOptions) =>
    apiRequest<T>('DELETE', path, undefined, options),
};
