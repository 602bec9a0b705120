/**
 * `npm run seed:bulk -- --sheets 10000 [--adapters 2000] [--force]`
 *
 * Fills DATA_DIR (default ./data) with published connector sheets and adapter sheets
 * of invented data, for trying the lookup and the benchmarks at scale: platforms,
 * engines, components and circuits are made up here, none names a real make, brand or
 * part number. A DATA_DIR whose database already holds accounts or documents is
 * refused unless --force, which deletes that database first.
 *
 * Rows are written with multi-row INSERTs in large transactions on one direct sqlite3
 * connection, then indexed for search by the same code the publish path uses.
 */
import fs from 'node:fs';
import { pathToFileURL } from 'node:url';
import sqlite3 from 'sqlite3';
import { loadConfig } from '../server/config';
import { createSequelize } from '../server/db/sequelize';
import { migrate } from '../server/db/migrate';
import { hashPassword } from '../server/auth/passwords';
import { DEMO_ACCOUNTS } from '../server/seed/accounts';
import { slugify } from '../server/services/documents';
import { buildIndexRow } from '../server/search/rows';
import { writeIndexRows, type SqlRunner } from '../server/search/store';
import type { ConnectorContent } from '../shared/schemas/connector';
import { letterLabels, numericLabels } from '../shared/wire/cavities';

export interface BulkOptions {
  dataDir: string;
  sheets: number;
  adapters: number;
  force?: boolean;
  /** Seed of the random generator: the same seed gives the same data. */
  seed?: number;
  demoPassword?: string;
  onProgress?: (done: number, total: number, stage: string) => void;
}

export interface BulkResult {
  file: string;
  sheets: number;
  adapters: number;
  cavities: number;
  ms: number;
}

export class BulkSeedRefused extends Error {}

// ── Invented vocabulary ────────────────────────────────────────────────────

const PLATFORMS = [
  'Brindlemoor',
  'Quorvane',
  'Tavrenlo',
  'Quillondy',
  'Vessomar',
  'Fennickar',
  'Aldrivane',
  'Corvanthe',
  'Haldrimore',
  'Pellamoth',
  'Ruskavel',
  'Sorrendyl',
  'Thessavane',
  'Veylandor',
  'Orrinmede',
  'Kelvaspur',
];
const ENGINE_CODES = ['T3', 'K4', 'R2', 'V6', 'L5', 'M8', 'Q1', 'D7'];
const COMPONENTS = [
  'coolant temperature sensor',
  'intake air temperature sensor',
  'manifold absolute pressure sensor',
  'camshaft position sensor',
  'crankshaft position sensor',
  'knock sensor',
  'oxygen sensor',
  'fuel injector',
  'ignition coil',
  'electronic throttle body',
  'accelerator pedal position sensor',
  'fuel pump module',
  'radiator cooling fan motor',
  'idle air control valve',
  'evaporative purge valve',
  'oil pressure switch',
  'vehicle speed sensor',
  'wheel speed sensor',
  'brake light switch',
  'reversing lamp switch',
  'headlamp unit',
  'tail lamp cluster',
  'horn',
  'wiper motor',
  'washer pump',
  'door lock actuator',
  'window regulator motor',
  'mirror adjuster',
  'seat heater',
  'blower motor',
  'heater control valve',
  'alternator',
  'starter solenoid',
  'engine control module',
  'body control module',
  'instrument cluster',
  'fuse and relay box',
  'diagnostic socket',
  'turbo boost solenoid',
  'exhaust gas temperature sensor',
  'fuel level sender',
  'fuel rail pressure sensor',
  'transmission range switch',
  'steering angle sensor',
  'parking sensor',
  'rear body harness',
  'engine harness bulkhead',
  'trailer socket',
  'glow plug relay',
  'coolant level switch',
];
const PLACES = [
  'engine bay',
  'under the rear seat',
  'behind the glovebox',
  'on the thermostat housing',
  'on the intake manifold',
  'left kick panel',
  'right kick panel',
  'in the boot floor',
  'on the firewall',
  'under the dash',
  'front bumper',
  'rear bumper',
];
const PLUG_WORDS = ['plug', 'connector', 'socket', 'harness plug', 'pigtail'];
const COLORS = ['BK', 'BN', 'RD', 'OG', 'YE', 'GN', 'BU', 'VT', 'GY', 'WH', 'PK', 'TQ'];
const AWG = ['24 AWG', '22 AWG', '20 AWG', '18 AWG', '16 AWG', '14 AWG'];
const MM2 = ['0.35 mm²', '0.5 mm²', '0.75 mm²', '1 mm²', '1.5 mm²', '2.5 mm²'];
const TERMINALS = ['0.64 mm', '1.2 mm', '1.5 mm blade', '2.8 mm blade', '6.3 mm blade'];
const NOTES = [
  'Twisted pair with the next cavity',
  'Shield drains at the module end only',
  'Fused in the under-bonnet box',
  'Shared with the neighbouring sensor',
  'Spare on this trim level',
  'Later builds changed the colour',
  'Goes to the instrument cluster',
  'Splice inside the main loom',
];

