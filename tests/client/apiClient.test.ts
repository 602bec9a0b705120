// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, configureApiClient, resetApiClient, setCsrfToken } from '@/api/client';
import { fetchCurrentUser, login } from '@/api/auth';

type Handler = (url: string, init: RequestInit) => Response | Promise<Response>;

function json(status: number, body: unknown, headers: Record<string, string> = {}): Response {
  return new Response(body === undefined ? null : JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json', ...headers },
  });
}

/** A fake fetch that records every call and answers with `handler`. */
function installFetch(handler: Handler) {
  const calls: Array<{ url: string; init: RequestInit }> = [];
  const fake = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = String(input);
    calls.push({ url, init });
    return handler(url, init);
  });
  vi.stubGlobal('fetch', fake);
  return calls;
}

function header(init: RequestInit, name: string): string | undefined {
  return (init.headers as Record<string, string> | undefined)?.[name];
}

const notify = vi.fn();
const onUnauthenticated = vi.fn();

beforeEach(() => {
  resetApiClient();
  notify.mockReset();
  onUnauthenticated.mockReset();
  configureApiClient({ notify, onUnauthenticated });
});

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('CSRF token', () => {
  it('is fetched once and sent as X-CSRF-Token on state-changing methods only', async () => {
    const calls = installFetch((url) =>
      url === '/api/auth/csrf' ? json(200, { token: 'tok-1' }) : json(200, { ok: true }),
    );

    await api.get('/api/health');
    await api.post('/api/things', { a: 1 });
    await api.put('/api/things/1', { a: 2 });
    await api.patch('/api/things/1', { a: 3 });
    await api.delete('/api/things/1');

    expect(calls.filter((c) => c.url === '/api/auth/csrf')).toHaveLength(1);
    const byMethod = Object.fromEntries(
      calls.filter((c) => c.url !== '/api/auth/csrf').map((c) => [c.init.method, c.init]),
    );
    expect(header(byMethod.GET, 'X-CSRF-Token')).toBeUndefined();
    for (const method of ['POST', 'PUT', 'PATCH', 'DELETE']) {
      expect(header(byMethod[method], 'X-CSRF-Token')).toBe('tok-1');
      expect(byMethod[method].credentials).toBe('same-origin');
    }
    expect(header(byMethod.POST, 'Content-Type')).toBe('application/json');
    expect(byMethod.POST.body).toBe('{"a":1}');
  });

  it('shares one token request between concurrent calls', async () => {
    const calls = installFetch((url) =>
      url === '/api/auth/csrf' ? json(200, { token: 'shared' }) : json(200, {}),
    );
    await Promise.all([api.post('/api/a'), api.post('/api/b'), api.post('/api/c')]);
    expect(calls.filter((c) => c.url === '/api/auth/csrf')).toHaveLength(1);
  });

  it('re-fetches the token and retries once on 403 CSRF_INVALID', async () => {
    let tokens = 0;
    const calls = installFetch((url, init) => {
      if (url === '/api/auth/csrf') return json(200, { token: `tok-${++tokens}` });
      if (header(init, 'X-CSRF-Token') === 'tok-1') {
        return json(403, { error: { code: 'CSRF_INVALID', message: 'Token out of date.' } });
      }
      return json(201, { id: 7 });
    });

    await expect(api.post('/api/documents', { kind: 'connector' })).resolves.toEqual({ id: 7 });
    const posts = calls.filter((c) => c.url === '/api/documents');
    expect(posts.map((c) => header(c.init, 'X-CSRF-Token'))).toEqual(['tok-1', 'tok-2']);
    expect(notify).not.toHaveBeenCalled();
  });

  it('gives up after one retry and reports the error', async () => {
    const calls = installFetch((url) =>
      url === '/api/auth/csrf'
        ? json(200, { token: 'stale' })
        : json(403, { error: { code: 'CSRF_INVALID', message: 'Reload the page.' } }),
    );
    await expect(api.post('/api/x')).rejects.toMatchObject({ status: 403, code: 'CSRF_INVALID' });
    expect(calls.filter((c) => c.url === '/api/x')).toHaveLength(2);
    expect(notify).toHaveBeenCalledTimes(1);
  });

  it('does not retry a 403 FORBIDDEN', async () => {
    const calls = installFetch((url) =>
      url === '/api/auth/csrf'
        ? json(200, { token: 't' })
        : json(403, { error: { code: 'FORBIDDEN', message: 'Only a moderator can do this.' } }),
    );
    await expect(api.post('/api/review/1/publish')).rejects.toMatchObject({ code: 'FORBIDDEN' });
    expect(calls.filter((c) => c.url === '/api/review/1/publish')).toHaveLength(1);
  });

  it('uses the token handed back by sign-in instead of asking again', async () => {
    const calls = installFetch((url) => {
      if (url === '/api/auth/csrf') return json(200, { token: 'before' });
      if (url === '/api/auth/login') {
        return json(200, { user: { id: 1, role: 'member' }, csrfToken: 'after' });
      }
      return json(200, {});
    });
    await login('member@example.test', 'a long passphrase');
    await api.post('/api/next');
    const next = calls.find((c) => c.url === '/api/next')!;
    expect(header(next.init, 'X-CSRF-Token')).toBe('after');
    expect(calls.filter((c) => c.url === '/api/auth/csrf')).toHaveLength(1);
  });
});

