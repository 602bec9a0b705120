/**
 * Reading and writing the search tables through one small interface, so the publish
 * transaction (Sequelize), the rebuild and the bulk seed (a direct sqlite3
 * connection) all write the index with the same statements.
 *
 * Tables (migration 0004):
 * - search_fts: contentless FTS5, trigram tokenizer; rowid = document id
 * - search_docs: one narrow row per published document, what filters, sorts and ranking read
 * - search_texts: the same documents' texts and prepared result cards, read for a page only
 * - search_values: (facet, value, document id) for colours, roles and tags
 * - search_words / search_words_fts: the typo vocabulary, with how many documents use each word
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { IndexRow } from './rows';

/** Runs SQL with `?` placeholders. */
export interface SqlRunner {
  all<T = Record<string, unknown>>(sql: string, params?: unknown[]): Promise<T[]>;
  run(sql: string, params?: unknown[]): Promise<void>;
}

/** A runner on a Sequelize connection, inside `transaction` when one is given. */
export function sequelizeRunner(sequelize: Sequelize, transaction?: Transaction | null): SqlRunner {
  return {
    all: <T>(sql: string, params: unknown[] = []) =>
      sequelize.query(sql, {
        replacements: params,
        type: QueryTypes.SELECT,
        raw: true,
        transaction: transaction ?? undefined,
      }) as Promise<T[]>,
    run: async (sql: string, params: unknown[] = []) => {
      await sequelize.query(sql, {
        replacements: params,
        type: QueryTypes.RAW,
        raw: true,
        transaction: transaction ?? undefined,
      });
    },
  };
}

/** Rows per multi-row INSERT: well under SQLite's limit of bound values. */
const CHUNK = 250;

function chunks<T>(items: T[], size = CHUNK): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += size) out.push(items.slice(i, i + size));
  return out;
}

const marks = (n: number) => Array(n).fill('?').join(', ');
const tuples = (rows: number, cols: number) =>
  Array(rows)
    .fill(`(${marks(cols)})`)
    .join(', ');

const DOC_COLUMNS = [
  'document_id',
  'kind',
  'cavity_count',
  'cavity_count_b',
  'sealed',
  'housing',
  'component_key',
  'title_key',
  'tags_key',
  'title_len',
  'published_at',
] as const;

const TEXT_COLUMNS = [
  'document_id',
  'revision_id',
  'slug',
  'title',
  'summary',
  'component',
  'tags_text',
  'pins_text',
  'body_text',
  'keywords',
  'words',
  'card',
] as const;

function docValues(r: IndexRow): unknown[] {
  return [
    r.documentId,
    r.kind,
    r.cavityCount,
    r.cavityCountB,
    r.sealed,
    r.housing,
    r.componentKey,
    r.titleKey,
    r.tagsKey,
    r.title.length,
    r.publishedAt,
  ];
}

function textValues(r: IndexRow): unknown[] {
  return [
    r.documentId,
    r.revisionId,
    r.slug,
    r.title,
    r.summary,
    r.component,
    r.tagsText,
    r.pinsText,
    r.bodyText,
    r.keywords,
    r.words.join(' '),
    r.card,
  ];
}

/** Takes documents out of the index; returns how many documents used each of their words. */
async function removeRows(sql: SqlRunner, ids: number[], deltas: Map<string, number>) {
  for (const part of chunks(ids, 500)) {
    const old = await sql.all<{ words: string }>(
      `SELECT words FROM search_texts WHERE document_id IN (${marks(part.length)})`,
      part,
    );
    for (const row of old)
      for (const w of row.words.split(' ')) if (w) deltas.set(w, (deltas.get(w) ?? 0) - 1);
    const list = marks(part.length);
    await sql.run(`DELETE FROM search_fts WHERE rowid IN (${list})`, part);
    await sql.run(`DELETE FROM search_values WHERE document_id IN (${list})`, part);
    await sql.run(`DELETE FROM search_texts WHERE document_id IN (${list})`, part);
    await sql.run(`DELETE FROM search_docs WHERE document_id IN (${list})`, part);
  }
}

