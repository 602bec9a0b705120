import type { QueryInterface } from 'sequelize';
import { rebuildSearchIndex } from '../services/search';
import { sequelizeRunner } from '../search/store';

/**
 * The search index over published documents: a contentless FTS5 trigram table (the
 * text lives in search_texts, and contentless_delete lets a superseded revision leave
 * by rowid), a narrow facet table the filters, sorts and ranking read, facet values,
 * and the typo vocabulary. Then indexes whatever was published before this migration.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  const sql = sequelizeRunner(qi.sequelize);
  const statements = [
    // Narrow: what filters, sorts and ranking read for every match.
    `CREATE TABLE search_docs (
      document_id INTEGER PRIMARY KEY,
      kind TEXT NOT NULL,
      cavity_count INTEGER,
      cavity_count_b INTEGER,
      sealed INTEGER,
      housing TEXT,
      component_key TEXT NOT NULL DEFAULT '',
      title_key TEXT NOT NULL DEFAULT '',
      tags_key TEXT NOT NULL DEFAULT '',
      title_len INTEGER NOT NULL DEFAULT 0,
      published_at INTEGER NOT NULL
    )`,
    `CREATE INDEX search_docs_published ON search_docs (published_at DESC, document_id DESC)`,
    `CREATE INDEX search_docs_kind ON search_docs (kind, published_at DESC)`,
    `CREATE INDEX search_docs_cavities ON search_docs (cavity_count, published_at DESC)`,
    `CREATE INDEX search_docs_cavities_b ON search_docs (cavity_count_b) WHERE cavity_count_b IS NOT NULL`,
    `CREATE INDEX search_docs_component ON search_docs (component_key, published_at DESC)`,
    // Wide: what a page of results shows, read for the page only.
    `CREATE TABLE search_texts (
      document_id INTEGER PRIMARY KEY,
      revision_id INTEGER NOT NULL,
      slug TEXT NOT NULL,
      title TEXT NOT NULL,
      summary TEXT NOT NULL DEFAULT '',
      component TEXT NOT NULL DEFAULT '',
      tags_text TEXT NOT NULL DEFAULT '',
      pins_text TEXT NOT NULL DEFAULT '',
      body_text TEXT NOT NULL DEFAULT '',
      keywords TEXT NOT NULL DEFAULT '',
      words TEXT NOT NULL DEFAULT '',
      card TEXT NOT NULL
    )`,
    `CREATE TABLE search_values (
      facet TEXT NOT NULL,
      value TEXT NOT NULL,
      document_id INTEGER NOT NULL,
      label TEXT NOT NULL,
      PRIMARY KEY (facet, value, document_id)
    ) WITHOUT ROWID`,
    `CREATE INDEX search_values_document ON search_values (document_id)`,
    `CREATE VIRTUAL TABLE search_fts USING fts5(
      title, component, tags, pins, body,
      content='', contentless_delete=1, tokenize='trigram remove_diacritics 1'
    )`,
    `CREATE TABLE search_words (
      id INTEGER PRIMARY KEY,
      word TEXT NOT NULL UNIQUE,
      len INTEGER NOT NULL,
      docs INTEGER NOT NULL
    )`,
    `CREATE INDEX search_words_len ON search_words (len)`,
    `CREATE VIRTUAL TABLE search_words_fts USING fts5(
      word, content='', contentless_delete=1, tokenize='trigram remove_diacritics 1'
    )`,
  ];
  for (const s of statements) await sql.run(s);
  await rebuildSearchIndex(sql);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  const sql = sequelizeRunner(qi.sequelize);
  for (const t of [
    'search_words_fts',
    'search_words',
    'search_fts',
    'search_values',
    'search_texts',
    'search_docs',
  ])
    await sql.run(`DROP TABLE IF EXISTS ${t}`);
}
