/**
 * Text handling for search: how documents and queries are normalised, how a query
 * becomes a safe FTS5 expression, and how snippets are cut and marked.
 *
 * The index is an FTS5 trigram index, so every search term is a substring match
 * (which also gives prefix matching). Separators (hyphen, slash, brackets, dots …)
 * are turned into spaces on both sides, character for character, so "3-cavity",
 * "3 cavity" and "GN/YE" / "gn ye" find each other and a position in normalised text
 * is the same position in the original.
 */
import { escapeHtml } from '../http/escape';

const SEPARATOR = /[-_/\\,;:()[\]{}"'`.|\u2010-\u2015]/g;

/** Separators to spaces; the length never changes. */
export function normalizeForIndex(s: string): string {
  return s.replace(SEPARATOR, ' ');
}

const foldCache = new Map<string, string>();

function foldChar(c: string): string {
  let f = foldCache.get(c);
  if (f !== undefined) return f;
  const plain = c
    .normalize('NFD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase();
  const lower = c.toLowerCase();
  f = plain.length === 1 ? plain : lower.length === 1 ? lower : c;
  if (foldCache.size < 4096) foldCache.set(c, f);
  return f;
}

/**
 * Lower case, accents dropped, separators to spaces, one UTF-16 unit in for one out:
 * what the trigram index compares, in a form whose offsets match the original text.
 */
export function fold(s: string): string {
  const n = normalizeForIndex(s);
  const lower = n.toLowerCase();
  // Plain ASCII is the common case; otherwise only accented letters need more work,
  // unless lower-casing changed the length (rare: then character by character).
  if (!/[^\t\n\r -~]/.test(n)) return lower;
  if (lower.length === n.length) return lower.replace(ACCENTED, foldChar);
  let out = '';
  for (let i = 0; i < n.length; i++) out += foldChar(n[i]);
  return out;
}

const ACCENTED = /[\u00c0-\u024f\u1e00-\u1eff]/g;

/** One unit of a query: a phrase (several words in order) or a single word. */
export interface QueryTerm {
  text: string;
  /** Typed in quotes, or a single token with separators inside ("GN/YE", "3-cavity"). */
  phrase: boolean;
}

/** Terms shorter than this cannot use the trigram index. */
export const MIN_INDEXED = 3;

const MAX_TERMS = 12;

/**
 * Splits what a reader typed into terms. Quoted text is a phrase; everything else is
 * split on spaces. Nothing the reader types is ever an FTS5 operator: operators,
 * quotes, stars, carets, colons and brackets are either separators or plain
 * characters inside a quoted FTS5 string.
 */
export function parseQuery(raw: string): QueryTerm[] {
  // Control characters have no business in a search and FTS5 strings cannot hold NUL.
  // eslint-disable-next-line no-control-regex
  const q = raw.replace(/[\x00-\x1f\x7f]/g, ' ');
  const terms: QueryTerm[] = [];
  const re = /"([^"]*)"|(\S+)/g;
  for (let m = re.exec(q); m && terms.length < MAX_TERMS; m = re.exec(q)) {
    const quoted = m[1] !== undefined;
    const text = fold(quoted ? m[1] : m[2])
      .replace(/\s+/g, ' ')
      .trim();
    if (!text) continue;
    terms.push({ text, phrase: quoted || text.includes(' ') });
  }
  return terms;
}

/** How a query is searched: FTS5 phrases, plus short words matched with LIKE. */
export interface TextPlan {
  /** Terms for the trigram index (each at least three characters). */
  indexed: QueryTerm[];
  /** Words too short for the index. */
  short: string[];
}

/**
 * The first plan: a run of short words joins the word after it (or, at the end, the
 * word before) into a phrase, so "5 V reference" and "3 cavity" are searched as the
 * phrases they are. A short word with no neighbour is matched with LIKE.
 */
export function mergedPlan(terms: QueryTerm[]): TextPlan {
  const out: QueryTerm[] = [];
  let pending: string[] = [];
  for (const t of terms) {
    if (!t.phrase && t.text.length < MIN_INDEXED) {
      pending.push(t.text);
      continue;
    }
    if (pending.length) {
      out.push({ text: [...pending, t.text].join(' '), phrase: true });
      pending = [];
    } else out.push(t);
  }
  if (pending.length) {
    const last = out.pop();
    if (last) out.push({ text: [last.text, ...pending].join(' '), phrase: true });
    else out.push({ text: pending.join(' '), phrase: pending.length > 1 });
  }
  return splitPlan(out);
}

/** The plain plan: every short word on its own, matched with LIKE. */
export function separatePlan(terms: QueryTerm[]): TextPlan {
  return splitPlan(terms);
}

function splitPlan(terms: QueryTerm[]): TextPlan {
  const indexed: QueryTerm[] = [];
  const short: string[] = [];
  for (const t of terms) {
    if (t.text.length >= MIN_INDEXED) indexed.push(t);
    else short.push(t.text);
  }
  return { indexed, short };
}

/** True when two plans would run the same SQL. */
export function samePlan(a: TextPlan, b: TextPlan): boolean {
  const key = (p: TextPlan) => JSON.stringify([p.indexed.map((t) => t.text), p.short]);
  return key(a) === key(b);
}

/** An FTS5 string literal: the text in double quotes, inner quotes doubled. */
export function ftsString(text: string): string {
  return `"${text.replace(/"/g, '""')}"`;
}

/** The MATCH expression of a plan: every term must be present (implicit AND). */
export function matchExpression(terms: QueryTerm[], columns?: string[]): string | null {
  if (!terms.length) return null;
  const filter = columns?.length ? `{${columns.join(' ')}} : ` : '';
  return terms.map((t) => filter + ftsString(t.text)).join(' AND ');
}

