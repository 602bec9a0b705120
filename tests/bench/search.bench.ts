/**
 * The lookup at scale: seeds a temporary DATA_DIR with 10 000 connector sheets and
 * 2 000 adapter sheets (the seed:bulk code), starts the real server on it and a bare
 * node:http + sqlite3 baseline beside it, and measures each with autocannon at 32
 * connections: a search with a word, a search with filters, and opening a connector
 * sheet. Prints requests/s and p50 / p95 / p99 latency, and the ratio of the
 * product's search throughput to the baseline's.
 *
 * The product runs twice: as shipped (search answers cached until the index changes,
 * so repeated lookups are served from memory) and with ANSWER_CACHE=off, where every
 * request runs its SQL like the baseline does.
 *
 * Environment: BENCH_SECONDS (default 10) per measurement, BENCH_SHEETS (default 10000).
 */
import { execSync, fork, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sqlite3 from 'sqlite3';
import autocannon from 'autocannon';
import { seedBulk, progressBar } from '../../scripts/seed-bulk';
import { startServer, type RunningServer } from '../helpers/server';

export const TARGETS = { searchP95Ms: 25, sheetP95Ms: 15, throughputRatio: 0.5 };

const CONNECTIONS = 32;

/** Words readers type, all present in the bulk data. */
const WORDS = ['coolant', 'injector', 'pump', 'pedal', 'throttle', 'oxygen', 'knock', 'wiper'];
const FILTERED = WORDS.map((w) => `q=${w}&cavities=3&sealed=true`).concat(
  WORDS.map(
    (w) => `q=sensor&kind=connector&cavities=${[2, 3, 4, 6, 8, 12, 16, 24][WORDS.indexOf(w)]}`,
  ),
);

export interface Measure {
  name: string;
  rps: number;
  p50: number;
  p95: number;
  p99: number;
  requests: number;
  non2xx: number;
  errors: number;
  kbPerResponse: number;
  /** CPU time the server process spent per answered request: barely moved by other load on the machine. */
  cpuMs: number;
}

const CLOCK_TICKS = (() => {
  try {
    return Number(execSync('getconf CLK_TCK', { encoding: 'utf8' }).trim()) || 100;
  } catch {
    return 100;
  }
})();

/** User + system CPU of a process in ms, from /proc (NaN where there is none). */
function cpuOf(pid: number | undefined): number {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / CLOCK_TICKS;
  } catch {
    return Number.NaN;
  }
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

/** Requests that each pick one of `paths` at random, so connections do not walk the list in step. */
function randomly(paths: string[]) {
  return [
    {
      method: 'GET',
      path: paths[0],
      setupRequest: (req: { path: string }) => ({
        ...req,
        path: paths[Math.floor(Math.random() * paths.length)],
      }),
    },
  ];
}

/** One autocannon run over `paths`, each request to one of them at random. */
async function measure(
  name: string,
  base: string,
  paths: string[],
  seconds: number,
  pid: number | undefined,
): Promise<Measure> {
  // A warm-up, not counted: about every path at least once (first compiles, page
  // cache, connection set-up, and whatever the server keeps), then a second more.
  await autocannon({
    url: base,
    connections: CONNECTIONS,
    amount: Math.max(paths.length * 8, CONNECTIONS * 8),
    requests: randomly(paths),
  });
  await autocannon({
    url: base,
    connections: CONNECTIONS,
    duration: 1,
    requests: randomly(paths),
  });
  const times: number[] = [];
  const cpuBefore = cpuOf(pid);
  const instance = autocannon({
    url: base,
    connections: CONNECTIONS,
    duration: seconds,
    requests: randomly(paths),
  });
  instance.on('response', (_client: unknown, status: number, _bytes: number, ms: number) => {
    if (status < 300) times.push(ms);
  });
  const result = await instance;
  const cpu = cpuOf(pid) - cpuBefore;
  // Let answers still on their way finish before anything is stopped.
  await new Promise((r) => setTimeout(r, 500));
  times.sort((a, b) => a - b);
  return {
    name,
    rps: result.requests.total / (result.duration || seconds),
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    requests: result.requests.total,
    non2xx: result.non2xx,
    errors: result.errors + result.timeouts,
    kbPerResponse: result.requests.total
      ? result.throughput.total / result.requests.total / 1024
      : 0,
    cpuMs: result.requests.total ? cpu / result.requests.total : Number.NaN,
  };
}

function startBaseline(dbFile: string): Promise<{ url: string; child: ChildProcess }> {
  const child = fork(path.join(import.meta.dirname, 'baseline.ts'), [], {
    execArgv: ['--import', 'tsx'],
    env: { ...process.env, DB_FILE: dbFile },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  return new Promise((resolve, reject) => {
    child.on('message', (m: { ready?: boolean; port?: number }) => {
      if (m?.ready) resolve({ url: `http://127.0.0.1:${m.port}`, child });
    });
    child.on('exit', (code) => reject(new Error(`the baseline server exited with ${code}`)));
  });
}

function stop(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode) return resolve();
    child.once('exit', () => resolve());
    child.kill('SIGTERM');
  });
}

