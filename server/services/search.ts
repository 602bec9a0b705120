/**
 * Search over published documents: keeping the index in step with publishing, the
 * search itself with its filters, sorts, snippets and typo fallback, as-you-type
 * suggestions and the browse facets.
 *
 * How a query is searched (each step only when the one before found nothing):
 * 1. Every term is a quoted FTS5 string over a trigram index, so each term matches
 *    as a substring anywhere (which covers prefixes: "coola" finds "coolant"). Short
 *    words join their neighbour into a phrase ("5 V reference", "3 cavity"); a short
 *    word on its own is matched with LIKE on the document's keywords, because a
 *    trigram index cannot look up fewer than three characters.
 * 2. The same with every short word matched with LIKE on its own.
 * 3. Typos: each plain word of five letters or more is looked up in a vocabulary of
 *    the indexed words by its trigrams (OR-ed, ranked by how many it shares); shorter
 *    words are compared with the vocabulary words of about their length. The closest
 *    word within a small edit distance (transpositions count as one edit) replaces
 *    it, and the search runs once more. The answer says what was searched instead.
 * Relevance is where the words occur (title, then component, then tags, then
 * anywhere), then the shorter title, then the newest.
 * Each request runs a small, bounded number of statements: one for the page and
 * one for the total (skipped when the first page is not full), plus at most four
 * vocabulary look-ups and one more search on the typo path.
 */