/** A LIKE pattern that finds `text` anywhere; `\` escapes. */
export function likeContains(text: string): string {
  return `%${text.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

/** The distinct trigrams of a word, for finding words that share most of them. */
export function trigrams(word: string): string[] {
  const out = new Set<string>();
  for (let i = 0; i + 3 <= word.length; i++) out.add(word.slice(i, i + 3));
  return [...out];
}

/**
 * Edit distance with adjacent transpositions counted as one edit (optimal string
 * alignment), giving up early once it exceeds `max`.
 */
export function editDistance(a: string, b: string, max = Infinity): number {
  if (Math.abs(a.length - b.length) > max) return max + 1;
  const n = b.length;
  let prev2 = new Array<number>(n + 1).fill(0);
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  let cur = new Array<number>(n + 1).fill(0);
  for (let i = 1; i <= a.length; i++) {
    cur[0] = i;
    let rowMin = cur[0];
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let v = Math.min(prev[j] + 1, cur[j - 1] + 1, prev[j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1])
        v = Math.min(v, prev2[j - 2] + 1);
      cur[j] = v;
      if (v < rowMin) rowMin = v;
    }
    if (rowMin > max) return max + 1;
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[n];
}

/** How many edits a word of this length may carry and still count as a typo of another. */
export function typoBudget(length: number): number {
  return length <= 4 ? 1 : length <= 8 ? 2 : 3;
}

/** Words for the typo vocabulary: letters only, three to thirty of them, folded. */
export function vocabularyWords(text: string): string[] {
  return fold(text).match(/\p{L}{3,30}/gu) ?? [];
}

export type Range = [start: number, end: number];

const isWordChar = (c: string | undefined) => !!c && /[\p{L}\p{N}]/u.test(c);

/** Where any of `needles` (folded) occur in `text`, merged, in order. */
export function findRanges(text: string, needles: string[]): Range[] {
  if (!text || !needles.length) return [];
  return rangesIn(fold(text), needles);
}

function rangesIn(hay: string, needles: string[]): Range[] {
  const found: Range[] = [];
  for (const needle of needles) {
    if (!needle) continue;
    // A word too short for the index is only marked where it stands on its own.
    const whole = needle.length < MIN_INDEXED;
    for (let at = hay.indexOf(needle); at !== -1; at = hay.indexOf(needle, at + needle.length)) {
      if (whole && (isWordChar(hay[at - 1]) || isWordChar(hay[at + needle.length]))) continue;
      found.push([at, at + needle.length]);
      if (found.length > 200) break;
    }
  }
  found.sort((x, y) => x[0] - y[0] || y[1] - x[1]);
  const merged: Range[] = [];
  for (const r of found) {
    const last = merged[merged.length - 1];
    if (last && r[0] <= last[1]) last[1] = Math.max(last[1], r[1]);
    else merged.push([r[0], r[1]]);
  }
  return merged;
}

export interface Snippet {
  text: string;
  ranges: Range[];
}

const SNIPPET_LENGTH = 170;
const LEAD = 50;

/**
 * A snippet of the field where most of the needles occur, cut at word boundaries
 * around the first match, with the ranges of the matches inside it. Without a match
 * it is the start of `fallback`.
 */
export function makeSnippet(fields: string[], needles: string[], fallback: string): Snippet {
  let best: { text: string; ranges: Range[]; score: number } | null = null;
  for (const field of fields) {
    if (!field || !needles.length) continue;
    const hay = fold(field);
    const ranges = rangesIn(hay, needles);
    if (!ranges.length) continue;
    const score = needles.filter((n) => n && hay.includes(n)).length;
    if (!best || score > best.score) best = { text: field, ranges, score };
  }
  if (!best) return { text: cut(fallback, 0).text, ranges: [] };
  const part = cut(best.text, Math.max(0, best.ranges[0][0] - LEAD));
  const ranges: Range[] = [];
  const shift = part.offset - part.prefix;
  const end = part.offset + part.length;
  for (const [s, e] of best.ranges) {
    if (e <= part.offset || s >= end) continue;
    ranges.push([Math.max(s, part.offset) - shift, Math.min(e, end) - shift]);
  }
  return { text: part.text, ranges };
}

/**
 * Up to SNIPPET_LENGTH characters of `s` from about `from`, on word boundaries, with
 * an ellipsis where it was cut. `offset` and `length` say which part of `s` it holds;
 * `prefix` is 1 when an ellipsis was put in front.
 */
function cut(s: string, from: number) {
  const clean = s.replace(/\s/g, ' ');
  let start = from;
  if (start > 0) {
    const space = clean.lastIndexOf(' ', start);
    start = space > 0 && start - space < 20 ? space + 1 : start;
  }
  let end = Math.min(clean.length, start + SNIPPET_LENGTH);
  if (end < clean.length) {
    const space = clean.lastIndexOf(' ', end);
    if (space > start + SNIPPET_LENGTH / 2) end = space;
  }
  const prefix = start > 0 ? 1 : 0;
  const text = (prefix ? '…' : '') + clean.slice(start, end) + (end < clean.length ? '…' : '');
  return { text, offset: start, prefix, length: end - start };
}

/** Marked-up text: every character escaped, then our own `<mark>` around each range. */
export function markHtml(text: string, ranges: Range[]): string {
  let out = '';
  let at = 0;
  for (const [s, e] of ranges) {
    if (s < at || e > text.length) continue;
    out += escapeHtml(text.slice(at, s)) + '<mark>' + escapeHtml(text.slice(s, e)) + '</mark>';
    at = e;
  }
  return out + escapeHtml(text.slice(at));
}