async function sheetSlugs(dbFile: string, n: number): Promise<string[]> {
  const db = new sqlite3.Database(dbFile, sqlite3.OPEN_READONLY);
  const rows = await new Promise<Array<{ slug: string }>>((resolve, reject) =>
    db.all(
      `SELECT slug FROM documents WHERE kind = 'connector' AND published_revision_id IS NOT NULL
       ORDER BY id % 97, id LIMIT ?`,
      [n],
      (err, r) => (err ? reject(err) : resolve(r as never)),
    ),
  );
  await new Promise((r) => db.close(r));
  return rows.map((r) => r.slug);
}

const ms = (n: number) => `${n.toFixed(1)} ms`;

function table(rows: Measure[], log: (line: string) => void) {
  log(
    `${'measurement'.padEnd(44)} ${'req/s'.padStart(8)} ${'p50'.padStart(9)} ${'p95'.padStart(9)} ${'p99'.padStart(9)} ${'KB/resp'.padStart(8)} ${'CPU ms/req'.padStart(10)}  non-2xx`,
  );
  for (const r of rows)
    log(
      `${r.name.padEnd(44)} ${r.rps.toFixed(0).padStart(8)} ${ms(r.p50).padStart(9)} ${ms(r.p95).padStart(9)} ${ms(r.p99).padStart(9)} ${r.kbPerResponse.toFixed(1).padStart(8)} ${r.cpuMs.toFixed(2).padStart(10)}  ${r.non2xx + r.errors}`,
    );
}

function load(): string {
  const [a, b, c] = os.loadavg();
  return `load average ${a.toFixed(2)} / ${b.toFixed(2)} / ${c.toFixed(2)} on ${os.cpus().length} CPUs`;
}

