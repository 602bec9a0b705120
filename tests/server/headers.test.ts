import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestEnv, type TestEnv } from '../helpers/context';

let env: TestEnv;
beforeAll(async () => {
  env = await createTestEnv();
});
afterAll(() => env.close());

describe('headers on every page and API answer', () => {
  it.each(['/', '/documents/some-sheet', '/api/health', '/api/no-such-route'])(
    '%s carries a strict CSP, nosniff and a referrer policy',
    async (url) => {
      const res = await request(env.app).get(url);
      const csp = res.headers['content-security-policy'];
      expect(csp).toContain("object-src 'none'");
      expect(csp).toContain("base-uri 'none'");
      expect(csp).toContain("frame-ancestors 'none'");
      expect(csp).toContain("script-src 'self'");
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
      expect(res.headers['x-powered-by']).toBeUndefined();
    },
  );

  it('sends no HSTS outside production (it would pin plain-http localhost)', async () => {
    const res = await request(env.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toBeUndefined();
  });
});