describe('errors', () => {
  it('maps the error body to an ApiError with status, code, message and details', async () => {
    installFetch(() =>
      json(400, {
        error: {
          code: 'VALIDATION',
          message: 'The field "displayName": must be at least 2 characters.',
          details: [{ path: 'displayName', message: 'must be at least 2 characters' }],
        },
      }),
    );
    setCsrfToken('t');
    const error = await api.patch('/api/auth/me', { displayName: 'x' }).catch((e) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'VALIDATION',
      message: 'The field "displayName": must be at least 2 characters.',
      details: [{ path: 'displayName', message: 'must be at least 2 characters' }],
    });
    expect(notify).toHaveBeenCalledWith(error);
  });

  it('joins array paths in details', async () => {
    installFetch(() =>
      json(400, {
        error: {
          code: 'VALIDATION',
          message: 'Bad pin.',
          details: [{ path: ['pins', 2, 'color'], message: 'x' }],
        },
      }),
    );
    const error = (await api.get('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error.details).toEqual([{ path: 'pins.2.color', message: 'x' }]);
  });

  it('stays quiet when asked to', async () => {
    installFetch(() => json(409, { error: { code: 'EMAIL_TAKEN', message: 'Taken.' } }));
    setCsrfToken('t');
    await expect(api.post('/api/auth/register', {}, { quiet: true })).rejects.toMatchObject({
      code: 'EMAIL_TAKEN',
    });
    expect(notify).not.toHaveBeenCalled();
  });

  it('reads Retry-After on 429', async () => {
    installFetch(() =>
      json(429, { error: { code: 'THROTTLED', message: 'Wait.' } }, { 'retry-after': '120' }),
    );
    const error = await api.get('/api/x', { quiet: true }).catch((e) => e);
    expect(error).toMatchObject({ status: 429, code: 'THROTTLED', retryAfter: 120 });
  });

  it('gives a readable message when the body is not the error shape', async () => {
    installFetch(() => new Response('<html>Bad gateway</html>', { status: 502 }));
    const error = (await api.get('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error).toMatchObject({ status: 502, code: 'HTTP_502' });
    expect(error.message).toMatch(/try again/i);
  });

  it('turns a network failure into a NETWORK error', async () => {
    vi.stubGlobal('fetch', vi.fn().mockRejectedValue(new TypeError('Failed to fetch')));
    const error = (await api.get('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error).toMatchObject({ status: 0, code: 'NETWORK' });
    expect(notify).toHaveBeenCalledTimes(1);
  });

  it('returns undefined for 204', async () => {
    installFetch((url) =>
      url === '/api/auth/csrf' ? json(200, { token: 't' }) : new Response(null, { status: 204 }),
    );
    await expect(api.delete('/api/dev/mail')).resolves.toBeUndefined();
  });
});

describe('401', () => {
  it('sends the reader to sign-in for an ended session', async () => {
    installFetch(() =>
      json(401, { error: { code: 'UNAUTHENTICATED', message: 'Please sign in first.' } }),
    );
    await expect(api.get('/api/admin/users')).rejects.toMatchObject({ status: 401 });
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
    expect(notify).not.toHaveBeenCalled(); // the sign-in redirect says why, once
  });

  it('does so for quiet calls too', async () => {
    installFetch((url) =>
      url === '/api/auth/csrf'
        ? json(200, { token: 't' })
        : json(401, { error: { code: 'UNAUTHENTICATED', message: 'Please sign in first.' } }),
    );
    await expect(api.patch('/api/auth/me', {}, { quiet: true })).rejects.toMatchObject({
      status: 401,
    });
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
  });

  it('does not for /api/auth/me, which answers 401 when nobody is signed in', async () => {
    installFetch(() =>
      json(401, { error: { code: 'UNAUTHENTICATED', message: 'You are not signed in.' } }),
    );
    await expect(fetchCurrentUser()).resolves.toBeNull();
    expect(onUnauthenticated).not.toHaveBeenCalled();
    expect(notify).not.toHaveBeenCalled();
  });

  it('does not for a failed sign-in', async () => {
    installFetch((url) =>
      url === '/api/auth/csrf'
        ? json(200, { token: 't' })
        : json(401, {
            error: { code: 'AUTH_FAILED', message: 'The e-mail address or password is not right.' },
          }),
    );
    await expect(login('a@example.test', 'wrong', { quiet: true })).rejects.toMatchObject({
      code: 'AUTH_FAILED',
    });
    expect(onUnauthenticated).not.toHaveBeenCalled();
  });
});

describe('query strings', () => {
  it('drops empty values and encodes the rest', async () => {
    const calls = installFetch(() => json(200, { total: 0, items: [] }));
    await api.get('/api/admin/audit', {
      query: { limit: 25, offset: 0, q: '', kind: undefined, tag: 'a&b' },
    });
    expect(calls[0].url).toBe('/api/admin/audit?limit=25&offset=0&tag=a%26b');
  });
});
