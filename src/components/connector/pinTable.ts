/**
 * Pure helpers behind the connector editor's pin table: keyboard movement between
 * cells, spreadsheet paste, CSV import/export and the per-cell messages. Kept apart
 * from the component so they can be tested without a browser.
 */
import Papa from 'papaparse';
import { normalizeCavityLabel } from '@shared/wire/cavities';
import { PIN_ROLES, type ConnectorContent } from '@shared/schemas/connector';
import {
  connectorFindings,
  type ConnectorFindings,
  type SheetFindingCode,
} from '@shared/connector/findings';

/** One row of the pin table as the editor holds it (every cell is text). */
export interface PinRow {
  cavity: string;
  role: string;
  color: string;
  size: string;
  circuit: string;
  note: string;
}

export type PinColumn = keyof PinRow;

/** Column order on screen, in CSV files and in pasted rows. */
export const PIN_COLUMNS: readonly PinColumn[] = [
  'cavity',
  'role',
  'color',
  'size',
  'circuit',
  'note',
];

export const PIN_COLUMN_LABELS: Record<PinColumn, string> = {
  cavity: 'Cavity',
  role: 'Circuit role',
  color: 'Wire colour',
  size: 'Wire size',
  circuit: 'Circuit no.',
  note: 'Note',
};

/** The circuit roles offered in the editor (the shared list); free text is allowed beside them. */
export const CIRCUIT_ROLES: readonly string[] = PIN_ROLES;

export function emptyPin(cavity = ''): PinRow {
  return { cavity, role: '', color: '', size: '', circuit: '', note: '' };
}

/** A pin from stored content, with every field as text. */
export function toPinRow(raw: Partial<Record<PinColumn, unknown>> | null | undefined): PinRow {
  const row = emptyPin();
  for (const col of PIN_COLUMNS) {
    const value = raw?.[col];
    row[col] = value === null || value === undefined ? '' : String(value);
  }
  return row;
}

/** True when nothing but (perhaps) the cavity label is filled in. */
export function isBlankPin(row: PinRow): boolean {
  return PIN_COLUMNS.every((col) => col === 'cavity' || row[col].trim() === '');
}

// ── Keyboard movement ──────────────────────────────────────────

export interface CellPos {
  row: number;
  col: number;
}

export type MoveKey = 'Enter' | 'ShiftEnter' | 'ArrowUp' | 'ArrowDown';

/**
 * Where the focus goes from `pos` after `key` in a table of `rowCount` rows: Enter
 * moves down the same column (and asks for a new row below the last one — `append`),
 * Shift+Enter and ArrowUp move up, ArrowDown moves down without adding rows.
 * Tab is left to the browser: the cells are in reading order.
 */
export function moveFrom(
  pos: CellPos,
  key: MoveKey,
  rowCount: number,
): { pos: CellPos; append: boolean } {
  const last = rowCount - 1;
  switch (key) {
    case 'Enter':
      if (pos.row >= last) return { pos: { row: pos.row + 1, col: pos.col }, append: true };
      return { pos: { row: pos.row + 1, col: pos.col }, append: false };
    case 'ArrowDown':
      return {
        pos: { row: Math.min(pos.row + 1, Math.max(last, 0)), col: pos.col },
        append: false,
      };
    case 'ShiftEnter':
    case 'ArrowUp':
      return { pos: { row: Math.max(pos.row - 1, 0), col: pos.col }, append: false };
  }
}

// ── Paste ──────────────────────────────────────────────────────

/**
 * Reads clipboard text from a spreadsheet: rows split on line breaks, cells on tabs,
 * with spreadsheet quoting ("a ""b""" and quoted cells holding line breaks) honoured.
 * A trailing empty line (spreadsheets add one) is dropped.
 */
export function parseClipboard(text: string): string[][] {
  const normalised = text.replace(/\r\n?/g, '\n');
  if (!normalised.includes('\t') && !normalised.includes('\n')) return [[normalised]];
  const parsed = Papa.parse<string[]>(normalised, {
    delimiter: '\t',
    newline: '\n',
    quoteChar: '"',
    skipEmptyLines: false,
  });
  const rows = parsed.data.map((r) => r.map((c) => c.trim()));
  while (rows.length && rows[rows.length - 1].every((c) => c === '')) rows.pop();
  return rows;
}

/** True when pasted text should fill several cells rather than go into one input. */
export function isMultiCellPaste(text: string): boolean {
  return /[\t\n\r]/.test(text.replace(/[\r\n]+$/, ''));
}

/**
 * Fills the table from `start` with a pasted block: the first pasted cell lands in
 * the focused cell, columns past the last one are ignored, rows are added as needed.
 * Returns a new array; the input is not changed.
 */
export function applyPaste(rows: readonly PinRow[], start: CellPos, block: string[][]): PinRow[] {
  const out = rows.map((r) => ({ ...r }));
  block.forEach((cells, i) => {
    const r = start.row + i;
    while (out.length <= r) out.push(emptyPin());
    cells.forEach((value, j) => {
      const col = PIN_COLUMNS[start.col + j];
      if (col) out[r][col] = value;
    });
  });
  return out;
}

// ── CSV ────────────────────────────────────────────────────────

const HEADER_ALIASES: Record<string, PinColumn> = {
  cavity: 'cavity',
  pin: 'cavity',
  position: 'cavity',
  role: 'role',
  'circuit role': 'role',
  function: 'role',
  color: 'color',
  colour: 'color',
  'wire color': 'color',
  'wire colour': 'color',
  size: 'size',
  'wire size': 'size',
  gauge: 'size',
  awg: 'size',
  circuit: 'circuit',
  'circuit no.': 'circuit',
  'circuit no': 'circuit',
  'circuit number': 'circuit',
  note: 'note',
  notes: 'note',
};