/** Cavity counts and how often they occur: about twelve on average. */
const CAVITY_COUNTS: Array<[count: number, weight: number]> = [
  [1, 3],
  [2, 12],
  [3, 14],
  [4, 10],
  [5, 4],
  [6, 10],
  [8, 8],
  [10, 6],
  [12, 7],
  [16, 5],
  [18, 3],
  [20, 4],
  [24, 3],
  [26, 2],
  [32, 3],
  [40, 2],
  [48, 2],
  [64, 1.5],
  [80, 1],
];

/** Small, fast, seedable (mulberry32). */
function rng(seed: number) {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const int = (n: number) => Math.floor(next() * n);
  const pick = <T>(list: readonly T[]): T => list[int(list.length)];
  const weighted = <T>(list: ReadonlyArray<[T, number]>): T => {
    const total = list.reduce((s, [, w]) => s + w, 0);
    let r = next() * total;
    for (const [v, w] of list) if ((r -= w) <= 0) return v;
    return list[list.length - 1][0];
  };
  return { next, int, pick, weighted };
}

type Rng = ReturnType<typeof rng>;

const ROLE_WEIGHTS: Array<[string, number]> = [
  ['signal', 30],
  ['ground', 14],
  ['low reference', 10],
  ['5 V reference', 8],
  ['switched ignition feed', 8],
  ['battery feed', 5],
  ['motor +', 3],
  ['motor −', 3],
  ['serial data high', 3],
  ['serial data low', 3],
  ['shield', 2],
  ['unused', 6],
];

function color(r: Rng): string {
  const base = r.pick(COLORS);
  if (r.next() < 0.55) return base;
  let tracer = r.pick(COLORS);
  if (tracer === base) tracer = base === 'WH' ? 'BK' : 'WH';
  return `${base}/${tracer}`;
}

function platformOf(r: Rng) {
  const name = r.pick(PLATFORMS);
  if (r.next() < 0.35) {
    const engine = `${name} ${r.pick(ENGINE_CODES)} engine`;
    return { tag: engine, title: `${name} ${engine.split(' ')[1]}`, metric: true };
  }
  const platform = `${name} ${1 + r.int(5)}.${r.int(10)} platform`;
  return { tag: platform, title: platform.replace(' platform', ''), metric: r.next() < 0.3 };
}

function connectorSheet(r: Rng, n: number): { title: string; content: ConnectorContent } {
  const p = platformOf(r);
  const component = r.pick(COMPONENTS);
  const alpha = n <= 12 && r.next() < 0.3;
  const labels = alpha ? letterLabels(n) : numericLabels(n);
  const rows =
    n <= 6 ? (n > 3 && r.next() < 0.5 ? 2 : 1) : Math.min(8, 2 + r.int(Math.ceil(n / 12)));
  const cols = Math.ceil(n / rows);
  const sizes = p.metric ? MM2 : AWG;
  const pins = labels.map((cavity, i) => {
    const role = r.weighted(ROLE_WEIGHTS);
    if (role === 'unused') return { cavity, role, color: '', size: '', circuit: '', note: '' };
    const heavy = role === 'battery feed' || role.startsWith('motor') || role === 'ground';
    return {
      cavity,
      role,
      color: color(r),
      size: heavy ? sizes[3 + r.int(3)] : sizes[r.int(3)],
      circuit: `${String.fromCharCode(65 + r.int(26))}${100 + r.int(900)}`,
      note:
        r.next() < 0.12
          ? r.pick(NOTES)
          : i === 0 && r.next() < 0.2
            ? 'Cavity 1 is marked on the housing'
            : '',
    };
  });
  const place = r.pick(PLACES);
  const word = r.pick(PLUG_WORDS);
  return {
    title: `${p.title} ${component} ${word}, ${n}-${r.next() < 0.7 ? 'cavity' : 'way'}`,
    content: {
      cavityCount: n,
      labels: alpha ? 'alpha' : 'numeric',
      layout: { rows, cols },
      housing: r.next() < 0.6 ? 'socket' : 'pin',
      view: r.next() < 0.55 ? 'wire-side' : 'mating-face',
      sealed: r.next() < 0.55,
      component,
      tags: [p.tag, place, ...(r.next() < 0.3 ? [r.pick(PLACES)] : [])].filter(
        (t, i, all) => all.indexOf(t) === i,
      ),
      terminalSize: r.pick(TERMINALS),
      wireSize: { min: sizes[0], max: sizes[4] },
      pins,
      summary:
        r.next() < 0.3 ? `The ${component} ${word} ${place}, as probed on a bench harness.` : '',
      notes: r.next() < 0.15 ? 'Release the secondary lock before pushing the terminals out.' : '',
    },
  };
}

