/**
 * Pure helpers behind the adapter editor's pin-to-pin table: the text each cell holds,
 * turning a row into a circuit of the check's input and back, lengths in the reader's
 * unit, spreadsheet paste, CSV import and export, and where each finding of the check
 * is shown (which row, which cell). Kept apart from the components so they can be
 * tested without a browser.
 */
import Papa from 'papaparse';
import type { CheckReport, CircuitInput, Finding } from '@shared/schemas/adapter';
import { MM_PER_INCH, type UnitSystem } from '@shared/wire/units';
import { normalizeCavityLabel } from '@shared/wire/cavities';
import { PIN_ROLES } from '@shared/schemas/connector';

/** One row of the table as the editor holds it: every cell is text as typed. */
export interface CircuitRow {
  /** Stable identity for rendering and undo; never shown. */
  key: string;
  /** The circuit's `id` in the stored content. */
  id: string;
  a: string;
  b: string;
  role: string;
  size: string;
  color: string;
  /** In the reader's unit (mm or in). */
  length: string;
  current: string;
  termination: string;
  note: string;
  /**
   * The stored length and the text it was shown as: while the cell still shows that
   * text the stored mm are kept exactly (9.84 in is not quite 250 mm).
   */
  mm?: number;
  mmText?: string;
}

export type CircuitColumn = Exclude<keyof CircuitRow, 'key' | 'id' | 'mm' | 'mmText'>;

/** Column order on screen, in pasted rows and in CSV files. */
export const CIRCUIT_COLUMNS: readonly CircuitColumn[] = [
  'a',
  'b',
  'role',
  'size',
  'color',
  'length',
  'current',
  'termination',
  'note',
];

export function columnLabel(col: CircuitColumn, units: UnitSystem): string {
  switch (col) {
    case 'a':
      return 'End A cavities';
    case 'b':
      return 'End B cavities';
    case 'role':
      return 'Circuit role';
    case 'size':
      return 'Wire size';
    case 'color':
      return 'Wire colour';
    case 'length':
      return `Length (${lengthUnit(units)})`;
    case 'current':
      return 'Current (A)';
    case 'termination':
      return 'Termination';
    case 'note':
      return 'Note';
  }
}

/** The circuit roles offered in the table (the connector sheets' list); free text too. */
export const CIRCUIT_ROLES: readonly string[] = PIN_ROLES;

export function lengthUnit(units: UnitSystem): 'mm' | 'in' {
  return units === 'imperial' ? 'in' : 'mm';
}

let keySeq = 0;
/** A fresh row key (unique within this page). */
export function newKey(): string {
  keySeq += 1;
  return `r${keySeq.toString(36)}`;
}

/** A new circuit id: short, unique enough inside one adapter. */
export function newCircuitId(taken: ReadonlySet<string>): string {
  for (let n = taken.size + 1; ; n++) {
    const id = `c${n}`;
    if (!taken.has(id)) return id;
  }
}

export function emptyRow(id = ''): CircuitRow {
  return {
    key: newKey(),
    id,
    a: '',
    b: '',
    role: '',
    size: '',
    color: '',
    length: '',
    current: '',
    termination: '',
    note: '',
  };
}

export function isBlankRow(row: CircuitRow): boolean {
  return CIRCUIT_COLUMNS.every((c) => row[c].trim() === '');
}

// ── Cells ↔ circuit ────────────────────────────────────────────

/** "1, 2" or "1+2" or "1 2" → ["1", "2"]: more than one label makes a splice. */
export function splitLabels(text: string): string[] {
  const out: string[] = [];
  const seen = new Set<string>();
  for (const part of text.split(/[,;+\s]+/)) {
    const label = part.trim();
    const key = normalizeCavityLabel(label);
    if (!label || seen.has(key)) continue;
    seen.add(key);
    out.push(label);
  }
  return out;
}

export function joinLabels(list: CircuitInput['a']): string {
  if (list === null || list === undefined) return '';
  return (Array.isArray(list) ? list : [list]).map(String).join(', ');
}

function roundTo(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}

/** A stored length in mm as the cell shows it: "250" (mm) or "9.84" (in). */
export function formatLengthCell(mm: number | null | undefined, units: UnitSystem): string {
  if (typeof mm !== 'number' || !Number.isFinite(mm)) return '';
  return units === 'imperial' ? String(roundTo(mm / MM_PER_INCH, 2)) : String(roundTo(mm, 1));
}

export type Parsed<T> = { ok: true; value: T | undefined } | { ok: false; message: string };