function columnForHeader(header: string): PinColumn | undefined {
  return HEADER_ALIASES[header.trim().toLowerCase().replace(/\s+/g, ' ')];
}

/** The pin table as CSV with a header row (cavity, role, color, size, circuit, note). */
export function pinsToCsv(rows: readonly PinRow[]): string {
  return Papa.unparse(
    {
      fields: [...PIN_COLUMNS],
      data: rows.map((r) => PIN_COLUMNS.map((c) => r[c])),
    },
    { newline: '\r\n' },
  );
}

export interface CsvImport {
  rows: PinRow[];
  /** Sentences about what could not be read; the rows that could are still returned. */
  problems: string[];
}

/**
 * Reads a CSV of pins. With a header row the columns are found by name (cavity, role,
 * colour/color, size/gauge, circuit, note); without one they are taken in table order.
 */
export function csvToPins(text: string): CsvImport {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const problems = parsed.errors
    .slice(0, 5)
    .map((e) => (e.row === undefined ? e.message + '.' : `Line ${e.row + 1}: ${e.message}.`));
  const data = parsed.data;
  if (data.length === 0) return { rows: [], problems: [...problems, 'The file has no rows.'] };

  const header = data[0].map((h) => columnForHeader(h));
  const hasHeader = header.some((c) => c !== undefined);
  const columns: (PinColumn | undefined)[] = hasHeader ? header : [...PIN_COLUMNS];
  if (hasHeader) {
    const unknown = data[0].filter((h, i) => h.trim() && header[i] === undefined);
    if (unknown.length) problems.push(`Columns left out: ${unknown.join(', ')}.`);
    if (!header.includes('cavity')) problems.push('The file has no "cavity" column.');
  }
  const body = hasHeader ? data.slice(1) : data;
  const rows = body.map((cells) => {
    const row = emptyPin();
    cells.forEach((value, i) => {
      const col = columns[i];
      if (col) row[col] = value.trim();
    });
    return row;
  });
  return { rows, problems };
}

// ── Cell messages ──────────────────────────────────────────────

/** A message for one cell: `rows[row][col]` is wrong because `message`. */
export interface CellIssue {
  row: number;
  col: PinColumn;
  message: string;
}

/** Finding codes shown beside a cell; the rest go to the findings list above the table. */
const INLINE_CODES = new Set<SheetFindingCode>([
  'PIN_CAVITY_MISSING',
  'PIN_CAVITY_UNKNOWN',
  'PIN_CAVITY_REPEATED',
  'COLOR_UNKNOWN',
  'SIZE_UNREADABLE',
  'SIZE_OUT_OF_RANGE',
]);

/**
 * The inline messages for the pin table, from the shared connector findings run over
 * the table as it stands (blank rows included, so row numbers match the screen):
 * unknown colour codes, unreadable or out-of-range wire sizes, cavities not in the
 * layout, cavities named twice and rows without a cavity.
 */
export function cellIssues(
  content: ConnectorContent,
  rows: readonly PinRow[],
): { issues: CellIssue[]; findings: ConnectorFindings } {
  const findings = connectorFindings({ ...content, pins: rows.map((r) => ({ ...r })) });
  const issues: CellIssue[] = [];
  for (const f of [...findings.errors, ...findings.warnings]) {
    if (f.row === undefined || !INLINE_CODES.has(f.code)) continue;
    const col = (PIN_COLUMNS as readonly string[]).includes(f.field ?? '')
      ? (f.field as PinColumn)
      : 'cavity';
    issues.push({ row: f.row, col, message: f.message.replace(/^Row \d+: /, '') });
  }
  return { issues, findings };
}

/** Index of issues by "row:col" for quick lookup from the template. */
export function issueIndex(issues: readonly CellIssue[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const issue of issues) {
    const key = `${issue.row}:${issue.col}`;
    map.set(key, map.has(key) ? `${map.get(key)} ${issue.message}` : issue.message);
  }
  return map;
}

/**
 * Keeps the table in step with the layout's cavity labels: existing rows are kept
 * (in their order), and a blank row is added for each label not yet in the table.
 * Blank rows whose cavity left the layout are dropped; filled ones stay (and are
 * flagged by {@link validatePins}) so nothing typed is lost.
 */
export function syncRowsToCavities(rows: readonly PinRow[], cavities: readonly string[]): PinRow[] {
  const wanted = new Set(cavities.map((c) => normalizeCavityLabel(c)));
  const kept = rows.filter(
    (r) => !isBlankPin(r) || (r.cavity.trim() && wanted.has(normalizeCavityLabel(r.cavity))),
  );
  const present = new Set(kept.map((r) => normalizeCavityLabel(r.cavity)));
  const added = cavities
    .filter((c) => !present.has(normalizeCavityLabel(c)))
    .map((c) => emptyPin(c));
  const merged = [...kept, ...added];
  const order = new Map(cavities.map((c, i) => [normalizeCavityLabel(c), i]));
  // Rows for layout cavities follow the layout's order; others keep their place at the end.
  return merged
    .map((r, i) => ({ r, i, o: order.get(normalizeCavityLabel(r.cavity)) ?? cavities.length + i }))
    .sort((a, b) => a.o - b.o)
    .map((x) => x.r);
}
