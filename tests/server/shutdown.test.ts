import http from 'node:http';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Session } from '../helpers/crash';
import { jpeg } from '../helpers/images';
import { startServerWithOutput, type RunningServerWithOutput } from '../helpers/server';

const BOUNDARY = 'lw-shutdown-boundary';

/** A connector sheet small enough to write quickly; `n` makes each one different. */
function sheet(n: number) {
  return {
    kind: 'connector',
    title: `Shutdown burst sheet ${n}`,
    content: {
      cavityCount: 2,
      layout: { rows: 1, cols: 2 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: 'shutdown test sensor',
      tags: ['shutdown test'],
      wireSize: { min: '22 AWG', max: '18 AWG' },
      pins: [
        { cavity: '1', role: 'signal', color: 'GN', size: '20 AWG', circuit: `S${n}`, note: '' },
        { cavity: '2', role: 'ground', color: 'BK', size: '20 AWG', circuit: '', note: '' },
      ],
    },
  };
}

interface Answer {
  status: number;
  body: string;
}

/**
 * A POST on a connection of the agent's. With `split` only the headers and the first
 * half of the body go now (the request is then in flight on the server, half read) and
 * `sendRest()` sends the rest; otherwise all of it goes and `written` says when.
 */
function post(
  server: RunningServerWithOutput,
  session: Session,
  opts: { path: string; type: string; body: Buffer; agent: http.Agent | false; split?: boolean },
) {
  const req = http.request(`${server.url}${opts.path}`, {
    method: 'POST',
    agent: opts.agent,
    headers: {
      'content-type': opts.type,
      'content-length': String(opts.body.length),
      cookie: session.cookie,
      'x-csrf-token': session.csrf,
    },
  });
  const answer = new Promise<Answer>((resolve) => {
    req.on('response', (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (text += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text }));
      res.on('error', (err) => resolve({ status: 0, body: String(err) }));
    });
    req.on('error', (err) => resolve({ status: 0, body: String(err) }));
  });
  const half = opts.split ? Math.floor(opts.body.length / 2) : opts.body.length;
  const written = new Promise<void>((resolve) =>
    req.write(opts.body.subarray(0, half), () => resolve()),
  );
  if (!opts.split) req.end();
  return {
    written,
    answer,
    sendRest: () => req.end(opts.body.subarray(half)),
    abandon: () => req.destroy(),
  };
}

const json = (body: unknown) => ({
  type: 'application/json',
  body: Buffer.from(JSON.stringify(body)),
});

/** A multipart form with the one file the upload route takes. */
function form(file: Buffer) {
  const head = Buffer.from(
    `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="slow.jpg"\r\n` +
      'Content-Type: image/jpeg\r\n\r\n',
  );
  const tail = Buffer.from(`\r\n--${BOUNDARY}--\r\n`);
  return {
    type: `multipart/form-data; boundary=${BOUNDARY}`,
    body: Buffer.concat([head, file, tail]),
  };
}

/** Whether a new connection is still accepted. */
function connects(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const req = http.get({ host: '127.0.0.1', port, path: '/api/health', agent: false }, (res) => {
      res.resume();
      resolve(true);
    });
    req.on('error', () => resolve(false));
  });
}

/** The titles of every revision in the stopped server's database. */
function storedTitles(file: string): Promise<string[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, sqlite3.OPEN_READONLY, (err) => {
      if (err) return reject(err);
      db.all('SELECT title FROM revisions', (e, rows: Array<{ title: string }>) => {
        db.close();
        if (e) reject(e);
        else resolve(rows.map((r) => r.title));
      });
    });
  });
}

const exited = (server: RunningServerWithOutput) =>
  new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => {
    if (server.child.exitCode !== null || server.child.signalCode)
      return resolve({ code: server.child.exitCode, signal: server.child.signalCode });
    server.child.once('exit', (code, signal) => resolve({ code, signal }));
  });

