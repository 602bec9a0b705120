import sqlite3 from 'sqlite3';
import { startServer, type RunningServer } from './server';
import { TEST_PASSWORD } from './context';

/** One write the server answered 2xx, and what it promised is now stored. */
type Ack =
  | { type: 'create'; documentId: number }
  | { type: 'save'; documentId: number; version: number; title: string; content: string }
  | { type: 'publish'; documentId: number; revisionId: number };

/** A small HTTP client with cookies and the CSRF token, on plain fetch. */
export class Session {
  cookie = '';
  csrf = '';
  constructor(private readonly base: string) {}

  async call(method: string, path: string, body?: unknown) {
    const form = body instanceof FormData;
    const res = await fetch(this.base + path, {
      method,
      headers: {
        ...(form ? {} : { 'content-type': 'application/json' }),
        ...(this.cookie ? { cookie: this.cookie } : {}),
        ...(this.csrf ? { 'x-csrf-token': this.csrf } : {}),
      },
      body: body === undefined ? undefined : form ? body : JSON.stringify(body),
      signal: AbortSignal.timeout(15_000),
    });
    const set = res.headers.get('set-cookie');
    if (set) this.cookie = set.split(';')[0];
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  }

  async signIn(email: string, password = TEST_PASSWORD) {
    this.csrf = (await this.call('GET', '/api/auth/csrf')).body.token;
    const res = await this.call('POST', '/api/auth/login', { email, password });
    if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
    this.csrf = res.body.csrfToken ?? this.csrf;
  }
}

function pins(n: number, salt: number) {
  return Array.from({ length: n }, (_, i) => ({
    cavity: String(i + 1),
    role: i % 3 === 0 ? 'signal' : 'ground',
    color: ['GN/YE', 'BK', 'RD/WH', 'BU'][(i + salt) % 4],
    size: '20 AWG',
    circuit: `C${salt}-${i}`,
    note: `write ${salt}`,
  }));
}

function sheet(salt: number) {
  const n = 2 + (salt % 10);
  return {
    cavityCount: n,
    layout: { rows: 1, cols: n },
    housing: 'socket',
    view: 'wire-side',
    sealed: salt % 2 === 0,
    component: 'crash-test sensor',
    tags: ['crash test'],
    wireSize: { min: '22 AWG', max: '18 AWG' },
    pins: pins(n, salt),
  };
}

/**
 * Writes through the API until the server is killed: creates sheets, saves drafts and
 * has the moderator publish some. Every write answered 2xx is recorded.
 */
async function writeUntilKilled(
  server: RunningServer,
  acks: Ack[],
  salt: { n: number },
  started: () => void,
) {
  const member = new Session(server.url);
  const moderator = new Session(server.url);
  await member.signIn('member@example.test');
  await moderator.signIn('moderator@example.test');
  const mine: Array<{ id: number; version: number }> = [];
  started();

  const worker = async () => {
    for (;;) {
      const s = salt.n++;
      try {
        if (mine.length < 3 || s % 7 === 0) {
          const res = await member.call('POST', '/api/documents', {
            kind: 'connector',
            title: `Crash sheet ${s}`,
            content: sheet(s),
          });
          if (res.status === 201) {
            acks.push({ type: 'create', documentId: res.body.id });
            mine.push({ id: res.body.id, version: res.body.revision.version });
          }
        } else if (s % 11 === 0) {
          const doc = mine[s % mine.length];
          const sub = await member.call('POST', `/api/documents/${doc.id}/submit`);
          if (sub.status !== 200) continue;
          const pub = await moderator.call('POST', `/api/review/${sub.body.revision.id}/publish`, {
            note: 'ok',
          });
          if (pub.status === 200)
            acks.push({ type: 'publish', documentId: doc.id, revisionId: sub.body.revision.id });
        } else {
          const doc = mine[s % mine.length];
          const title = `Crash sheet ${doc.id} save ${s}`;
          const content = sheet(s);
          const res = await member.call('PUT', `/api/documents/${doc.id}/draft`, {
            title,
            content,
            version: doc.version,
          });
          if (res.status === 200) {
            doc.version = res.body.revision.version;
            acks.push({
              type: 'save',
              documentId: doc.id,
              version: doc.version,
              title,
              content: JSON.stringify(content),
            });
          } else if (res.status === 409 && res.body?.error?.details?.current?.version) {
            doc.version = res.body.error.details.current.version;
          }
        }
      } catch {
        return; // the server is gone
      }
    }
  };
  await Promise.all([worker(), worker(), worker()]);
}

