/**
 * What a write-up's wire run adds up to: length to buy per size and colour, splices and
 * heat-shrink sleeves, and the voltage drop each lengthened wire gains. The same wire
 * modules as the adapter check read the sizes and colours and give the resistance.
 */
import type { WireRun, WireRunWire } from '../schemas/writeup';
import { parseWireSize } from '../wire/awg';
import { parseWireColor } from '../wire/colors';
import { resistancePerMetre } from '../wire/copper';
import { ABYC_E11_CRITICAL_DROP_PERCENT, DEFAULT_SYSTEM_VOLTAGE } from '../wire/voltageDrop';

/** Splices in a joined wire unless it says otherwise: an inserted piece has two ends. */
export const DEFAULT_SPLICES_PER_JOIN = 2;
/** One heat-shrink sleeve over each splice (common practice). */
export const SLEEVES_PER_SPLICE = 1;

/** One wire of the run as computed. */
export interface WireRunLine {
  index: number;
  /** The size as the shared parser names it ("20 AWG", "0.5 mm²"), or as written when unknown. */
  size: string;
  sizeOk: boolean;
  areaMm2: number | null;
  /** Normalised IEC code ("GN/YE"), or as written when unknown. */
  color: string;
  colorOk: boolean;
  addedLengthMm: number;
  splices: number;
  sleeves: number;
  /** Drop across the added length of this wire at its current; null without current or size. */
  drop: { volts: number; percent: number; resistanceOhm: number } | null;
}

export interface LengthTotal {
  size: string;
  color: string;
  wires: number;
  addedLengthMm: number;
}

export interface WireRunTotals {
  lines: WireRunLine[];
  systemVoltage: number;
  wires: number;
  /** Wires with added length. */
  lengthened: number;
  totalAddedMm: number;
  /** Length to buy for each size and colour, thickest size first. */
  bySizeAndColor: LengthTotal[];
  /** Per size, all colours together. */
  bySize: Array<{ size: string; wires: number; addedLengthMm: number }>;
  splices: { crimped: number; soldered: number; total: number };
  /** Heat-shrink sleeves: one per splice. */
  sleeves: number;
  /** Largest added drop, % of the system voltage, and the limit it is judged against. */
  worstDrop: { index: number; percent: number; volts: number } | null;
  dropLimitPercent: number;
}

const NOT_GIVEN_SIZE = 'size not given';
const NOT_GIVEN_COLOR = 'colour not given';

/** Splices a wire needs: none without a join, else its own count or two. */
export function splicesOf(wire: Pick<WireRunWire, 'join' | 'splices'>): number {
  if (wire.join === 'none') return 0;
  return wire.splices ?? DEFAULT_SPLICES_PER_JOIN;
}

/** Computes one wire of the run. */
export function wireRunLine(wire: WireRunWire, index: number, systemVoltage: number): WireRunLine {
  const size = parseWireSize(wire.size);
  const color = parseWireColor(wire.color);
  const added = Number.isFinite(wire.addedLengthMm) ? Math.max(0, wire.addedLengthMm) : 0;
  const splices = splicesOf(wire);
  const areaMm2 = size.ok ? size.areaMm2 : null;
  const current = wire.currentA ?? 0;
  let drop: WireRunLine['drop'] = null;
  if (areaMm2 && current > 0 && added > 0) {
    const resistanceOhm = resistancePerMetre(areaMm2) * (added / 1000);
    const volts = current * resistanceOhm;
    drop = { volts, percent: (volts / systemVoltage) * 100, resistanceOhm };
  }
  return {
    index,
    size: size.ok ? size.size.label : wire.size.trim() || NOT_GIVEN_SIZE,
    sizeOk: size.ok,
    areaMm2,
    color: color.ok ? color.normalized : wire.color.trim().toUpperCase() || NOT_GIVEN_COLOR,
    colorOk: color.ok,
    addedLengthMm: added,
    splices,
    sleeves: splices * SLEEVES_PER_SPLICE,
    drop,
  };
}

/**
 * Totals of a wire run: added length per size and colour (what to buy), splices by join
 * method, heat-shrink sleeves (one per splice), and the voltage drop each lengthened wire
 * gains over its added length (one way: the wire itself; a lengthened return is its own row).
 */
export function wireRunTotals(run: WireRun | null | undefined): WireRunTotals {
  const systemVoltage = run?.systemVoltage ?? DEFAULT_SYSTEM_VOLTAGE;
  const lines = (run?.wires ?? []).map((w, i) => wireRunLine(w, i, systemVoltage));
  const pairs = new Map<string, LengthTotal>();
  const sizes = new Map<
    string,
    { size: string; wires: number; addedLengthMm: number; area: number }
  >();
  const splices = { crimped: 0, soldered: 0, total: 0 };
  let worst: WireRunTotals['worstDrop'] = null;

  for (const [i, line] of lines.entries()) {
    const wire = run!.wires[i];
    if (line.addedLengthMm > 0) {
      const key = `${line.size}\u0000${line.color}`;
      const pair = pairs.get(key) ?? {
        size: line.size,
        color: line.color,
        wires: 0,
        addedLengthMm: 0,
      };
      pair.wires++;
      pair.addedLengthMm += line.addedLengthMm;
      pairs.set(key, pair);
      const s = sizes.get(line.size) ?? {
        size: line.size,
        wires: 0,
        addedLengthMm: 0,
        area: line.areaMm2 ?? -1,
      };
      s.wires++;
      s.addedLengthMm += line.addedLengthMm;
      sizes.set(line.size, s);
    }
    if (wire.join === 'crimped-splice') splices.crimped += line.splices;
    if (wire.join === 'soldered-sealed-splice') splices.soldered += line.splices;
    splices.total += line.splices;
    if (line.drop && (!worst || line.drop.percent > worst.percent))
      worst = { index: i, percent: line.drop.percent, volts: line.drop.volts };
  }

  const areaOf = new Map([...sizes.values()].map((s) => [s.size, s.area]));
  const bySizeAndColor = [...pairs.values()].sort(
    (a, b) =>
      (areaOf.get(b.size) ?? -1) - (areaOf.get(a.size) ?? -1) ||
      a.size.localeCompare(b.size) ||
      a.color.localeCompare(b.color),
  );
  const bySize = [...sizes.values()]
    .sort((a, b) => b.area - a.area || a.size.localeCompare(b.size))
    .map(({ size, wires, addedLengthMm }) => ({ size, wires, addedLengthMm }));

  return {
    lines,
    systemVoltage,
    wires: lines.length,
    lengthened: lines.filter((l) => l.addedLengthMm > 0).length,
    totalAddedMm: lines.reduce((sum, l) => sum + l.addedLengthMm, 0),
    bySizeAndColor,
    bySize,
    splices,
    sleeves: splices.total * SLEEVES_PER_SPLICE,
    worstDrop: worst,
    dropLimitPercent: ABYC_E11_CRITICAL_DROP_PERCENT,
  };
}
