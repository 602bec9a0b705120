import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestEnv, makeUser, TEST_PASSWORD, type TestEnv } from '../helpers/context';
import { jpeg, largeJpegs, png, pngClaiming, withSegment } from '../helpers/images';
import { Upload } from '../../server/models/Upload';

let env: TestEnv;
let server: http.Server;
let base: string;
let agent: ReturnType<typeof request.agent>;
let csrf: string;
let photos: Buffer[];

const MB = 1024 * 1024;
const rss = () => process.memoryUsage.rss();

function countFiles(dir: string): number {
  let n = 0;
  for (const e of fs.readdirSync(dir, { withFileTypes: true }))
    n += e.isDirectory() ? countFiles(path.join(dir, e.name)) : 1;
  return n;
}

/** Samples the process RSS (main thread and image workers together) until stopped. */
function rssSampler() {
  let peak = rss();
  const timer = setInterval(() => (peak = Math.max(peak, rss())), 25);
  return () => {
    clearInterval(timer);
    return Math.max(peak, rss());
  };
}

function percentile(values: number[], p: number) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

function upload(data: Buffer, name: string) {
  return agent.post('/api/uploads').set('X-CSRF-Token', csrf).attach('file', data, name);
}

beforeAll(async () => {
  env = await createTestEnv();
  server = http.createServer(env.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
  const user = await makeUser(env);
  agent = request.agent(base);
  csrf = (await agent.get('/api/auth/csrf')).body.token;
  const login = await agent
    .post('/api/auth/login')
    .set('X-CSRF-Token', csrf)
    .send({ email: user.email, password: TEST_PASSWORD });
  expect(login.status).toBe(200);
  if (login.body.csrfToken) csrf = login.body.csrfToken;
  // Two distinct 12-megapixel photos; each is sent twice with a different comment
  // segment, so four different files arrive (pairs decode to the same pixels).
  const made = await largeJpegs(2, 4000, 3000);
  photos = [0, 1, 2, 3].map((i) => withSegment(made[i % 2], 0xfe, Buffer.from(`photo ${i}`)));
  // Start the worker threads, so the measurement is of processing, not of start-up.
  expect((await upload(await png(32, 32), 'warm.png')).status).toBe(201);
}, 120_000);

afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await env.close();
});

describe('POST /api/uploads under load', () => {
  it('keeps GET /api/health quick while four large photos are processed', async () => {
    const before = rss();
    const stopRss = rssSampler();
    const t0 = performance.now();
    let pending = photos.length;
    const results = photos.map((p, i) =>
      upload(p, `photo-${i}.jpg`).then((res) => {
        pending--;
        return { res, ms: performance.now() - t0 };
      }),
    );
    const latencies: number[] = [];
    while (pending > 0) {
      const s = performance.now();
      const res = await fetch(`${base}/api/health`);
      expect(res.status).toBe(200);
      await res.arrayBuffer();
      latencies.push(performance.now() - s);
      await new Promise((r) => setTimeout(r, 20));
    }
    const done = await Promise.all(results);
    const peak = stopRss();
    for (const { res } of done) {
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      expect(res.body).toMatchObject({ width: 1600, height: 1200 });
    }
    const p50 = percentile(latencies, 50);
    const p95 = percentile(latencies, 95);
    const max = Math.max(...latencies);
    console.log(
      `[uploads load] 4 photos of 4000×3000 (${(photos[0].length / MB).toFixed(1)} MB each) on 2 image threads: ` +
        `answered after ${done.map((d) => (d.ms / 1000).toFixed(1)).join(' s, ')} s; ` +
        `GET /api/health meanwhile: ${latencies.length} requests, p50 ${p50.toFixed(1)} ms, p95 ${p95.toFixed(1)} ms, max ${max.toFixed(1)} ms; ` +
        `RSS ${(before / MB).toFixed(0)} MB before, peak ${(peak / MB).toFixed(0)} MB`,
    );
    expect(latencies.length).toBeGreaterThan(10);
    expect(p95).toBeLessThan(200);
  }, 240_000);

  it('gives each of 200 parallel uploads, good and hostile, a clear answer, storing only the good ones', async () => {
    const N = 200;
    // Half good small images (PNG and JPEG), a quarter HTML under an image name, a quarter
    // pixel bombs: the refused ones cost no decoding, so the run stays short.
    const kinds = Array.from({ length: N }, (_, i) =>
      i % 4 === 1 ? 'html' : i % 4 === 3 ? 'bomb' : 'image',
    );
    const files = await Promise.all(
      kinds.map(async (k, i) =>
        k === 'html'
          ? Buffer.from(`<html><script>alert(${i})</script></html>`)
          : k === 'bomb'
            ? pngClaiming(40_000, 40_000)
            : i % 4 === 2
              ? jpeg(96, 64, 100 + i)
              : png(96, 64, 100 + i),
      ),
    );
    const rowsBefore = await Upload.count();
    const filesBefore = countFiles(env.ctx.config.uploadDir);
    const before = rss();
    const stopRss = rssSampler();
    const t0 = performance.now();
    const answers = await Promise.all(files.map((f, i) => upload(f, `small-${i}.png`)));
    const elapsed = performance.now() - t0;
    const peak = stopRss();

    const expected = { html: 415, bomb: 413, image: 201 } as const;
    const statuses: Record<number, number> = {};
    answers.forEach((res, i) => {
      statuses[res.status] = (statuses[res.status] ?? 0) + 1;
      expect(res.status, `upload ${i} (${kinds[i]}): ${JSON.stringify(res.body)}`).toBe(
        expected[kinds[i] as keyof typeof expected],
      );
      if (res.status === 201) expect(res.body.id).toMatch(/^[0-9a-f-]{36}$/);
      else expect(res.body.error.message).toMatch(/\w+ \w+/);
    });
    const good = kinds.filter((k) => k === 'image').length;
    expect(await Upload.count()).toBe(rowsBefore + good);
    expect(countFiles(env.ctx.config.uploadDir)).toBe(filesBefore + 2 * good);
    console.log(
      `[uploads load] ${N} parallel uploads answered in ${(elapsed / 1000).toFixed(1)} s: ${JSON.stringify(statuses)}; ` +
        `RSS ${(before / MB).toFixed(0)} MB before, peak ${(peak / MB).toFixed(0)} MB; pool ${JSON.stringify(env.ctx.images.stats())}`,
    );
    expect(peak - before).toBeLessThan(600 * MB);
  }, 240_000);
});
