// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { createAppRouter, safeRedirect } from '@/router';
import { resetApiClient } from '@/api/client';
import type { Role } from '@/api/types';

function signedInAs(role: Role | null, emailVerified = true) {
  const fetch = vi.fn(async (input: RequestInfo | URL) => {
    if (String(input) !== '/api/auth/me') throw new Error(`unexpected fetch ${String(input)}`);
    if (!role) {
      return new Response(JSON.stringify({ error: { code: 'UNAUTHENTICATED', message: 'No.' } }), {
        status: 401,
        headers: { 'content-type': 'application/json' },
      });
    }
    const user = { id: 1, email: 'x@example.test', displayName: 'Tester', role, emailVerified };
    return new Response(JSON.stringify({ user }), {
      status: 200,
      headers: { 'content-type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetch);
  return fetch;
}

async function visit(path: string) {
  const router = createAppRouter(createMemoryHistory());
  await router.push(path);
  return router.currentRoute.value;
}

beforeEach(() => {
  vi.stubGlobal('scrollTo', vi.fn()); // jsdom has no scrolling; the router's scrollBehavior calls it
  setActivePinia(createPinia());
  resetApiClient();
});

afterEach(() => vi.unstubAllGlobals());

describe('route guard', () => {
  it('lets anyone look up connectors', async () => {
    signedInAs(null);
    expect((await visit('/')).name).toBe('home');
  });

  it('sends a signed-out reader to sign-in with a way back', async () => {
    signedInAs(null);
    const route = await visit('/account');
    expect(route.name).toBe('sign-in');
    expect(route.query.redirect).toBe('/account');
  });

  it('sends a member away from admin pages to the "not allowed" notice', async () => {
    signedInAs('member');
    const route = await visit('/admin/members');
    expect(route.name).toBe('not-allowed');
    expect(route.query.need).toBe('admin');
  });

  it('lets an admin in, and a moderator not', async () => {
    signedInAs('admin');
    expect((await visit('/admin/audit')).name).toBe('admin-audit');
    setActivePinia(createPinia());
    signedInAs('moderator');
    expect((await visit('/admin/audit')).name).toBe('not-allowed');
  });

  it('asks the server who is signed in only once per visit', async () => {
    const fetch = signedInAs('member');
    const router = createAppRouter(createMemoryHistory());
    await router.push('/');
    await router.push('/account');
    await router.push('/search?q=coolant');
    expect(fetch).toHaveBeenCalledTimes(1);
    expect(router.currentRoute.value.name).toBe('search');
  });

  it('shows the not-found page for unknown paths', async () => {
    signedInAs(null);
    expect((await visit('/no/such/page')).name).toBe('not-found');
  });

  it('passes query values to pages as props', async () => {
    signedInAs(null);
    const route = await visit('/reset-password?token=abc123abc123');
    const props = route.matched.at(-1)!.props.default as (
      r: typeof route,
    ) => Record<string, string>;
    expect(props(route)).toEqual({ token: 'abc123abc123' });
  });
});

describe('safeRedirect', () => {
  it('keeps same-site paths and refuses other hosts', () => {
    expect(safeRedirect('/account?tab=1')).toBe('/account?tab=1');
    expect(safeRedirect('//evil.example')).toBe('/');
    expect(safeRedirect('https://evil.example')).toBe('/');
    expect(safeRedirect('/\\evil.example')).toBe('/');
    expect(safeRedirect(undefined)).toBe('/');
  });
});
