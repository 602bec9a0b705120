/**
 * The cut list and parts of an adapter build: each wire to cut (length, size, colour),
 * totals of wire by size and colour, and per end the terminals, seals and cavity plugs
 * to buy. Pure; the editor, the public page and the build sheet all use it.
 *
 * How a circuit becomes wires (common practice for adapter harnesses): a circuit from
 * one cavity to one cavity is one wire of the circuit's length. On a splice the first
 * cavity of each side carries that wire and every further cavity gets a pigtail to the
 * splice, cut to suit (its length is not part of the circuit's). A circuit that leaves
 * through a termination runs to it; one that also lands on both ends gets a pigtail to
 * its termination.
 */
import type { AdapterInput, CheckReport, CircuitInput } from '../schemas/adapter';
import { checkParsedAdapter } from '../check/pinCheck';
import { parseWireSize } from '../wire/awg';
import { parseWireColor } from '../wire/colors';

export type Side = 'A' | 'B';

/** One piece of wire to cut. */
export interface CutWire {
  /** 0-based index of the circuit in the pin table. */
  circuit: number;
  /** The circuit's main wire, or a pigtail to its splice or termination. */
  kind: 'wire' | 'pigtail';
  /** Where it starts and ends, in words: "A 3", "B 1", "splice", "ring terminal to ground". */
  from: string;
  to: string;
  /** Null when the table gives none (pigtails are always cut to suit). */
  lengthMm: number | null;
  /** Normalised ("18 AWG", "0.5 mm²"), as written when unreadable, null when not given. */
  size: string | null;
  /** Cross-section for ordering, when the size could be read. */
  areaMm2: number | null;
  /** Normalised code ("GN/YE"), as written when unknown, null when not given. */
  color: string | null;
  role: string;
}

/** Wire of one size (and colour) to buy. */
export interface WireTotal {
  size: string | null;
  color: string | null;
  pieces: number;
  /** Sum of the known lengths. */
  lengthMm: number;
  /** Pieces whose length is not known (cut to suit, or not given). */
  unmeasured: number;
}

/** What one end of the adapter needs. */
export interface EndParts {
  side: Side;
  /** The end's label as given ('' when it has none). */
  label: string;
  sealed: boolean;
  cavities: number;
  /** One terminal per used cavity. */
  terminals: number;
  /** One seal per used cavity on a sealed end; none on an unsealed one. */
  seals: number;
  /** One cavity plug per unused cavity on a sealed end. */
  plugs: number;
  unused: string[];
}

/** A join of several wires inside one circuit. */
export interface SpliceNeed {
  circuit: number;
  /** How many wire ends meet in it. */
  wires: number;
}

export interface CutList {
  wires: CutWire[];
  bySizeAndColor: WireTotal[];
  bySize: WireTotal[];
  /** All known lengths added up. */
  totalLengthMm: number;
  /** Pieces with no length given (pigtails and blank lengths). */
  unmeasured: number;
  ends: Record<Side, EndParts>;
  splices: SpliceNeed[];
  /** Where wires leave the adapter, by the termination as written, with how many. */
  terminations: Array<{ text: string; count: number }>;
}

const SIDES: readonly Side[] = ['A', 'B'];

function labels(value: CircuitInput['a']): string[] {
  if (value === null || value === undefined) return [];
  const list = Array.isArray(value) ? value : [value];
  const out: string[] = [];
  const seen = new Set<string>();
  for (const raw of list) {
    const text = String(raw).trim();
    const key = text.toLowerCase();
    if (!text || seen.has(key)) continue;
    seen.add(key);
    out.push(text);
  }
  return out;
}

function text(value: string | null | undefined): string {
  return typeof value === 'string' ? value.trim() : '';
}

function sizeOf(raw: CircuitInput['size']): { size: string | null; areaMm2: number | null } {
  if (raw === null || raw === undefined || (typeof raw === 'string' && !raw.trim()))
    return { size: null, areaMm2: null };
  const parsed = parseWireSize(raw);
  if (!parsed.ok) return { size: String(raw).trim(), areaMm2: null };
  return { size: parsed.size.label, areaMm2: parsed.areaMm2 };
}

function colorOf(raw: string | null | undefined): string | null {
  const t = text(raw);
  if (!t) return null;
  const parsed = parseWireColor(t);
  return parsed.ok ? parsed.normalized : t;
}