/** The whole search benchmark; returns whether every target was met. */
export async function runSearchBench(log: (line: string) => void): Promise<{ pass: boolean }> {
  const seconds = Number(process.env.BENCH_SECONDS ?? 10);
  const sheets = Number(process.env.BENCH_SHEETS ?? 10_000);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-bench-'));
  const servers: RunningServer[] = [];
  let baseline: { url: string; child: ChildProcess } | null = null;
  try {
    log(`machine: ${os.cpus()[0]?.model ?? 'unknown CPU'}; ${load()}`);
    const seeded = await seedBulk({
      dataDir,
      sheets,
      adapters: Math.round(sheets / 5),
      onProgress: progressBar(),
    });
    log(
      `seeded ${seeded.sheets} connector sheets (${seeded.cavities} cavities) and ${seeded.adapters} adapter sheets in ${(seeded.ms / 1000).toFixed(1)} s`,
    );
    const slugs = await sheetSlugs(seeded.file, 200);
    const words = WORDS.map((w) => `/api/search?q=${w}`);
    const filtered = FILTERED.map((f) => `/api/search?${f}`);
    const sheetPaths = slugs.map((s) => `/api/documents/${s}`);
    const env = { LOG_LEVEL: 'warn' };

    const rows: Measure[] = [];
    const shipped = await startServer({ dataDir, seedDemo: false, env });
    servers.push(shipped);
    rows.push(
      await measure('product: search, a word', shipped.url, words, seconds, shipped.child.pid),
    );
    rows.push(
      await measure(
        'product: search, word + filters',
        shipped.url,
        filtered,
        seconds,
        shipped.child.pid,
      ),
    );
    rows.push(
      await measure(
        'product: open a connector sheet',
        shipped.url,
        sheetPaths,
        seconds,
        shipped.child.pid,
      ),
    );
    await shipped.stop();

    const cold = await startServer({
      dataDir,
      seedDemo: false,
      env: { ...env, ANSWER_CACHE: 'off' },
    });
    servers.push(cold);
    rows.push(
      await measure(
        'product, no answer cache: search, a word',
        cold.url,
        words,
        seconds,
        cold.child.pid,
      ),
    );
    rows.push(
      await measure(
        'product, no answer cache: word + filters',
        cold.url,
        filtered,
        seconds,
        cold.child.pid,
      ),
    );
    rows.push(
      await measure(
        'product, no answer cache: open a sheet',
        cold.url,
        sheetPaths,
        seconds,
        cold.child.pid,
      ),
    );
    await cold.stop();

    baseline = await startBaseline(seeded.file);
    const bare = (p: string) => p.replace('/api/search', '/search');
    rows.push(
      await measure(
        'baseline (node:http + sqlite3): a word',
        baseline.url,
        words.map(bare),
        seconds,
        baseline.child.pid,
      ),
    );
    rows.push(
      await measure(
        'baseline (node:http + sqlite3): word + filters',
        baseline.url,
        filtered.map(bare),
        seconds,
        baseline.child.pid,
      ),
    );
    await stop(baseline.child);
    baseline = null;

    log('');
    log(
      `autocannon, ${CONNECTIONS} connections, ${seconds} s each after a warm-up (every path once, then 1 s); ${load()}`,
    );
    table(rows, log);
    const by = (name: string) => rows.find((r) => r.name === name)!;
    const ratio = (a: string, b: string) => by(a).rps / by(b).rps;
    const ratios = {
      word: ratio('product: search, a word', 'baseline (node:http + sqlite3): a word'),
      filters: ratio(
        'product: search, word + filters',
        'baseline (node:http + sqlite3): word + filters',
      ),
      coldWord: ratio(
        'product, no answer cache: search, a word',
        'baseline (node:http + sqlite3): a word',
      ),
      coldFilters: ratio(
        'product, no answer cache: word + filters',
        'baseline (node:http + sqlite3): word + filters',
      ),
    };
    log('');
    log(
      `search throughput, product ÷ baseline: a word ${ratios.word.toFixed(2)}, with filters ${ratios.filters.toFixed(2)}`,
    );
    log(
      `  without the answer cache:              a word ${ratios.coldWord.toFixed(2)}, with filters ${ratios.coldFilters.toFixed(2)}`,
    );
    const checks: Array<[string, boolean]> = [
      [
        `search p95 < ${TARGETS.searchP95Ms} ms (a word: ${ms(by('product: search, a word').p95)})`,
        by('product: search, a word').p95 < TARGETS.searchP95Ms,
      ],
      [
        `search p95 < ${TARGETS.searchP95Ms} ms (with filters: ${ms(by('product: search, word + filters').p95)})`,
        by('product: search, word + filters').p95 < TARGETS.searchP95Ms,
      ],
      [
        `sheet p95 < ${TARGETS.sheetP95Ms} ms (${ms(by('product: open a connector sheet').p95)})`,
        by('product: open a connector sheet').p95 < TARGETS.sheetP95Ms,
      ],
      [
        `search throughput ≥ ${TARGETS.throughputRatio} × baseline (${Math.min(ratios.word, ratios.filters).toFixed(2)})`,
        Math.min(ratios.word, ratios.filters) >= TARGETS.throughputRatio,
      ],
      ['no errors and no non-2xx answers', rows.every((r) => r.non2xx + r.errors === 0)],
    ];
    for (const [what, ok] of checks) log(`${ok ? 'PASS' : 'FAIL'}: ${what}`);
    return { pass: checks.every(([, ok]) => ok) };
  } finally {
    if (baseline) await stop(baseline.child);
    for (const s of servers) await s.stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}