const NUMBER = /^(\d+(?:[.,]\d*)?|[.,]\d+)$/;

function readNumber(text: string): number | undefined {
  if (!NUMBER.test(text)) return undefined;
  return Number(text.replace(',', '.'));
}

/**
 * A length cell in mm: a bare number is in the reader's unit; "250 mm", "25 cm",
 * "9.8 in", "9.8\"" and "2 ft" say their own.
 */
export function parseLengthCell(text: string, units: UnitSystem): Parsed<number> {
  const t = text.trim().toLowerCase();
  if (!t) return { ok: true, value: undefined };
  const m = /^(.*?)\s*(mm|cm|m|in|inch|inches|"|ft|feet|')?$/.exec(t);
  const n = m ? readNumber(m[1]) : undefined;
  if (n === undefined || !m)
    return {
      ok: false,
      message: `Give the length as a number of ${lengthUnit(units) === 'mm' ? 'millimetres' : 'inches'} (e.g. ${units === 'imperial' ? '9.8' : '250'}).`,
    };
  const unit = m[2];
  const factor =
    unit === 'mm'
      ? 1
      : unit === 'cm'
        ? 10
        : unit === 'm'
          ? 1000
          : unit === 'in' || unit === 'inch' || unit === 'inches' || unit === '"'
            ? MM_PER_INCH
            : unit === 'ft' || unit === 'feet' || unit === "'"
              ? MM_PER_INCH * 12
              : units === 'imperial'
                ? MM_PER_INCH
                : 1;
  return { ok: true, value: roundTo(n * factor, 3) };
}

/** A current cell in amperes: "3", "3 A", "0.5a". */
export function parseCurrentCell(text: string): Parsed<number> {
  const t = text
    .trim()
    .toLowerCase()
    .replace(/\s*(a|amps?)$/, '');
  if (!t) return { ok: true, value: undefined };
  const n = readNumber(t);
  if (n === undefined) return { ok: false, message: 'Give the current in amperes (e.g. 3).' };
  return { ok: true, value: n };
}

const clean = (text: string): string | undefined => {
  const t = text.trim();
  return t ? t : undefined;
};

/** A row as a circuit of the check's input; blank cells are left out. */
export function rowToCircuit(row: CircuitRow, units: UnitSystem): CircuitInput {
  const circuit: CircuitInput = { a: splitLabels(row.a), b: splitLabels(row.b) };
  if (row.id) circuit.id = row.id;
  const role = clean(row.role);
  if (role) circuit.role = role;
  const size = clean(row.size);
  if (size) circuit.size = size;
  const color = clean(row.color);
  if (color) circuit.color = color;
  if (row.mm !== undefined && row.mmText === row.length) circuit.lengthMm = row.mm;
  else {
    const length = parseLengthCell(row.length, units);
    if (length.ok && length.value !== undefined) circuit.lengthMm = length.value;
  }
  const current = parseCurrentCell(row.current);
  if (current.ok && current.value !== undefined) circuit.currentA = current.value;
  const termination = clean(row.termination);
  if (termination) circuit.termination = termination;
  const note = clean(row.note);
  if (note) circuit.note = note;
  return circuit;
}

/** A stored circuit as a row of text cells. */
export function circuitToRow(c: CircuitInput, units: UnitSystem): CircuitRow {
  const text = (v: unknown) => (v === null || v === undefined ? '' : String(v));
  const length = formatLengthCell(c.lengthMm, units);
  return {
    key: newKey(),
    id: text(c.id),
    a: joinLabels(c.a),
    b: joinLabels(c.b),
    role: text(c.role),
    size: text(c.size),
    color: text(c.color),
    length,
    current: typeof c.currentA === 'number' ? String(c.currentA) : '',
    termination: text(c.termination),
    note: text(c.note),
    ...(typeof c.lengthMm === 'number' ? { mm: c.lengthMm, mmText: length } : {}),
  };
}

/** The row with its length shown in another unit (the stored mm unchanged). */
export function rowInUnits(row: CircuitRow, from: UnitSystem, to: UnitSystem): CircuitRow {
  if (!row.length.trim() || from === to) return row;
  const mm =
    row.mm !== undefined && row.mmText === row.length
      ? row.mm
      : (() => {
          const parsed = parseLengthCell(row.length, from);
          return parsed.ok ? parsed.value : undefined;
        })();
  if (mm === undefined) return row;
  const length = formatLengthCell(mm, to);
  return { ...row, length, mm, mmText: length };
}

/** Object keys sorted, undefined and null left out: for comparing content whatever its key order. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(value, (_key, v: unknown) => {
    if (v === null) return undefined;
    if (v && typeof v === 'object' && !Array.isArray(v)) {
      const out: Record<string, unknown> = {};
      for (const k of Object.keys(v as Record<string, unknown>).sort())
        out[k] = (v as Record<string, unknown>)[k];
      return out;
    }
    return v;
  });
}

/** Problems in a row that the check cannot see because the cell never became a value. */
export function rowInputIssues(
  row: CircuitRow,
  units: UnitSystem,
): Partial<Record<CircuitColumn, string>> {
  const out: Partial<Record<CircuitColumn, string>> = {};
  const length = parseLengthCell(row.length, units);
  if (!length.ok) out.length = length.message;
  const current = parseCurrentCell(row.current);
  if (!current.ok) out.current = current.message;
  return out;
}

// ── Keyboard and paste ─────────────────────────────────────────

export interface CellPos {
  row: number;
  col: number;
}

/**
 * Fills the table from `start` with a pasted block: the first pasted cell lands in the
 * focused cell, columns past the last are ignored, rows are added as needed. Returns a
 * new array; rows that change are new objects, the others are kept as they were.
 */
export function applyPaste(
  rows: readonly CircuitRow[],
  start: CellPos,
  block: string[][],
  makeRow: () => CircuitRow = () => emptyRow(),
): CircuitRow[] {
  const out = rows.slice();
  block.forEach((cells, i) => {
    const r = start.row + i;
    while (out.length <= r) out.push(makeRow());
    const row = { ...out[r] };
    cells.forEach((value, j) => {
      const col = CIRCUIT_COLUMNS[start.col + j];
      if (col) row[col] = value;
    });
    out[r] = row;
  });
  return out;
}

/** Moves the row at `from` to `to` (both indexes in the original array). */
export function moveRow<T>(rows: readonly T[], from: number, to: number): T[] {
  if (from === to || from < 0 || from >= rows.length) return rows.slice();
  const out = rows.slice();
  const [row] = out.splice(from, 1);
  out.splice(Math.max(0, Math.min(out.length, to)), 0, row);
  return out;
}

// ── CSV ────────────────────────────────────────────────────────

const CSV_HEADERS: Record<CircuitColumn, string> = {
  a: 'end_a',
  b: 'end_b',
  role: 'role',
  size: 'size',
  color: 'color',
  length: 'length_mm',
  current: 'current_a',
  termination: 'termination',
  note: 'note',
};

const HEADER_ALIASES: Record<string, CircuitColumn> = {
  a: 'a',
  'end a': 'a',
  end_a: 'a',
  'end a cavities': 'a',
  from: 'a',
  b: 'b',
  'end b': 'b',
  end_b: 'b',
  'end b cavities': 'b',
  to: 'b',
  role: 'role',
  'circuit role': 'role',
  function: 'role',
  size: 'size',
  'wire size': 'size',
  gauge: 'size',
  awg: 'size',
  color: 'color',
  colour: 'color',
  'wire color': 'color',
  'wire colour': 'color',
  length: 'length',
  length_mm: 'length',
  'length mm': 'length',
  'length (mm)': 'length',
  length_in: 'length',
  'length in': 'length',
  'length (in)': 'length',
  current: 'current',
  current_a: 'current',
  'current (a)': 'current',
  amps: 'current',
  termination: 'termination',
  note: 'note',
  notes: 'note',
};

function headerColumn(header: string): CircuitColumn | undefined {
  return HEADER_ALIASES[header.trim().toLowerCase().replace(/\s+/g, ' ')];
}

/** The table as CSV with a header row; lengths always in mm (the stored unit). */
export function rowsToCsv(rows: readonly CircuitRow[], units: UnitSystem): string {
  return Papa.unparse(
    {
      fields: CIRCUIT_COLUMNS.map((c) => CSV_HEADERS[c]),
      data: rows
        .filter((r) => !isBlankRow(r))
        .map((r) =>
          CIRCUIT_COLUMNS.map((c) => {
            if (c !== 'length') return r[c];
            const mm = parseLengthCell(r.length, units);
            return mm.ok && mm.value !== undefined ? String(mm.value) : r.length;
          }),
        ),
    },
    { newline: '\r\n' },
  );
}

export interface CsvImport {
  rows: CircuitRow[];
  /** Sentences about what could not be read; the rows that could are still returned. */
  problems: string[];
}

/**
 * Reads a CSV of circuits. With a header row the columns are found by name (end_a,
 * end_b, role, size, colour/color, length_mm or length_in, current_a, termination,
 * note); without one they are taken in table order with lengths in mm. Lengths come
 * back in the reader's unit.
 */
export function csvToRows(text: string, units: UnitSystem): CsvImport {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy' });
  const problems = parsed.errors
    .slice(0, 5)
    .map((e) => (e.row === undefined ? `${e.message}.` : `Line ${e.row + 1}: ${e.message}.`));
  const data = parsed.data;
  if (!data.length) return { rows: [], problems: [...problems, 'The file has no rows.'] };
  const header = data[0].map(headerColumn);
  const hasHeader = header.some((c) => c !== undefined);
  const columns = hasHeader ? header : [...CIRCUIT_COLUMNS];
  const lengthInInches =
    hasHeader && data[0].some((h) => /\bin\b|_in\b|inch/i.test(h) && headerColumn(h) === 'length');
  if (hasHeader) {
    const unknown = data[0].filter((h, i) => h.trim() && header[i] === undefined);
    if (unknown.length) problems.push(`Columns left out: ${unknown.join(', ')}.`);
  }
  const body = hasHeader ? data.slice(1) : data;
  const rows = body.map((cells) => {
    const row = emptyRow();
    cells.forEach((value, i) => {
      const col = columns[i];
      if (!col) return;
      const v = value.trim();
      if (col === 'length' && v) {
        const mm = parseLengthCell(v, lengthInInches ? 'imperial' : 'metric');
        row.length = mm.ok ? formatLengthCell(mm.value, units) : v;
      } else row[col] = v;
    });
    return row;
  });
  return { rows, problems };
}

// ── Where findings are shown ───────────────────────────────────

export type Severity = 'error' | 'warning' | 'note';

export interface CellMessage {
  severity: Severity;
  /** Short enough for a table cell. */
  text: string;
  /** The check's whole sentence (shown on hover and in the summary). */
  full: string;
  code: string;
}

/** Everything shown on one row: messages per cell and for the row as a whole. */
export interface RowMessages {
  cells: Partial<Record<CircuitColumn, CellMessage[]>>;
  row: CellMessage[];
  /** The worst severity on the row, for its marker. */
  worst: Severity | null;
}

/** Codes that are reported so the builder sees them, not because something is wrong. */
const NOTE_CODES = new Set(['TERMINATED']);

const FIELD_COLUMN: Record<string, CircuitColumn> = {
  a: 'a',
  b: 'b',
  role: 'role',
  size: 'size',
  color: 'color',
  termination: 'termination',
  lengthMm: 'length',
  currentA: 'current',
  note: 'note',
};

function severityOf(f: Finding): Severity {
  if (NOTE_CODES.has(f.code)) return 'note';
  return f.severity === 'error' ? 'error' : 'warning';
}

/** "Circuit 3 uses …" → "Uses …": the row already says which circuit it is. */
export function shortMessage(message: string): string {
  const m = /^Circuit \d+ (\w)(.*)$/s.exec(message);
  return m ? `${m[1].toUpperCase()}${m[2]}` : message;
}

const cap = (t: string) => (t ? t[0].toUpperCase() + t.slice(1) : t);

/**
 * The words of a finding that fit in a table cell: what is wrong with this cell, without
 * the circuit number the row already shows. The check's whole sentence stays available.
 */
export function cellText(f: Finding): string {
  const m = f.message;
  const cav = f.cavity ?? '';
  switch (f.code) {
    case 'CAVITY_REUSED': {
      const first = /also used by circuit (\d+)/.exec(m);
      return first
        ? `Cavity ${cav} is also used by circuit ${first[1]}: one terminal per cavity`
        : shortMessage(m);
    }
    case 'CAVITY_UNKNOWN':
      return `End ${f.end} has no cavity ${cav}`;
    case 'OPEN_END':
      return `No cavity on end ${f.end} and no termination`;
    case 'EMPTY_CIRCUIT':
      return 'No cavity on either end: fill them in or remove the row';
    case 'DUPLICATE_CIRCUIT': {
      const other = /as circuit (\d+)/.exec(m);
      return other ? `Same cavities as circuit ${other[1]}` : shortMessage(m);
    }
    case 'SIZE_UNREADABLE':
    case 'COLOR_UNKNOWN': {
      const reason = /^Circuit \d+ has a [^.]*\.\s*(.*)$/s.exec(m);
      return reason?.[1] ? reason[1] : shortMessage(m);
    }
    case 'SIZE_OUT_OF_RANGE': {
      const r =
        /(thinner|thicker) than the (?:smallest|largest) wire end ([AB]) takes \(([^)]+)\)/.exec(m);
      return r ? `${cap(r[1])} than end ${r[2]} takes (${r[3]})` : shortMessage(m);
    }
    case 'VOLTAGE_DROP_HIGH': {
      const d = /loses ([\d.]+ V) \(([\d.]+ %)/.exec(m);
      const better = /(\S+ AWG) or thicker/.exec(m);
      return d
        ? `Drops ${d[1]} (${d[2]})${better ? `: ${better[1]} or thicker keeps it within the limit` : ''}`
        : shortMessage(m);
    }
    case 'ROLE_MISMATCH': {
      const doc = /end ([AB]) documents (cavity (?:"[^"]*"|\S+)) as "([^"]*)"/.exec(m);
      if (doc) return `End ${doc[1]} documents ${doc[2]} as "${doc[3]}"`;
      return shortMessage(m);
    }
    case 'TERMINATED':
      return 'Leaves the adapter through this termination';
    default:
      return shortMessage(m);
  }
}

const RANK: Record<Severity, number> = { error: 3, warning: 2, note: 1 };

function worse(a: Severity | null, b: Severity): Severity {
  return a && RANK[a] >= RANK[b] ? a : b;
}

/**
 * Places each finding of the report on its row (`finding.circuit`) and cell
 * (`finding.field`: a → end A cavities, b → end B cavities, size, color, role,
 * termination). A reused cavity is also pointed out on the row that used it first, so
 * both rows show the clash. Input problems of cells that never became values (a length
 * that is not a number) are added. Findings without a circuit (a missing end, the
 * count of circuits, unused cavities) are left to the summary.
 */
export function placeFindings(
  report: CheckReport,
  rows: readonly CircuitRow[],
  inputIssues: ReadonlyMap<number, Partial<Record<CircuitColumn, string>>> = new Map(),
): Map<number, RowMessages> {
  const out = new Map<number, RowMessages>();
  const at = (i: number) => {
    let m = out.get(i);
    if (!m) {
      m = { cells: {}, row: [], worst: null };
      out.set(i, m);
    }
    return m;
  };
  const put = (i: number, col: CircuitColumn | null, msg: CellMessage) => {
    const m = at(i);
    if (col) (m.cells[col] ??= []).push(msg);
    else m.row.push(msg);
    m.worst = worse(m.worst, msg.severity);
  };

  // First row naming each cavity of each end, for pointing back at it.
  let firstUse: Record<'A' | 'B', Map<string, number>> | null = null;
  const firstUser = (side: 'A' | 'B', cavity: string): number | undefined => {
    if (!firstUse) {
      firstUse = { A: new Map(), B: new Map() };
      rows.forEach((r, i) => {
        for (const l of splitLabels(r.a)) {
          const k = normalizeCavityLabel(l);
          if (!firstUse!.A.has(k)) firstUse!.A.set(k, i);
        }
        for (const l of splitLabels(r.b)) {
          const k = normalizeCavityLabel(l);
          if (!firstUse!.B.has(k)) firstUse!.B.set(k, i);
        }
      });
    }
    return firstUse[side].get(normalizeCavityLabel(cavity));
  };

  for (const f of [...report.errors, ...report.warnings]) {
    if (f.circuit === undefined || f.circuit >= rows.length) continue;
    const col = f.field ? (FIELD_COLUMN[f.field] ?? null) : null;
    const severity = severityOf(f);
    put(f.circuit, col, { severity, text: cellText(f), full: f.message, code: f.code });
    if (f.code === 'CAVITY_REUSED' && f.end && f.cavity) {
      const first = firstUser(f.end, f.cavity);
      if (first !== undefined && first !== f.circuit) {
        const text = `Cavity ${f.cavity} is also used by circuit ${f.circuit + 1}`;
        put(first, f.end === 'A' ? 'a' : 'b', {
          severity,
          text,
          full: `${text} on end ${f.end}. A cavity holds one terminal; join wires with a splice inside one circuit instead.`,
          code: f.code,
        });
      }
    }
  }
  for (const [i, issues] of inputIssues) {
    for (const [col, text] of Object.entries(issues) as Array<[CircuitColumn, string]>) {
      put(i, col, { severity: 'warning', text: `Not kept: ${text}`, full: text, code: 'INPUT' });
    }
  }
  return out;
}