function query<T>(db: sqlite3.Database, sql: string, params: unknown[] = []) {
  return new Promise<T[]>((resolve, reject) =>
    db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))),
  );
}

/** Checks the killed server's database: integrity, and every acknowledged write whole. */
export async function verifyAfterKill(file: string, acks: Ack[]): Promise<string[]> {
  const problems: string[] = [];
  const db = await new Promise<sqlite3.Database>((resolve, reject) => {
    const d = new sqlite3.Database(file, sqlite3.OPEN_READWRITE, (err) =>
      err ? reject(err) : resolve(d),
    );
  });
  try {
    const check = await query<{ integrity_check: string }>(db, 'PRAGMA integrity_check');
    if (check[0]?.integrity_check !== 'ok')
      problems.push(`integrity_check: ${JSON.stringify(check)}`);
    const latestSave = new Map<number, Extract<Ack, { type: 'save' }>>();
    for (const a of acks) {
      if (a.type === 'create') {
        const rows = await query(db, 'SELECT id FROM documents WHERE id = ?', [a.documentId]);
        if (!rows.length) problems.push(`document ${a.documentId} was acknowledged but is missing`);
      } else if (a.type === 'save') {
        const prev = latestSave.get(a.documentId);
        if (!prev || a.version > prev.version) latestSave.set(a.documentId, a);
      } else {
        const rows = await query<{ published_revision_id: number | null }>(
          db,
          'SELECT published_revision_id FROM documents WHERE id = ?',
          [a.documentId],
        );
        if (!rows[0]?.published_revision_id)
          problems.push(`publish of document ${a.documentId} is missing`);
      }
    }
    for (const a of latestSave.values()) {
      const rows = await query<{ version: number; title: string; content: string }>(
        db,
        'SELECT version, title, content FROM revisions WHERE document_id = ? ORDER BY version DESC LIMIT 1',
        [a.documentId],
      );
      const row = rows[0];
      if (!row || row.version < a.version)
        problems.push(`save v${a.version} of document ${a.documentId} is missing`);
      else if (
        row.version === a.version &&
        (row.title !== a.title || JSON.stringify(JSON.parse(row.content)) !== a.content)
      )
        problems.push(`save v${a.version} of document ${a.documentId} is not whole`);
    }
  } finally {
    await new Promise<void>((resolve) => db.close(() => resolve()));
  }
  return problems;
}

export interface CrashReport {
  kills: number;
  acknowledged: number;
  problems: string[];
}

/**
 * Starts the real server on one DATA_DIR again and again, writes through it, and kills it
 * with SIGKILL at a random moment; after every kill the database must pass its checks.
 */
export async function runCrashTrials(
  kills: number,
  log: (line: string) => void = () => {},
): Promise<CrashReport> {
  const acks: Ack[] = [];
  const salt = { n: 1 };
  let dataDir: string | undefined;
  const problems: string[] = [];
  for (let i = 0; i < kills; i++) {
    const server = await startServer({ dataDir, env: { LOG_LEVEL: 'silent' } });
    dataDir = server.dataDir;
    let signedIn!: () => void;
    const ready = new Promise<void>((resolve) => (signedIn = resolve));
    const writing = writeUntilKilled(server, acks, salt, signedIn).catch(() => signedIn());
    await ready;
    // Kill at a random moment while the writers are busy.
    await new Promise((r) => setTimeout(r, 50 + Math.random() * 1500));
    server.child.kill('SIGKILL');
    await new Promise<void>((resolve) =>
      server.child.exitCode !== null ? resolve() : server.child.once('exit', () => resolve()),
    );
    await writing;
    const found = await verifyAfterKill(`${dataDir}/loomwright.sqlite`, acks);
    log(
      `kill ${i + 1}/${kills}: ${acks.length} writes acknowledged so far, ${found.length} problems`,
    );
    problems.push(...found.map((p) => `after kill ${i + 1}: ${p}`));
    if (found.length) break;
  }
  return { kills, acknowledged: acks.length, problems };
}