interface SheetRef {
  id: number;
  title: string;
  content: ConnectorContent;
}

function adapterSheet(r: Rng, a: SheetRef, b: SheetRef) {
  const la = numericOrLabels(a.content);
  const lb = numericOrLabels(b.content);
  const pinsA = a.content.pins ?? [];
  const pinsB = b.content.pins ?? [];
  const n = Math.min(la.length, lb.length);
  const circuits = Array.from({ length: n }, (_, i) => {
    const role = pinsA[i]?.role || 'signal';
    return {
      id: `w${i + 1}`,
      a: [la[i]],
      b: [lb[i]],
      role,
      size: pinsA[i]?.size || '0.5 mm²',
      color: pinsA[i]?.color || pinsB[i]?.color || 'BK',
      lengthMm: 200 + r.int(16) * 50,
    };
  }).filter((c) => c.role !== 'unused');
  const end = (s: SheetRef, labels: string[]) => ({
    connectorId: s.id,
    label: s.title,
    cavities: labels,
    sealed: s.content.sealed ?? null,
    view: s.content.view || null,
    roles: Object.fromEntries((s.content.pins ?? []).map((p) => [p.cavity, p.role ?? ''])),
  });
  return {
    title: `${a.title.split(',')[0]} to ${b.title.split(',')[0]}, ${la.length}-way to ${lb.length}-way`,
    content: { systemVoltage: 12, ends: { A: end(a, la), B: end(b, lb) }, circuits },
  };
}

function numericOrLabels(c: ConnectorContent): string[] {
  const n = c.cavityCount ?? 0;
  return c.labels === 'alpha' ? letterLabels(n) : numericLabels(n);
}

// ── Writing ────────────────────────────────────────────────────────────────

function open(file: string): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, (err) => (err ? reject(err) : resolve(db)));
  });
}

function runner(
  db: sqlite3.Database,
): SqlRunner & { exec(sql: string): Promise<void>; close(): Promise<void> } {
  return {
    all: <T>(sql: string, params: unknown[] = []) =>
      new Promise<T[]>((resolve, reject) =>
        db.all(sql, params, (err, rows) => (err ? reject(err) : resolve(rows as T[]))),
      ),
    run: (sql: string, params: unknown[] = []) =>
      new Promise<void>((resolve, reject) =>
        db.run(sql, params, (err) => (err ? reject(err) : resolve())),
      ),
    exec: (sql: string) =>
      new Promise<void>((resolve, reject) =>
        db.exec(sql, (err) => (err ? reject(err) : resolve())),
      ),
    close: () =>
      new Promise<void>((resolve, reject) => db.close((err) => (err ? reject(err) : resolve()))),
  };
}

/** A date as Sequelize writes it to SQLite, so the models read it back unchanged. */
function sqlDate(ms: number): string {
  return new Date(ms).toISOString().replace('T', ' ').replace('Z', ' +00:00');
}

const tuples = (rows: number, cols: number) =>
  Array(rows)
    .fill(`(${Array(cols).fill('?').join(', ')})`)
    .join(', ');

async function insertMany(sql: SqlRunner, table: string, columns: string[], rows: unknown[][]) {
  const per = Math.max(1, Math.floor(30_000 / columns.length));
  for (let i = 0; i < rows.length; i += per) {
    const part = rows.slice(i, i + per);
    await sql.run(
      `INSERT INTO ${table} (${columns.join(', ')}) VALUES ${tuples(part.length, columns.length)}`,
      part.flat(),
    );
  }
}

async function hasContent(file: string): Promise<boolean> {
  if (!fs.existsSync(file)) return false;
  const sql = runner(await open(file));
  try {
    const tables = await sql.all<{ name: string }>(
      `SELECT name FROM sqlite_master WHERE type = 'table' AND name IN ('users', 'documents')`,
    );
    for (const { name } of tables) {
      const [row] = await sql.all<{ n: number }>(`SELECT count(*) AS n FROM ${name}`);
      if (row.n > 0) return true;
    }
    return false;
  } finally {
    await sql.close();
  }
}