function add(
  map: Map<string, WireTotal & { area: number | null }>,
  key: string,
  w: CutWire,
  color: string | null,
) {
  let t = map.get(key);
  if (!t) {
    t = { size: w.size, color, pieces: 0, lengthMm: 0, unmeasured: 0, area: w.areaMm2 };
    map.set(key, t);
  }
  t.pieces++;
  if (w.lengthMm === null) t.unmeasured++;
  else t.lengthMm += w.lengthMm;
}

/** Thick wire first, then by name; unknown sizes last. */
function bySizeOrder(a: { area: number | null; size: string | null }, b: typeof a): number {
  if (a.area !== null && b.area !== null && a.area !== b.area) return b.area - a.area;
  if (a.area === null && b.area !== null) return 1;
  if (b.area === null && a.area !== null) return -1;
  return (a.size ?? '\uffff').localeCompare(b.size ?? '\uffff');
}

function totals(map: Map<string, WireTotal & { area: number | null }>): WireTotal[] {
  return [...map.values()]
    .sort((a, b) => bySizeOrder(a, b) || (a.color ?? '\uffff').localeCompare(b.color ?? '\uffff'))
    .map(({ area: _area, ...t }) => t);
}

/**
 * The cut list of an adapter. `report` is its pin-to-pin check (run here when not
 * given); terminals, seals and plugs per end follow the report's used and unused
 * cavities, so cavities the end does not have are not counted.
 */
export function buildCutList(input: AdapterInput, report?: CheckReport): CutList {
  const checked = report ?? checkParsedAdapter(input);
  const circuits = input.circuits ?? [];
  const wires: CutWire[] = [];
  const splices: SpliceNeed[] = [];
  const terminations = new Map<string, { text: string; count: number }>();

  circuits.forEach((c, i) => {
    const a = labels(c.a);
    const b = labels(c.b);
    const termination = text(c.termination);
    if (!a.length && !b.length) return;
    const { size, areaMm2 } = sizeOf(c.size);
    const color = colorOf(c.color);
    const role = text(c.role);
    const length =
      typeof c.lengthMm === 'number' && Number.isFinite(c.lengthMm) ? c.lengthMm : null;
    const base = { circuit: i, size, areaMm2, color, role };
    const spliced = a.length > 1 || b.length > 1 || (!!termination && a.length > 0 && b.length > 0);
    const head = (side: Side, list: string[]) => (list.length ? `${side} ${list[0]}` : '');
    const from = head('A', a) || termination || 'open';
    const to = head('B', b) || termination || 'open';
    wires.push({ ...base, kind: 'wire', from, to, lengthMm: length });
    for (const side of SIDES) {
      for (const label of (side === 'A' ? a : b).slice(1)) {
        wires.push({
          ...base,
          kind: 'pigtail',
          from: `${side} ${label}`,
          to: `splice of circuit ${i + 1}`,
          lengthMm: null,
        });
      }
    }
    if (termination && a.length && b.length) {
      wires.push({
        ...base,
        kind: 'pigtail',
        from: `splice of circuit ${i + 1}`,
        to: termination,
        lengthMm: null,
      });
    }
    if (spliced) splices.push({ circuit: i, wires: a.length + b.length + (termination ? 1 : 0) });
    if (termination) {
      const key = termination.toLowerCase();
      const t = terminations.get(key) ?? { text: termination, count: 0 };
      t.count++;
      terminations.set(key, t);
    }
  });

  const bySizeAndColor = new Map<string, WireTotal & { area: number | null }>();
  const bySize = new Map<string, WireTotal & { area: number | null }>();
  let totalLengthMm = 0;
  let unmeasured = 0;
  for (const w of wires) {
    add(bySizeAndColor, `${w.size ?? ''}\u0000${w.color ?? ''}`, w, w.color);
    add(bySize, w.size ?? '', w, null);
    if (w.lengthMm === null) unmeasured++;
    else totalLengthMm += w.lengthMm;
  }

  const ends = {} as Record<Side, EndParts>;
  for (const side of SIDES) {
    const end = input.ends?.[side];
    const summary = checked.summary.ends[side];
    const sealed = end?.sealed === true;
    ends[side] = {
      side,
      label: text(end?.label),
      sealed,
      cavities: summary.cavities,
      terminals: summary.used,
      seals: sealed ? summary.used : 0,
      plugs: summary.plugsNeeded,
      unused: [...summary.unused],
    };
  }

  return {
    wires,
    bySizeAndColor: totals(bySizeAndColor),
    bySize: totals(bySize),
    totalLengthMm,
    unmeasured,
    ends,
    splices,
    terminations: [...terminations.values()],
  };
}
