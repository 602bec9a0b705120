/**
 * What changed between two revisions of a document, for the review page: table rows
 * diffed row by row (pin rows keyed by cavity), prose diffed by line, and every other
 * field compared as a value.
 */
import { diffLines } from 'diff';
import type { DocumentKind } from '../schemas/document';

export interface DiffLine {
  type: 'same' | 'added' | 'removed';
  text: string;
  /** 1-based line number in the earlier text (same and removed lines). */
  oldLine?: number;
  /** 1-based line number in the later text (same and added lines). */
  newLine?: number;
}

export interface TextDiff {
  changed: boolean;
  added: number;
  removed: number;
  lines: DiffLine[];
}

export type RowStatus = 'same' | 'added' | 'removed' | 'changed';

export interface RowDiff<R = Record<string, unknown>> {
  key: string;
  status: RowStatus;
  before: R | null;
  after: R | null;
  /** The cells whose value differs (only for `changed`). */
  changed: string[];
}

export interface FieldChange {
  field: string;
  before: unknown;
  after: unknown;
}

export interface RevisionDiff {
  /** False when there is no earlier revision to compare with: everything is new. */
  hasPrevious: boolean;
  changed: boolean;
  title: { before: string | null; after: string; changed: boolean };
  /** Plain values that differ (housing, view, tags …). */
  fields: FieldChange[];
  /** Row tables by field name (`pins`, `circuits`). */
  rows: Record<string, RowDiff[]>;
  /** Prose by field name (`notes`, `body`). */
  text: Record<string, TextDiff>;
}

const MAX_DIFF_CHARS = 400_000;

/** Line diff of two texts with the `diff` package; line endings are normalised first. */
export function diffText(before: string, after: string): TextDiff {
  // A last line without its newline would otherwise count as changed.
  const norm = (s: string) => {
    const t = (s ?? '').replace(/\r\n?/g, '\n');
    return t && !t.endsWith('\n') ? `${t}\n` : t;
  };
  const a = norm(before);
  const b = norm(after);
  const lines: DiffLine[] = [];
  let added = 0;
  let removed = 0;
  if (a === b) {
    if (a)
      a.slice(0, -1)
        .split('\n')
        .forEach((text, i) => lines.push({ type: 'same', text, oldLine: i + 1, newLine: i + 1 }));
    return { changed: false, added, removed, lines };
  }
  let oldLine = 1;
  let newLine = 1;
  // Very long texts would make the diff slow; compare them as a whole instead.
  const parts =
    a.length + b.length > MAX_DIFF_CHARS
      ? [
          { value: a, removed: true, added: false },
          { value: b, added: true, removed: false },
        ]
      : diffLines(a, b);
  for (const part of parts) {
    if (!part.value) continue;
    const text = part.value.endsWith('\n') ? part.value.slice(0, -1) : part.value;
    for (const line of text.split('\n')) {
      if (part.added) {
        lines.push({ type: 'added', text: line, newLine: newLine++ });
        added++;
      } else if (part.removed) {
        lines.push({ type: 'removed', text: line, oldLine: oldLine++ });
        removed++;
      } else {
        lines.push({ type: 'same', text: line, oldLine: oldLine++, newLine: newLine++ });
      }
    }
  }
  return { changed: added + removed > 0, added, removed, lines };
}

function sameValue(a: unknown, b: unknown): boolean {
  const norm = (v: unknown) => (v === undefined || v === null || v === '' ? null : v);
  return JSON.stringify(norm(a)) === JSON.stringify(norm(b));
}

/**
 * Row-by-row diff of two tables. `keyOf` names a row (a pin row by its cavity); rows
 * with the same key are compared cell by cell. A key that repeats within one table gets
 * a "#2", "#3" suffix so every row still pairs with at most one other. The result
 * follows the later table's order, each removed row after the row it used to follow.
 */