/** Fills `dataDir` with invented published sheets; see the file's comment. */
export async function seedBulk(opts: BulkOptions): Promise<BulkResult> {
  const started = Date.now();
  const config = loadConfig({ DATA_DIR: opts.dataDir, LOG_LEVEL: 'silent' });
  const file = config.databaseFile;
  if (await hasContent(file)) {
    if (!opts.force)
      throw new BulkSeedRefused(
        `${config.dataDir} already holds a database with accounts or documents. Point DATA_DIR at an empty folder, or add --force to delete that database and start over.`,
      );
    for (const suffix of ['', '-wal', '-shm', '-journal'])
      fs.rmSync(file + suffix, { force: true });
  }
  fs.mkdirSync(config.dataDir, { recursive: true });

  const sequelize = createSequelize({ file });
  await migrate(sequelize);
  await sequelize.close();

  const progress = opts.onProgress ?? (() => {});
  const total = opts.sheets + opts.adapters;
  const r = rng(opts.seed ?? 20_260_101);
  const db = await open(file);
  const sql = runner(db);
  await sql.exec(
    'PRAGMA journal_mode=WAL; PRAGMA synchronous=OFF; PRAGMA foreign_keys=ON; PRAGMA cache_size=-65536; PRAGMA temp_store=MEMORY;',
  );

  const hash = await hashPassword(
    opts.demoPassword ?? config.demoPassword,
    config.passwordHashCost,
  );
  const now = Date.now();
  const created = sqlDate(now - 400 * 86_400_000);
  const people = [
    ...DEMO_ACCOUNTS,
    ...Array.from({ length: 40 }, (_, i) => ({
      email: `bulk.author${i + 1}@example.test`,
      displayName: `${r.pick(PLATFORMS)} ${['Wirer', 'Crimper', 'Looms', 'Probe', 'Splicer'][i % 5]} ${i + 1}`,
      role: 'member' as const,
    })),
  ];
  await sql.exec('BEGIN');
  await insertMany(
    sql,
    'users',
    [
      'email',
      'display_name',
      'password_hash',
      'role',
      'email_verified_at',
      'session_epoch',
      'created_at',
      'updated_at',
    ],
    people.map((p) => [p.email, p.displayName, hash, p.role, created, 0, created, created]),
  );
  await sql.exec('COMMIT');
  const users = await sql.all<{ id: number; role: string }>(
    'SELECT id, role FROM users ORDER BY id',
  );
  const reviewers = users.filter((u) => u.role !== 'member').map((u) => u.id);
  const authors = users.filter((u) => u.role === 'member').map((u) => u.id);

  const [{ m }] = await sql.all<{ m: number | null }>('SELECT max(id) AS m FROM documents');
  let nextId = (m ?? 0) + 1;
  const [{ mr }] = await sql.all<{ mr: number | null }>('SELECT max(id) AS mr FROM revisions');
  let nextRev = (mr ?? 0) + 1;
  const sheets: SheetRef[] = [];
  let cavities = 0;
  let done = 0;
  const BATCH = 1000;

  const writeBatch = async (
    kind: 'connector' | 'adapter',
    batch: Array<{ title: string; content: Record<string, unknown> }>,
  ) => {
    const docs: unknown[][] = [];
    const revs: unknown[][] = [];
    const index = [];
    for (const item of batch) {
      const id = nextId++;
      const revId = nextRev++;
      const author = r.pick(authors);
      const reviewer = r.pick(reviewers);
      const publishedMs = now - r.int(700 * 86_400_000);
      const submitted = sqlDate(publishedMs - 86_400_000);
      const published = sqlDate(publishedMs);
      const slug = `${slugify(item.title, kind).slice(0, 70)}-${id}`;
      docs.push([id, kind, slug, author, revId, submitted, published]);
      revs.push([
        revId,
        id,
        kind,
        1,
        item.title,
        JSON.stringify(item.content),
        'published',
        author,
        reviewer,
        null,
        submitted,
        published,
        published,
        reviewer,
        submitted,
        1,
        submitted,
        published,
      ]);
      index.push(
        buildIndexRow(
          { id, kind, slug },
          { id: revId, title: item.title, content: item.content, publishedAt: publishedMs },
        ),
      );
      if (kind === 'connector')
        sheets.push({ id, title: item.title, content: item.content as ConnectorContent });
    }
    await sql.exec('BEGIN');
    await insertMany(
      sql,
      'documents',
      ['id', 'kind', 'slug', 'owner_id', 'published_revision_id', 'created_at', 'updated_at'],
      docs,
    );
    await insertMany(
      sql,
      'revisions',
      [
        'id',
        'document_id',
        'kind',
        'number',
        'title',
        'content',
        'status',
        'author_id',
        'reviewer_id',
        'note',
        'submitted_at',
        'decided_at',
        'published_at',
        'claimed_by_id',
        'claimed_at',
        'version',
        'created_at',
        'updated_at',
      ],
      revs,
    );
    await writeIndexRows(sql, index, { replace: false });
    await sql.exec('COMMIT');
    done += batch.length;
    progress(done, total, kind === 'connector' ? 'connector sheets' : 'adapter sheets');
  };

  progress(0, total, 'connector sheets');
  for (let i = 0; i < opts.sheets; i += BATCH) {
    const batch = [];
    for (let k = i; k < Math.min(opts.sheets, i + BATCH); k++) {
      const n = r.weighted(CAVITY_COUNTS);
      cavities += n;
      batch.push(connectorSheet(r, n));
    }
    await writeBatch('connector', batch);
  }
  for (let i = 0; i < opts.adapters && sheets.length >= 2; i += BATCH) {
    const batch = [];
    for (let k = i; k < Math.min(opts.adapters, i + BATCH); k++) {
      const a = r.pick(sheets);
      // Adapters join connectors of similar size: within a few cavities of each other.
      let b = r.pick(sheets);
      for (
        let t = 0;
        t < 20 && Math.abs((b.content.cavityCount ?? 0) - (a.content.cavityCount ?? 0)) > 4;
        t++
      )
        b = r.pick(sheets);
      batch.push(adapterSheet(r, a, b));
    }
    await writeBatch('adapter', batch);
  }
  await sql.exec('PRAGMA synchronous=NORMAL; PRAGMA optimize; PRAGMA wal_checkpoint(TRUNCATE);');
  await sql.close();
  return {
    file,
    sheets: opts.sheets,
    adapters: Math.min(opts.adapters, done - opts.sheets),
    cavities,
    ms: Date.now() - started,
  };
}