/** Applies changes in how many documents use each word, keeping the word index in step. */
async function applyWordDeltas(sql: SqlRunner, deltas: Map<string, number>) {
  const changed = [...deltas].filter(([, d]) => d !== 0);
  for (const part of chunks(changed, 400)) {
    const words = part.map(([w]) => w);
    const existing = await sql.all<{ id: number; word: string; docs: number }>(
      `SELECT id, word, docs FROM search_words WHERE word IN (${marks(words.length)})`,
      words,
    );
    const known = new Map(existing.map((e) => [e.word, e]));
    const gone: number[] = [];
    const update: Array<[string, number]> = [];
    const fresh: Array<[string, number]> = [];
    for (const [word, delta] of part) {
      const e = known.get(word);
      if (e) {
        const docs = e.docs + delta;
        if (docs <= 0) gone.push(e.id);
        else update.push([word, docs]);
      } else if (delta > 0) fresh.push([word, delta]);
    }
    if (gone.length) {
      await sql.run(`DELETE FROM search_words_fts WHERE rowid IN (${marks(gone.length)})`, gone);
      await sql.run(`DELETE FROM search_words WHERE id IN (${marks(gone.length)})`, gone);
    }
    if (update.length)
      await sql.run(
        `INSERT INTO search_words (word, len, docs) VALUES ${tuples(update.length, 3)}
         ON CONFLICT(word) DO UPDATE SET docs = excluded.docs`,
        update.flatMap(([w, d]) => [w, w.length, d]),
      );
    if (fresh.length) {
      await sql.run(
        `INSERT INTO search_words (word, len, docs) VALUES ${tuples(fresh.length, 3)}`,
        fresh.flatMap(([w, d]) => [w, w.length, d]),
      );
      const names = fresh.map(([w]) => w);
      await sql.run(
        `INSERT INTO search_words_fts (rowid, word)
         SELECT id, word FROM search_words WHERE word IN (${marks(names.length)})`,
        names,
      );
    }
  }
}

/**
 * Writes rows into the index. With `replace`, each document's previous rows are
 * removed first (a newly published revision replaces the one it supersedes).
 */
export async function writeIndexRows(
  sql: SqlRunner,
  rows: IndexRow[],
  opts: { replace: boolean },
): Promise<void> {
  const deltas = new Map<string, number>();
  if (opts.replace)
    await removeRows(
      sql,
      rows.map((r) => r.documentId),
      deltas,
    );
  for (const part of chunks(rows)) {
    await sql.run(
      `INSERT INTO search_docs (${DOC_COLUMNS.join(', ')}) VALUES ${tuples(part.length, DOC_COLUMNS.length)}`,
      part.flatMap(docValues),
    );
    await sql.run(
      `INSERT INTO search_texts (${TEXT_COLUMNS.join(', ')}) VALUES ${tuples(part.length, TEXT_COLUMNS.length)}`,
      part.flatMap(textValues),
    );
    await sql.run(
      `INSERT INTO search_fts (rowid, title, component, tags, pins, body) VALUES ${tuples(part.length, 6)}`,
      part.flatMap((r) => [r.documentId, ...r.fts]),
    );
    const values = part.flatMap((r) => r.values.map((v) => [...v, r.documentId]));
    for (const vs of chunks(values, 1000))
      await sql.run(
        `INSERT INTO search_values (facet, value, label, document_id) VALUES ${tuples(vs.length, 4)}`,
        vs.flat(),
      );
    for (const r of part) for (const w of r.words) deltas.set(w, (deltas.get(w) ?? 0) + 1);
  }
  await applyWordDeltas(sql, deltas);
}

/** Takes documents out of the index (unpublished or removed). */
export async function removeIndexRows(sql: SqlRunner, ids: number[]): Promise<void> {
  const deltas = new Map<string, number>();
  await removeRows(sql, ids, deltas);
  await applyWordDeltas(sql, deltas);
}

/** Empties every search table. */
export async function clearIndex(sql: SqlRunner): Promise<void> {
  await sql.run(`INSERT INTO search_fts (search_fts) VALUES ('delete-all')`);
  await sql.run(`DELETE FROM search_values`);
  await sql.run(`DELETE FROM search_texts`);
  await sql.run(`DELETE FROM search_docs`);
  await sql.run(`INSERT INTO search_words_fts (search_words_fts) VALUES ('delete-all')`);
  await sql.run(`DELETE FROM search_words`);
}