describe('the server on SIGTERM', () => {
  let server: RunningServerWithOutput;
  let photo: Buffer;

  beforeAll(async () => {
    // About 4 megapixels: a second or two of decoding and encoding.
    photo = await jpeg(2400, 1600, 7);
    server = await startServerWithOutput({ env: { LOG_LEVEL: 'info' } });
  }, 120_000);
  afterAll(() => server?.stop('SIGKILL'));

  it('stops accepting connections, answers every request in flight, then closes the database and exits 0', async () => {
    // Browsers keep connections open between requests; so does this agent.
    const keepAlive = new http.Agent({ keepAlive: true, maxSockets: 64 });
    const member = new Session(server.url);
    await member.signIn('member@example.test');

    // Open the connections first (as a browser has), so every request below goes on a
    // connection the server has accepted and none waits in the listen backlog.
    await Promise.all(
      Array.from(
        { length: 33 },
        () =>
          new Promise<void>((resolve, reject) =>
            http
              .get(`${server.url}/api/health`, { agent: keepAlive }, (res) => {
                res.resume();
                res.on('end', () => resolve());
              })
              .on('error', reject),
          ),
      ),
    );

    // A slow upload and a burst of writes, each with half its body sent: in flight when
    // the signal comes, and finished after it.
    const upload = post(server, member, {
      path: '/api/uploads',
      ...form(photo),
      agent: false,
      split: true,
    });
    const halfSent = Array.from({ length: 20 }, (_, i) =>
      post(server, member, {
        path: '/api/documents',
        ...json(sheet(i)),
        agent: keepAlive,
        split: true,
      }),
    );
    await Promise.all([upload, ...halfSent].map((r) => r.written));
    await new Promise((r) => setTimeout(r, 300));
    // More writes sent whole just as the signal comes: the server lets one transaction
    // at a time into SQLite, so they wait their turn, some not even read yet.
    const whole = Array.from({ length: 10 }, (_, i) =>
      post(server, member, { path: '/api/documents', ...json(sheet(20 + i)), agent: keepAlive }),
    );
    // And a few whose clients give up waiting: what the server has begun it finishes.
    const abandoned = Array.from({ length: 3 }, (_, i) =>
      post(server, member, { path: '/api/documents', ...json(sheet(100 + i)), agent: keepAlive }),
    );
    await Promise.all([...whole, ...abandoned].map((r) => r.written));
    const exit = exited(server);
    const signalledAt = Date.now();
    server.child.kill('SIGTERM');

    await new Promise((r) => setTimeout(r, 30));
    for (const a of abandoned) a.abandon();
    await new Promise((r) => setTimeout(r, 250));
    expect(await connects(server.port)).toBe(false);
    // The rest of each body arrives after the signal; the server still takes it.
    for (const r of [upload, ...halfSent]) r.sendRest();

    const burst = [...halfSent, ...whole];
    const answers = await Promise.all(burst.map((b) => b.answer));
    const up = await upload.answer;
    const { code, signal } = await exit;
    const output = server.output();
    if (process.env.SHUTDOWN_VERBOSE) console.log(output);
    expect(
      answers.map((a) => a.status),
      answers.map((a) => a.body).join('\n'),
    ).toEqual(answers.map(() => 201));
    expect(up.status, up.body).toBe(201);
    expect(JSON.parse(up.body)).toMatchObject({ id: expect.anything(), width: 1600 });

    expect({ code, signal }, output.slice(-4000)).toEqual({ code: 0, signal: null });
    // Nothing was left hanging until the bounded wait ran out.
    expect(output).not.toMatch(/still open after/);
    expect(Date.now() - signalledAt).toBeLessThan(20_000);
    expect(output).not.toMatch(/connection manager was closed/i);
    expect(output).not.toMatch(/"level":(50|60)/);
    const start = output.split('\n').find((l) => l.includes('"shutting down"'));
    expect(start, output.slice(-4000)).toBeDefined();
    expect(JSON.parse(start!).inFlight).toBeGreaterThanOrEqual(21);

    // Everything answered is stored.
    const titles = await storedTitles(path.join(server.dataDir, 'loomwright.sqlite'));
    for (let i = 0; i < 30; i++) expect(titles).toContain(`Shutdown burst sheet ${i}`);
  }, 60_000);
});