// ── The command ────────────────────────────────────────────────────────────

/** A progress bar on a terminal; a line every tenth of the way otherwise. */
export function progressBar(out: NodeJS.WriteStream = process.stderr) {
  const started = Date.now();
  let lastTenth = -1;
  return (done: number, total: number, stage: string) => {
    const share = total ? done / total : 1;
    const secs = ((Date.now() - started) / 1000).toFixed(1);
    if (out.isTTY) {
      const width = Math.max(10, Math.min(40, (out.columns ?? 80) - 50));
      const filled = Math.round(share * width);
      out.write(
        `\r[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${String(Math.round(share * 100)).padStart(3)}% ${done}/${total} ${stage} ${secs}s\x1b[K`,
      );
      if (done >= total) out.write('\n');
    } else {
      const tenth = Math.floor(share * 10);
      if (tenth !== lastTenth) {
        lastTenth = tenth;
        out.write(`${Math.round(share * 100)}% ${done}/${total} ${stage} ${secs}s\n`);
      }
    }
  };
}

function parseArgs(argv: string[]) {
  const out = { sheets: 10_000, adapters: -1, force: false, seed: undefined as number | undefined };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = () => {
      const v = Number(argv[++i]);
      if (!Number.isInteger(v) || v < 0)
        throw new Error(`${a} needs a whole number, such as ${a} 10000.`);
      return v;
    };
    if (a === '--sheets') out.sheets = value();
    else if (a === '--adapters') out.adapters = value();
    else if (a === '--seed') out.seed = value();
    else if (a === '--force') out.force = true;
    else
      throw new Error(`Unknown option ${a}. Use --sheets N, --adapters N, --seed N and --force.`);
  }
  if (out.adapters < 0) out.adapters = Math.round(out.sheets / 5);
  return out;
}

async function main() {
  let args;
  try {
    args = parseArgs(process.argv.slice(2));
  } catch (err) {
    console.error((err as Error).message);
    process.exit(2);
  }
  const dataDir = process.env.DATA_DIR ?? './data';
  try {
    const result = await seedBulk({ dataDir, ...args, onProgress: progressBar() });
    console.log(
      `Seeded ${result.sheets} connector sheets (${result.cavities} cavities) and ${result.adapters} adapter sheets into ${result.file} in ${(result.ms / 1000).toFixed(1)} s.`,
    );
  } catch (err) {
    if (err instanceof BulkSeedRefused) {
      console.error(err.message);
      process.exit(1);
    }
    throw err;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await main();
