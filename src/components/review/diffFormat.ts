/** Words and values for the revision diff, kept out of the component for testing. */
import type { RowDiff, RowStatus } from '@shared/diff/revisions';
import { writeupFieldText } from '@/components/writeup/diffText';
import { ADAPTER_FIELD_LABELS, adapterFieldText } from '@/components/adapter/diffText';

export const FIELD_LABELS: Record<string, string> = {
  cavities: 'Cavity labels',
  cavityCount: 'Cavity count',
  labels: 'Labelling',
  layout: 'Layout',
  housing: 'Housing',
  view: 'Viewed from',
  sealed: 'Sealed',
  component: 'Component',
  tags: 'Applicability',
  terminalSize: 'Terminal size',
  wireSize: 'Wire-size range',
  summary: 'Summary',
  notes: 'Notes',
  body: 'Text',
  pins: 'Pin table',
  circuits: 'Circuits',
  images: 'Images',
  wireRun: 'Wire run',
  parts: 'Parts list',
  specs: 'Values',
  ...ADAPTER_FIELD_LABELS,
};

export function fieldLabel(field: string): string {
  return (
    FIELD_LABELS[field] ?? field.replace(/([A-Z])/g, ' $1').replace(/^./, (c) => c.toUpperCase())
  );
}

const WORDS: Record<string, string> = {
  'mating-face': 'mating face',
  'wire-side': 'wire side',
  numeric: '1, 2, 3 …',
  alpha: 'A, B, C …',
  custom: 'custom',
  pin: 'pin housing',
  socket: 'socket housing',
};

/** A stored value as a reader would write it. */
export function formatValue(field: string, value: unknown): string {
  if (value === null || value === undefined || value === '') return '(none)';
  const words = writeupFieldText(field, value) ?? adapterFieldText(field, value);
  if (words !== null) return words;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string') return WORDS[value] ?? value;
  if (typeof value === 'number') return String(value);
  if (Array.isArray(value))
    return value.length ? value.map((v) => formatValue(field, v)).join(', ') : '(none)';
  if (typeof value === 'object') {
    const v = value as Record<string, unknown>;
    if (field === 'layout') {
      const grid = `${v.rows ?? '?'} × ${v.cols ?? '?'}`;
      const positions = Array.isArray(v.positions)
        ? `, positions ${v.positions
            .map((p) => {
              const q = p as { label?: unknown; row?: number; col?: number };
              return `${String(q.label)}@${(q.row ?? 0) + 1}.${(q.col ?? 0) + 1}`;
            })
            .join(' ')}`
        : '';
      return grid + positions;
    }
    if (field === 'wireSize') return `${v.min || '…'} to ${v.max || '…'}`;
    return JSON.stringify(value);
  }
  return String(value);
}

export const ROW_MARKS: Record<RowStatus, { sign: string; word: string }> = {
  added: { sign: '+', word: 'added' },
  removed: { sign: '−', word: 'removed' },
  changed: { sign: '~', word: 'changed' },
  same: { sign: '', word: 'unchanged' },
};

/** Counts of a row diff for a one-line summary: "2 added, 1 changed, 0 removed". */
export function rowSummary(rows: readonly RowDiff[]): Record<RowStatus, number> {
  const out: Record<RowStatus, number> = { added: 0, removed: 0, changed: 0, same: 0 };
  for (const r of rows) out[r.status]++;
  return out;
}

/** The text of one cell of a row, '' when blank. */
export function cellText(row: Record<string, unknown> | null, col: string): string {
  const v = row?.[col];
  return v === null || v === undefined ? '' : String(v);
}

/** True for values that say nothing: blank text, empty lists, objects of blanks. */
export function isBlankValue(value: unknown): boolean {
  if (value === null || value === undefined) return true;
  if (typeof value === 'string') return value.trim() === '';
  if (Array.isArray(value)) return value.every(isBlankValue);
  if (typeof value === 'object') return Object.values(value as object).every(isBlankValue);
  return false;
}
