import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { loadConfig, ConfigError } from '../../server/config';
import { startFakeSmtp, type FakeSmtp } from '../../server/mail/fakeSmtp';
import { createTestEnv, type TestEnv } from '../helpers/context';

describe('configuration', () => {
  it('refuses to start in production without SESSION_SECRET, with a sentence', () => {
    expect(() => loadConfig({ NODE_ENV: 'production', SMTP_URL: 'smtp://127.0.0.1:25' })).toThrow(
      ConfigError,
    );
    expect(() => loadConfig({ NODE_ENV: 'production', SMTP_URL: 'smtp://127.0.0.1:25' })).toThrow(
      /SESSION_SECRET/,
    );
  });

  it('names the bad variable', () => {
    expect(() => loadConfig({ PORT: 'eighty' })).toThrow(/PORT/);
  });

  it('uses the embedded defaults', () => {
    const c = loadConfig({});
    expect(c.port).toBe(3000);
    expect(c.databaseFile).toMatch(/data[/\\]loomwright\.sqlite$/);
    expect(c.uploadDir).toMatch(/data[/\\]uploads$/);
    expect(c.seedDemo).toBe(true);
  });
});

describe('in production', () => {
  let env: TestEnv;
  let relay: FakeSmtp;
  beforeAll(async () => {
    relay = await startFakeSmtp(0);
    env = await createTestEnv({
      env: { NODE_ENV: 'production', SMTP_URL: relay.url, SESSION_SECRET: 'p'.repeat(40) },
      config: { seedDemo: false },
    });
  });
  afterAll(async () => {
    await env.close();
    await relay.close();
  });

  it('answers 404 for the development mailbox and starts no mail fake', async () => {
    expect(env.ctx.fakeSmtp).toBeUndefined();
    const res = await request(env.app).get('/api/dev/mail');
    expect(res.status).toBe(404);
  });

  it('seeds no demo accounts', async () => {
    expect(await env.ctx.models.User.count()).toBe(0);
  });

  it('sends HSTS', async () => {
    const res = await request(env.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=/);
  });
});