import type { Sequelize, Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { prepare, type Prepared } from '../http/prepared';
import {
  DEFAULT_SEARCH_LIMIT,
  type BrowseAnswer,
  type SearchAnswer,
  type SearchCard,
  type SearchItem,
  type SearchQuery,
  type SearchSort,
  type Suggestion,
} from '../../shared/schemas/search';
import type { DocumentKind } from '../../shared/schemas/document';
import { parseWireColor } from '../../shared/wire/colors';
import { buildIndexRow, type IndexDoc, type IndexRevision } from '../search/rows';
import {
  clearIndex,
  removeIndexRows,
  sequelizeRunner,
  writeIndexRows,
  type SqlRunner,
} from '../search/store';
import {
  editDistance,
  findRanges,
  fold,
  ftsString,
  likeContains,
  makeSnippet,
  markHtml,
  matchExpression,
  mergedPlan,
  parseQuery,
  samePlan,
  separatePlan,
  trigrams,
  typoBudget,
  type QueryTerm,
  type TextPlan,
} from '../search/text';

export type { IndexDoc, IndexRevision };

// ── Keeping the index in step ──────────────────────────────────────────────

interface Facets {
  total: number;
  kinds: BrowseAnswer['kinds'];
  components: Array<{ key: string; name: string; count: number }>;
  tags: Array<{ key: string; name: string; count: number }>;
  cavities: BrowseAnswer['cavities'];
}

/** Per database: a counter that rises with every committed index change, and facets read at one count. */
interface SearchCache {
  /** Rises with every committed change of the index; cached entries name the one they were read at. */
  generation: number;
  facets?: { at: number; value: Promise<Facets> };
  answers: Map<string, AnswerEntry>;
}

const caches = new WeakMap<Sequelize, SearchCache>();

/** Answers kept per database: enough for the lookups readers repeat. */
const MAX_ANSWERS = 1000;

function cacheOf(sequelize: Sequelize): SearchCache {
  let c = caches.get(sequelize);
  if (!c) caches.set(sequelize, (c = { generation: 0, answers: new Map() }));
  return c;
}
/** Forgets the cached facets of `sequelize`'s database (after writing the index from outside a transaction). */
export function searchIndexChanged(sequelize: Sequelize): void {
  const c = cacheOf(sequelize);
  c.generation++;
  c.answers.clear();
}

function sequelizeOf(transaction: Transaction): Sequelize {
  return (transaction as unknown as { sequelize: Sequelize }).sequelize;
}

/**
 * Indexes `revision` as the published revision of `doc`, replacing whatever the index
 * held for the document (so a superseded revision leaves it). Runs inside the publish
 * transaction: if publishing rolls back, so does the index.
 */
export async function indexPublished(
  doc: IndexDoc,
  revision: IndexRevision,
  transaction: Transaction,
): Promise<void> {
  const sequelize = sequelizeOf(transaction);
  await writeIndexRows(sequelizeRunner(sequelize, transaction), [buildIndexRow(doc, revision)], {
    replace: true,
  });
  transaction.afterCommit(() => searchIndexChanged(sequelize));
}

/** Takes a document out of the index, inside the transaction that unpublishes it. */
export async function removeFromIndex(documentId: number, transaction: Transaction): Promise<void> {
  const sequelize = sequelizeOf(transaction);
  await removeIndexRows(sequelizeRunner(sequelize, transaction), [documentId]);
  transaction.afterCommit(() => searchIndexChanged(sequelize));
}

interface PublishedRow {
  id: number;
  kind: DocumentKind;
  slug: string;
  revision_id: number;
  title: string;
  content: string;
  published_at: string | null;
}

function parseContent(raw: string): Record<string, unknown> {
  try {
    const v = JSON.parse(raw) as unknown;
    return v && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : {};
  } catch {
    return {};
  }
}

/**
 * Empties the index and indexes every published revision again, a thousand at a time.
 * For migrations and repairs; the caller decides the transaction.
 */
export async function rebuildSearchIndex(
  sql: SqlRunner,
  onProgress?: (done: number) => void,
): Promise<number> {
  await clearIndex(sql);
  let after = 0;
  let done = 0;
  for (;;) {
    const rows = await sql.all<PublishedRow>(
      `SELECT d.id, d.kind, d.slug, r.id AS revision_id, r.title, r.content, r.published_at
       FROM documents d JOIN revisions r ON r.id = d.published_revision_id
       WHERE d.id > ? ORDER BY d.id LIMIT 1000`,
      [after],
    );
    if (!rows.length) return done;
    await writeIndexRows(
      sql,
      rows.map((r) =>
        buildIndexRow(
          { id: r.id, kind: r.kind, slug: r.slug },
          {
            id: r.revision_id,
            title: r.title,
            content: parseContent(r.content),
            publishedAt: r.published_at,
          },
        ),
      ),
      { replace: false },
    );
    after = rows[rows.length - 1].id;
    done += rows.length;
    onProgress?.(done);
  }
}

// ── Searching ──────────────────────────────────────────────────────────────

interface Filters {
  where: string[];
  params: unknown[];
}

const valueFilter = `d.document_id IN (SELECT document_id FROM search_values WHERE facet = ? AND value = ?)`;
const key = (s: string) => fold(s).replace(/\s+/g, ' ').trim();

function filtersOf(q: SearchQuery): Filters {
  const where: string[] = [];
  const params: unknown[] = [];
  if (q.kind) {
    where.push('d.kind = ?');
    params.push(q.kind);
  }
  if (q.cavities !== undefined) {
    where.push('(d.cavity_count = ? OR d.cavity_count_b = ?)');
    params.push(q.cavities, q.cavities);
  }
  if (q.cavitiesMin !== undefined || q.cavitiesMax !== undefined) {
    const lo = q.cavitiesMin ?? 0;
    const hi = q.cavitiesMax ?? 1_000_000;
    where.push('(d.cavity_count BETWEEN ? AND ? OR d.cavity_count_b BETWEEN ? AND ?)');
    params.push(lo, hi, lo, hi);
  }
  if (q.component) {
    where.push('d.component_key = ?');
    params.push(key(q.component));
  }
  if (q.sealed !== undefined) {
    where.push('d.sealed = ?');
    params.push(q.sealed ? 1 : 0);
  }
  if (q.housing) {
    where.push('d.housing = ?');
    params.push(q.housing);
  }
  if (q.color) {
    where.push(valueFilter);
    params.push('color', q.color);
  }
  if (q.role) {
    where.push(valueFilter);
    params.push('role', key(q.role));
  }
  if (q.tag) {
    where.push(valueFilter);
    params.push('tag', key(q.tag));
  }
  return { where, params };
}

type OrderKey = [expr: string, dir: 'ASC' | 'DESC'];

const NEWEST: OrderKey[] = [
  ['d.published_at', 'DESC'],
  ['d.document_id', 'DESC'],
];

/**
 * Relevance: where the words occur. A word in the title counts most, then in the
 * component, then in the tags; a match anywhere else (pins, notes, write-up text)
 * counts only by being there. Ties go to the shorter title (the more specific
 * sheet), then the newest. Cheaper than bm25 over thousands of trigram matches,
 * and easy to explain to a reader.
 */
function relevance(needles: string[]): { keys: OrderKey[]; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  for (const n of needles) {
    parts.push(
      '(instr(d.title_key, ?) > 0) * 8 + (instr(d.component_key, ?) > 0) * 4 + (instr(d.tags_key, ?) > 0) * 3',
    );
    params.push(n, n, n);
  }
  const score: OrderKey[] = parts.length ? [[parts.join(' + '), 'DESC']] : [];
  return { keys: [...score, ['d.title_len', 'ASC'], ...NEWEST], params };
}

function orderOf(sort: SearchSort, plan: TextPlan | null): { keys: OrderKey[]; params: unknown[] } {
  const needles = needlesOf(plan);
  if (sort === 'relevance' && needles.length) return relevance(needles);
  if (sort === 'cavities')
    return {
      keys: [['d.cavity_count IS NULL', 'ASC'], ['d.cavity_count', 'ASC'], ...NEWEST],
      params: [],
    };
  return { keys: NEWEST, params: [] };
}

interface PageRow {
  id: number;
  slug: string;
  kind: DocumentKind;
  title: string;
  summary: string;
  component: string;
  tags_text: string;
  pins_text: string;
  body_text: string;
  card: string;
}

interface PlanResult {
  total: number;
  rows: PageRow[];
}

const LIKE = `t.keywords LIKE ? ESCAPE '\\'`;

/**
 * The full-text match drives every query: CROSS JOIN keeps SQLite from starting at a
 * filter and re-running the MATCH once per candidate row (seconds instead of
 * milliseconds for "pump" with a colour filter).
 */
const FTS_DRIVEN = 'search_fts CROSS JOIN search_docs d ON d.document_id = search_fts.rowid';

/** A two-letter word that is a wire colour code ("GN") is the colour, not two letters anywhere. */
function colorCodeOf(word: string): string | null {
  if (!/^[a-z]{2}$/.test(word)) return null;
  const parsed = parseWireColor(word);
  return parsed.ok && !parsed.tracer ? parsed.normalized : null;
}

interface Statement {
  sql: string;
  params: unknown[];
}

/** The statements of one plan: the page, and the count when the page is full. */
function planStatements(
  plan: TextPlan | null,
  filters: Filters,
  sort: SearchSort,
  limit: number,
  offset: number,
): { page: Statement; count: Statement } {
  const where: string[] = [];
  const params: unknown[] = [];
  const match = plan ? matchExpression(plan.indexed) : null;
  const short = plan?.short ?? [];
  let from = 'search_docs d';
  if (match) {
    from = FTS_DRIVEN;
    where.push('search_fts MATCH ?');
    params.push(match);
  }
  let texts = false;
  for (const s of short) {
    const code = colorCodeOf(s);
    if (code) {
      where.push(valueFilter);
      params.push('color', code);
      continue;
    }
    if (!texts) from += ' JOIN search_texts t ON t.document_id = d.document_id';
    texts = true;
    where.push(LIKE);
    params.push(likeContains(s));
  }
  where.push(...filters.where);
  params.push(...filters.params);
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : '';
  const order = orderOf(sort, plan);
  const inner = order.keys.map(([e], i) => `${e} AS k${i}`).join(', ');
  const innerOrder = order.keys.map(([, dir], i) => `k${i} ${dir}`).join(', ');
  const outerOrder = order.keys.map(([, dir], i) => `p.k${i} ${dir}`).join(', ');
  return {
    // Filters, sorts and ranking read only the narrow table; the texts of one page are read last.
    page: {
      sql: `SELECT t.document_id AS id, t.slug, d.kind, t.title, t.summary, t.component,
              t.tags_text, t.pins_text, t.body_text, t.card
            FROM (SELECT d.document_id AS id, ${inner} FROM ${from} ${whereSql}
                  ORDER BY ${innerOrder} LIMIT ? OFFSET ?) p
            JOIN search_texts t ON t.document_id = p.id
            JOIN search_docs d ON d.document_id = p.id
            ORDER BY ${outerOrder}`,
      params: [...order.params, ...params, limit, offset],
    },
    count: {
      sql:
        match && where.length === 1
          ? `SELECT count(*) AS n FROM search_fts WHERE search_fts MATCH ?`
          : `SELECT count(*) AS n FROM ${from} ${whereSql}`,
      params,
    },
  };
}

async function runPlan(
  sql: SqlRunner,
  plan: TextPlan | null,
  filters: Filters,
  sort: SearchSort,
  limit: number,
  offset: number,
): Promise<PlanResult> {
  const { page, count } = planStatements(plan, filters, sort, limit, offset);
  const rows = await sql.all<PageRow>(page.sql, page.params);
  // A first page that is not full holds every match; no need to count them.
  if (offset === 0 && rows.length < limit) return { total: rows.length, rows };
  const [{ n }] = await sql.all<{ n: number }>(count.sql, count.params);
  return { total: Number(n), rows };
}

/**
 * The SQL a search runs first (before any fallback), for measuring it on its own:
 * the benchmark's bare baseline runs exactly these statements.
 */
export function searchStatements(query: SearchQuery): { page: Statement; count: Statement } {
  const terms = query.q ? parseQuery(query.q) : [];
  const sort: SearchSort = query.sort ?? (terms.length ? 'relevance' : 'newest');
  return planStatements(
    terms.length ? mergedPlan(terms) : null,
    filtersOf(query),
    sort,
    query.limit ?? DEFAULT_SEARCH_LIMIT,
    query.offset ?? 0,
  );
}

interface VocabularyRow {
  word: string;
  docs: number;
}

/** The indexed word closest to `word` within its typo budget, or null when it is fine as typed or nothing is close. */
async function closestWord(sql: SqlRunner, word: string): Promise<string | null> {
  const rows =
    word.length >= 5
      ? await sql.all<VocabularyRow>(
          `SELECT w.word, w.docs FROM search_words_fts
           JOIN search_words w ON w.id = search_words_fts.rowid
           WHERE search_words_fts MATCH ? ORDER BY search_words_fts.rank LIMIT 60`,
          [trigrams(word).map(ftsString).join(' OR ')],
        )
      : await sql.all<VocabularyRow>(
          `SELECT word, docs FROM search_words WHERE len BETWEEN ? AND ? LIMIT 20000`,
          [word.length - 1, word.length + 1],
        );
  if (rows.some((r) => r.word.includes(word))) return null;
  const budget = typoBudget(word.length);
  let best: { word: string; d: number; docs: number } | null = null;
  for (const r of rows) {
    const d = editDistance(word, r.word, budget);
    if (d > budget) continue;
    if (!best || d < best.d || (d === best.d && r.docs > best.docs))
      best = { word: r.word, d, docs: r.docs };
  }
  return best?.word ?? null;
}

const MAX_CORRECTIONS = 4;

async function correctSpelling(sql: SqlRunner, terms: QueryTerm[]) {
  const out: QueryTerm[] = [];
  const words: Array<{ from: string; to: string }> = [];
  let lookups = 0;
  for (const t of terms) {
    if (t.phrase || t.text.length < 3 || lookups >= MAX_CORRECTIONS || !/^\p{L}+$/u.test(t.text)) {
      out.push(t);
      continue;
    }
    lookups++;
    const fix = await closestWord(sql, t.text);
    if (fix) {
      out.push({ text: fix, phrase: false });
      words.push({ from: t.text, to: fix });
    } else out.push(t);
  }
  return { terms: out, words };
}

function needlesOf(plan: TextPlan | null): string[] {
  if (!plan) return [];
  return [...plan.indexed.map((t) => t.text), ...plan.short];
}

function itemOf(row: PageRow, needles: string[]): SearchItem {
  const card = JSON.parse(row.card) as SearchCard;
  const snippet = makeSnippet(
    [row.pins_text, row.body_text, row.tags_text, row.component],
    needles,
    row.summary || row.body_text,
  );
  return {
    id: row.id,
    slug: row.slug,
    kind: row.kind,
    title: row.title,
    snippet: markHtml(snippet.text, snippet.ranges),
    titleRanges: findRanges(row.title, needles),
    ...card,
  };
}

interface AnswerEntry {
  at: number;
  /** Shared by every request that asks while it is being read. */
  value: Promise<SearchAnswer>;
  /** The answer serialised, made on first use. */
  prepared?: Promise<Prepared>;
}

function cachedAnswer(ctx: AppContext, query: SearchQuery): AnswerEntry {
  const cache = cacheOf(ctx.sequelize);
  const key = JSON.stringify(query);
  const hit = cache.answers.get(key);
  if (hit && hit.at === cache.generation) return hit;
  const at = cache.generation;
  const entry: AnswerEntry = { at, value: runSearch(ctx, query) };
  cache.answers.delete(key);
  cache.answers.set(key, entry);
  if (cache.answers.size > MAX_ANSWERS)
    cache.answers.delete(cache.answers.keys().next().value as string);
  // Not kept when it failed, or when the index changed while it was read.
  entry.value.then(
    () => {
      if (at !== cache.generation && cache.answers.get(key) === entry) cache.answers.delete(key);
    },
    () => {
      if (cache.answers.get(key) === entry) cache.answers.delete(key);
    },
  );
  return entry;
}

/**
 * Searches published documents. `q` is text, never syntax; filters narrow, `sort`
 * orders (relevance needs words; without them the newest come first). Answers are
 * kept until the index changes.
 */
export async function search(ctx: AppContext, query: SearchQuery): Promise<SearchAnswer> {
  if (!ctx.config.answerCache) return runSearch(ctx, query);
  return cachedAnswer(ctx, query).value;
}

/** {@link search}, serialised: a repeated lookup costs neither SQL nor JSON.stringify. */
export async function searchPrepared(ctx: AppContext, query: SearchQuery): Promise<Prepared> {
  if (!ctx.config.answerCache) return prepare(await runSearch(ctx, query));
  const entry = cachedAnswer(ctx, query);
  return (entry.prepared ??= entry.value.then(prepare));
}

/** A number that changes whenever a committed change reaches the index (publish, take-down, rebuild). */
export function indexGeneration(sequelize: Sequelize): number {
  return cacheOf(sequelize).generation;
}

async function runSearch(ctx: AppContext, query: SearchQuery): Promise<SearchAnswer> {
  const sql = sequelizeRunner(ctx.sequelize);
  const limit = query.limit ?? DEFAULT_SEARCH_LIMIT;
  const offset = query.offset ?? 0;
  const terms = query.q ? parseQuery(query.q) : [];
  const sort: SearchSort = query.sort ?? (terms.length ? 'relevance' : 'newest');
  const filters = filtersOf(query);

  let plan: TextPlan | null = terms.length ? mergedPlan(terms) : null;
  let result = await runPlan(sql, plan, filters, sort, limit, offset);
  let corrected: SearchAnswer['corrected'] = null;
  if (plan && result.total === 0) {
    const separate = separatePlan(terms);
    if (!samePlan(separate, plan)) {
      const r = await runPlan(sql, separate, filters, sort, limit, offset);
      if (r.total) [plan, result] = [separate, r];
    }
  }
  if (plan && result.total === 0) {
    const fix = await correctSpelling(sql, terms);
    if (fix.words.length) {
      const fixed = separatePlan(fix.terms);
      const r = await runPlan(sql, fixed, filters, sort, limit, offset);
      if (r.total) {
        [plan, result] = [fixed, r];
        corrected = { q: fix.terms.map((t) => t.text).join(' '), words: fix.words };
      }
    }
  }
  const needles = needlesOf(plan);
  return {
    total: result.total,
    items: result.rows.map((r) => itemOf(r, needles)),
    limit,
    offset,
    sort,
    corrected,
  };
}

// ── Suggestions and browsing ───────────────────────────────────────────────

async function readFacets(sequelize: Sequelize): Promise<Facets> {
  const sql = sequelizeRunner(sequelize);
  const kinds = await sql.all<{ kind: DocumentKind; n: number }>(
    `SELECT kind, count(*) AS n FROM search_docs GROUP BY kind ORDER BY kind`,
  );
  const components = await sql.all<{ k: string; name: string; n: number }>(
    `SELECT d.component_key AS k, min(t.component) AS name, count(*) AS n
     FROM search_docs d JOIN search_texts t ON t.document_id = d.document_id
     WHERE d.component_key <> '' GROUP BY d.component_key ORDER BY n DESC, k`,
  );
  const tags = await sql.all<{ k: string; name: string; n: number }>(
    `SELECT value AS k, min(label) AS name, count(*) AS n FROM search_values
     WHERE facet = 'tag' GROUP BY value ORDER BY n DESC, k`,
  );
  const cavities = await sql.all<{ c: number; n: number }>(
    `SELECT cavity_count AS c, count(*) AS n FROM search_docs
     WHERE kind = 'connector' AND cavity_count IS NOT NULL GROUP BY cavity_count ORDER BY c`,
  );
  return {
    total: kinds.reduce((s, k) => s + Number(k.n), 0),
    kinds: kinds.map((k) => ({ kind: k.kind, count: Number(k.n) })),
    components: components.map((c) => ({ key: c.k, name: c.name, count: Number(c.n) })),
    tags: tags.map((t) => ({ key: t.k, name: t.name, count: Number(t.n) })),
    cavities: cavities.map((c) => ({ cavities: Number(c.c), count: Number(c.n) })),
  };
}

/** The facets, read once per change of the index. */
function facetsOf(sequelize: Sequelize): Promise<Facets> {
  const cache = cacheOf(sequelize);
  if (!cache.facets || cache.facets.at !== cache.generation) {
    const value = readFacets(sequelize);
    const entry = { at: cache.generation, value };
    cache.facets = entry;
    // A failed read is not kept: the next request tries again.
    value.catch(() => {
      if (cache.facets === entry) cache.facets = undefined;
    });
  }
  return cache.facets.value;
}

/** What browsing offers: counts per kind, components, cavity counts and tags. */
export async function browse(ctx: AppContext): Promise<BrowseAnswer> {
  const f = await facetsOf(ctx.sequelize);
  return {
    total: f.total,
    kinds: f.kinds,
    components: f.components.slice(0, 300).map(({ name, count }) => ({ name, count })),
    cavities: f.cavities,
    tags: f.tags.slice(0, 150).map(({ name, count }) => ({ name, count })),
  };
}

function labelScore(k: string, q: string): number {
  if (k.startsWith(q)) return 0;
  if (k.includes(` ${q}`)) return 1;
  return k.includes(q) ? 2 : -1;
}

function bestLabels(list: Facets['components'], q: string, n: number) {
  const found: Array<{ s: number; l: Facets['components'][number] }> = [];
  for (const l of list) {
    const s = labelScore(l.key, q);
    if (s >= 0) found.push({ s, l });
  }
  return found
    .sort((a, b) => a.s - b.s || b.l.count - a.l.count)
    .slice(0, n)
    .map((x) => x.l);
}

const SUGGEST_DOCUMENTS = 5;
const SUGGEST_LABELS = 3;

/** As-you-type suggestions: published titles, then components and tags, for what has been typed so far. */
export async function suggest(
  ctx: AppContext,
  q: string | undefined,
): Promise<{ items: Suggestion[] }> {
  const typed = key(q ?? '');
  if (!typed) return { items: [] };
  const sql = sequelizeRunner(ctx.sequelize);
  const plan = mergedPlan(parseQuery(q ?? ''));
  const where: string[] = [];
  const params: unknown[] = [];
  let from = 'search_docs d JOIN search_texts t ON t.document_id = d.document_id';
  const match = matchExpression(plan.indexed, ['title', 'component', 'tags']);
  if (match) {
    from = `${FTS_DRIVEN} JOIN search_texts t ON t.document_id = d.document_id`;
    where.push('search_fts MATCH ?');
    params.push(match);
  }
  for (const s of plan.short) {
    where.push(LIKE);
    params.push(likeContains(s));
  }
  const ranked = relevance(needlesOf(plan));
  const docs = where.length
    ? await sql.all<{
        slug: string;
        kind: DocumentKind;
        title: string;
        cavity_count: number | null;
      }>(
        `SELECT t.slug, d.kind, t.title, d.cavity_count FROM ${from}
         WHERE ${where.join(' AND ')}
         ORDER BY ${ranked.keys.map(([e, dir]) => `${e} ${dir}`).join(', ')}
         LIMIT ${SUGGEST_DOCUMENTS}`,
        // WHERE comes before ORDER BY in the statement, so its values come first.
        [...params, ...ranked.params],
      )
    : [];
  const facets = await facetsOf(ctx.sequelize);
  const items: Suggestion[] = [
    ...docs.map((d) => ({
      type: 'document' as const,
      text: d.title,
      slug: d.slug,
      kind: d.kind,
      cavityCount: d.cavity_count,
    })),
    ...bestLabels(facets.components, typed, SUGGEST_LABELS).map((c) => ({
      type: 'component' as const,
      text: c.name,
      count: c.count,
    })),
    ...bestLabels(facets.tags, typed, SUGGEST_LABELS).map((t) => ({
      type: 'tag' as const,
      text: t.name,
      count: t.count,
    })),
  ];
  return { items };
}