export function diffRows<R extends object>(
  before: readonly R[],
  after: readonly R[],
  keyOf: (row: R, index: number) => string,
): RowDiff<R>[] {
  const keyed = (rows: readonly R[]) => {
    const seen = new Map<string, number>();
    return rows.map((row, i) => {
      const base = keyOf(row, i);
      const n = (seen.get(base) ?? 0) + 1;
      seen.set(base, n);
      return { key: n === 1 ? base : `${base}#${n}`, row };
    });
  };
  const a = keyed(before);
  const b = keyed(after);
  const aByKey = new Map(a.map((x) => [x.key, x.row]));
  const bKeys = new Set(b.map((x) => x.key));

  const removedAfter = new Map<string | null, RowDiff<R>[]>();
  let previousKept: string | null = null;
  for (const x of a) {
    if (bKeys.has(x.key)) {
      previousKept = x.key;
      continue;
    }
    const list = removedAfter.get(previousKept) ?? [];
    list.push({ key: x.key, status: 'removed', before: x.row, after: null, changed: [] });
    removedAfter.set(previousKept, list);
  }

  const out: RowDiff<R>[] = [...(removedAfter.get(null) ?? [])];
  for (const x of b) {
    const old = aByKey.get(x.key);
    if (!old) {
      out.push({ key: x.key, status: 'added', before: null, after: x.row, changed: [] });
    } else {
      const fields = new Set([...Object.keys(old), ...Object.keys(x.row)]);
      const changed = [...fields].filter(
        (f) =>
          !sameValue((old as Record<string, unknown>)[f], (x.row as Record<string, unknown>)[f]),
      );
      out.push({
        key: x.key,
        status: changed.length ? 'changed' : 'same',
        before: old,
        after: x.row,
        changed,
      });
    }
    out.push(...(removedAfter.get(x.key) ?? []));
  }
  return out;
}

type Content = Record<string, unknown>;

interface KindDiffPlan {
  rows: Record<string, (row: Record<string, unknown>, index: number) => string>;
  text: string[];
}

const cavityKey = (row: Record<string, unknown>, index: number) => {
  const c = typeof row.cavity === 'string' ? row.cavity.trim().toLowerCase() : '';
  return c ? `cavity:${c}` : `row:${index + 1}`;
};
const circuitKey = (row: Record<string, unknown>, index: number) =>
  row.id !== undefined && row.id !== null && row.id !== ''
    ? `id:${String(row.id)}`
    : `circuit:${index + 1}`;

const PLANS: Record<DocumentKind, KindDiffPlan> = {
  connector: { rows: { pins: cavityKey }, text: ['summary', 'notes'] },
  adapter: { rows: { circuits: circuitKey }, text: ['notes'] },
  writeup: { rows: {}, text: ['body', 'summary'] },
};

/**
 * The diff of a revision against an earlier one (normally the last published one);
 * `before` null compares with an empty document, so everything shows as added.
 */
export function diffRevisions(
  kind: DocumentKind,
  before: { title: string; content: Content } | null,
  after: { title: string; content: Content },
): RevisionDiff {
  const plan = PLANS[kind];
  const a: Content = before?.content ?? {};
  const b: Content = after.content ?? {};
  const rows: Record<string, RowDiff[]> = {};
  const text: Record<string, TextDiff> = {};
  const fields: FieldChange[] = [];

  for (const [field, keyOf] of Object.entries(plan.rows)) {
    const asRows = (v: unknown) =>
      Array.isArray(v) ? (v.filter((r) => r && typeof r === 'object') as Content[]) : [];
    rows[field] = diffRows(asRows(a[field]), asRows(b[field]), keyOf);
  }
  for (const field of plan.text) {
    const asText = (v: unknown) => (typeof v === 'string' ? v : '');
    text[field] = diffText(asText(a[field]), asText(b[field]));
  }
  const planned = new Set([...Object.keys(plan.rows), ...plan.text]);
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => !planned.has(k));
  for (const field of keys) {
    if (!sameValue(a[field], b[field]))
      fields.push({ field, before: a[field] ?? null, after: b[field] ?? null });
  }

  const title = {
    before: before?.title ?? null,
    after: after.title,
    changed: (before?.title ?? '') !== after.title,
  };
  const changed =
    title.changed ||
    fields.length > 0 ||
    Object.values(rows).some((r) => r.some((x) => x.status !== 'same')) ||
    Object.values(text).some((t) => t.changed);
  return { hasPrevious: !!before, changed, title, fields, rows, text };
}
