/**
 * What the adapter diagram draws, worked out without Vue: both connectors laid out as
 * their sheets document them (shared layout), one track per circuit between them, and
 * each wire's path from its cavities to the track in the wire's colour.
 *
 * Drawing order (in the component): housings, wires, then cavity holes on top, so a
 * wire runs "behind" the other cavities of its row and its own hole shows its colour.
 */
import type { AdapterEnd, AdapterInput, CheckReport } from '@shared/schemas/adapter';
import type { LinkedSheet } from '@shared/adapter/linkedEnd';
import { layoutCavities } from '@shared/connector/layout';
import { endCavityLabels, normalizeCavityLabel } from '@shared/wire/cavities';
import { parseWireSize } from '@shared/wire/awg';
import { wirePaint, viewWords, type WirePaint } from '@/components/connector/pinMapModel';

export type Side = 'A' | 'B';

export const GEO = {
  margin: 16,
  /** Height of the end titles above the drawing. */
  head: 58,
  cell: 40,
  r: 13,
  pad: 14,
  /** Space between a housing and the wiring field, where wires bend. */
  bend: 44,
  field: 380,
  track: 34,
} as const;

export interface DiagramCavity {
  label: string;
  x: number;
  y: number;
  /** Paint of the wire landing here (the first, if several rows name it). */
  paint: WirePaint | null;
  circuit: number | null;
  unused: boolean;
  plug: boolean;
  words: string;
}

export interface DiagramEnd {
  side: Side;
  title: string;
  viewText: string;
  caption: string;
  sealed: boolean;
  x: number;
  y: number;
  w: number;
  h: number;
  cavities: DiagramCavity[];
  missing: boolean;
}

export interface DiagramWire {
  circuit: number;
  /** Changes whenever anything drawn for this wire changes (for v-memo). */
  sig: string;
  paint: WirePaint;
  /** SVG path data, one per wire piece (a splice has several). */
  paths: string[];
  label: { x: number; y: number; text: string; anchor: 'start' | 'middle' | 'end' };
  joins: Array<{ x: number; y: number }>;
  /** Where a wire leaves through a termination: the ring at x ± 14, its words at (tx, ty). */
  terminals: Array<{
    x: number;
    y: number;
    text: string;
    dir: 1 | -1;
    tx: number;
    ty: number;
    anchor: 'start' | 'end';
  }>;
  opens: Array<{ x: number; y: number; dir: 1 | -1 }>;
  strays: Array<{ x: number; y: number; text: string }>;
  words: string;
}

export type LegendKey = 'wire' | 'unused' | 'plug' | 'splice' | 'terminal';

export interface DiagramModel {
  width: number;
  height: number;
  ends: Record<Side, DiagramEnd>;
  wires: DiagramWire[];
  legendY: number;
  legend: Array<{ key: LegendKey; text: string; x: number; y: number }>;
  /** True when some end needs cavity plugs (the legend explains the marker). */
  hasPlugs: boolean;
  hasSplices: boolean;
  hasTerminals: boolean;
}

// Colours repeat a lot and are read again on every keystroke: remember each spelling.
const PAINTS = new Map<string, WirePaint>();
function paintFor(color: string): WirePaint {
  let p = PAINTS.get(color);
  if (!p) {
    if (PAINTS.size > 2000) PAINTS.clear();
    p = wirePaint(color);
    PAINTS.set(color, p);
  }
  return p;
}

function clip(text: string, max: number): string {
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

function endLabels(end: AdapterEnd | null | undefined): string[] {
  if (!end) return [];
  return endCavityLabels({ cavities: end.cavities ?? null, cavityCount: end.cavityCount ?? null });
}

function splitSide(value: unknown): string[] {
  if (value === null || value === undefined) return [];
  const list = Array.isArray(value) ? value : [value];
  return list.map((v) => String(v).trim()).filter(Boolean);
}

const SIZES = new Map<string, string>();
function sizeLabel(raw: unknown): string {
  if (raw === null || raw === undefined || raw === '') return '';
  const key = typeof raw === 'number' ? `#${raw}` : String(raw);
  let label = SIZES.get(key);
  if (label === undefined) {
    if (SIZES.size > 2000) SIZES.clear();
    const parsed = parseWireSize(raw);
    label = parsed.ok ? parsed.size.label : String(raw).trim();
    SIZES.set(key, label);
  }
  return label;
}

/**
 * Lays out the diagram of an adapter. `linked` supplies the full layout (labelled
 * positions) of ends that link a connector sheet; `report` says which cavities are
 * unused and where plugs are needed.
 */
export function buildDiagram(
  input: AdapterInput,
  report: CheckReport,
  linked: Partial<Record<Side, LinkedSheet | undefined>> = {},
): DiagramModel {
  const circuits = input.circuits ?? [];
  const drawn = circuits
    .map((c, i) => ({ c, i, a: splitSide(c.a), b: splitSide(c.b) }))
    .filter((x) => x.a.length || x.b.length);

  const trackBlock = Math.max(drawn.length, 1) * GEO.track;
  const sides: Side[] = ['A', 'B'];

  // Cells of each end, laid out as documented.
  const layouts = {} as Record<
    Side,
    { rows: number; cols: number; cells: Array<{ label: string; row: number; col: number }> }
  >;
  for (const side of sides) {
    const end = input.ends?.[side];
    const labels = endLabels(end);
    const sheet = linked[side];
    const layout = layoutCavities({
      cavities: labels,
      layout: sheet?.layout ?? end?.layout ?? null,
      view: end?.view ?? null,
    });
    const cols = Math.max(layout.cols, 1);
    // Labels a positions list leaves out still get a cell, in extra rows below.
    const cells = [
      ...layout.cells,
      ...layout.unplaced.map((label, k) => ({
        label,
        row: layout.rows + Math.floor(k / cols),
        col: k % cols,
      })),
    ];
    layouts[side] = {
      rows: layout.rows + Math.ceil(layout.unplaced.length / cols),
      cols,
      cells,
    };
  }

  const size = (side: Side) => ({
    w: layouts[side].cols * GEO.cell + GEO.pad * 2,
    h: layouts[side].rows * GEO.cell + GEO.pad * 2,
  });
  const sa = size('A');
  const sb = size('B');
  const block = Math.max(sa.h, sb.h, trackBlock);
  const top = GEO.margin + GEO.head;
  const ax = GEO.margin;
  const fieldLeft = ax + sa.w + GEO.bend;
  const fieldRight = fieldLeft + GEO.field;
  const bx = fieldRight + GEO.bend;
  const width = bx + sb.w + GEO.margin;
  const box = {
    A: { x: ax, y: top + (block - sa.h) / 2, ...sa },
    B: { x: bx, y: top + (block - sb.h) / 2, ...sb },
  };
  const trackTop = top + (block - trackBlock) / 2;

  // Which circuit lands first in each cavity, for painting the holes.
  const firstWire: Record<Side, Map<string, number>> = { A: new Map(), B: new Map() };
  for (const d of drawn) {
    for (const l of d.a)
      if (!firstWire.A.has(normalizeCavityLabel(l))) firstWire.A.set(normalizeCavityLabel(l), d.i);
    for (const l of d.b)
      if (!firstWire.B.has(normalizeCavityLabel(l))) firstWire.B.set(normalizeCavityLabel(l), d.i);
  }
  const paintOf = (i: number) => paintFor(circuits[i]?.color ?? '');

  const ends = {} as Record<Side, DiagramEnd>;
  const cellAt: Record<Side, Map<string, { x: number; y: number }>> = {
    A: new Map(),
    B: new Map(),
  };
  for (const side of sides) {
    const end = input.ends?.[side];
    const b = box[side];
    const summary = report.summary.ends[side];
    const unused = new Set(summary.unused.map(normalizeCavityLabel));
    const sealed = end?.sealed === true;
    const cavities = layouts[side].cells.map((cell) => {
      const x = b.x + GEO.pad + cell.col * GEO.cell + GEO.cell / 2;
      const y = b.y + GEO.pad + cell.row * GEO.cell + GEO.cell / 2;
      const key = normalizeCavityLabel(cell.label);
      cellAt[side].set(key, { x, y });
      const circuit = firstWire[side].get(key) ?? null;
      const paint = circuit === null ? null : paintOf(circuit);
      const isUnused = unused.has(key);
      const plug = isUnused && sealed;
      const words =
        circuit !== null
          ? `End ${side} cavity ${cell.label}: circuit ${circuit + 1}${paint?.text ? `, ${paint.code}` : ''}`
          : `End ${side} cavity ${cell.label}: unused${plug ? ', needs a cavity plug' : ''}`;
      return { label: cell.label, x, y, paint, circuit, unused: isUnused, plug, words };
    });
    const count = endLabels(end).length;
    const title = (end?.label ?? '').trim() || (linked[side]?.title ?? '');
    ends[side] = {
      side,
      title: clip(`End ${side}${title ? ` · ${title}` : ''}`, 58),
      viewText: `Viewed from: ${viewWords(end?.view ?? null)}`,
      caption: [
        `${count} ${count === 1 ? 'cavity' : 'cavities'}`,
        sealed ? 'sealed' : 'unsealed',
        summary.plugsNeeded
          ? `${summary.plugsNeeded} cavity ${summary.plugsNeeded === 1 ? 'plug' : 'plugs'}`
          : '',
      ]
        .filter(Boolean)
        .join(' · '),
      sealed,
      ...b,
      cavities,
      missing: count === 0,
    };
  }

  const wires: DiagramWire[] = drawn.map((d, t) => {
    const c = d.c;
    const y = trackTop + t * GEO.track + GEO.track / 2;
    const paint = paintOf(d.i);
    const termination = (c.termination ?? '').trim();
    const paths: string[] = [];
    const joins: DiagramWire['joins'] = [];
    const terminals: DiagramWire['terminals'] = [];
    const opens: DiagramWire['opens'] = [];
    const strays: DiagramWire['strays'] = [];
    const edgeA = box.A.x + box.A.w;
    const edgeB = box.B.x;

    const pointsOf = (side: Side, labels: string[]) =>
      labels.map((l, k) => {
        const at = cellAt[side].get(normalizeCavityLabel(l));
        if (at) return at;
        // A cavity the end does not have: drawn at the housing's edge with a question mark.
        const x = side === 'A' ? edgeA : edgeB;
        const py = y + (k ? k * 8 : 0);
        strays.push({ x, y: py, text: `${l}?` });
        return { x, y: py };
      });
    const pa = pointsOf('A', d.a);
    const pb = pointsOf('B', d.b);
    const curveA = (p: { x: number; y: number }, toX: number) =>
      `M${p.x} ${p.y}C${edgeA + GEO.bend * 0.6} ${p.y} ${toX - GEO.bend * 0.6} ${y} ${toX} ${y}`;
    const curveB = (p: { x: number; y: number }, fromX: number) =>
      `M${fromX} ${y}C${fromX + GEO.bend * 0.6} ${y} ${edgeB - GEO.bend * 0.6} ${p.y} ${p.x} ${p.y}`;

    let left = fieldLeft;
    let right = fieldRight;
    if (pa.length === 1 && pb.length === 1) {
      paths.push(
        `${curveA(pa[0], fieldLeft)}L${fieldRight} ${y}${curveB(pb[0], fieldRight).replace(/^M[^C]+/, '')}`,
      );
    } else {
      for (const p of pa) paths.push(curveA(p, fieldLeft));
      for (const p of pb) paths.push(curveB(p, fieldRight));
      if (pa.length > 1) joins.push({ x: fieldLeft, y });
      if (pb.length > 1) joins.push({ x: fieldRight, y });
      if (!pa.length) {
        left = fieldLeft + 24;
        if (termination)
          terminals.push({
            x: left,
            y,
            text: termination,
            dir: -1,
            tx: left + 6,
            ty: y - 6,
            anchor: 'start',
          });
        else opens.push({ x: left, y, dir: -1 });
      }
      if (!pb.length) {
        right = fieldRight - 24;
        if (termination)
          terminals.push({
            x: right,
            y,
            text: termination,
            dir: 1,
            tx: right - 6,
            ty: y - 6,
            anchor: 'end',
          });
        else opens.push({ x: right, y, dir: 1 });
      }
      paths.push(`M${left} ${y}L${right} ${y}`);
    }
    if (termination && pa.length && pb.length) {
      // A branch that also leaves the adapter: a splice on the track and a short pigtail.
      const mx = (fieldLeft + fieldRight) / 2 + 60;
      joins.push({ x: mx, y });
      terminals.push({
        x: mx + 26,
        y: y + 10,
        text: termination,
        dir: 1,
        tx: mx + 52,
        ty: y + 14,
        anchor: 'start',
      });
      paths.push(`M${mx} ${y}L${mx + 14} ${y + 10}L${mx + 26} ${y + 10}`);
    }

    const code = paint.text ? paint.code : 'no colour';
    const text = [String(d.i + 1), code, sizeLabel(c.size)].filter(Boolean).join('  ');
    const leftHeavy = terminals.some((x) => x.dir === 1) || opens.some((x) => x.dir === 1);
    const rightHeavy = terminals.some((x) => x.dir === -1) || opens.some((x) => x.dir === -1);
    const label: DiagramWire['label'] = leftHeavy
      ? { x: left + 10, y: y - 6, text, anchor: 'start' }
      : rightHeavy
        ? { x: right - 10, y: y - 6, text, anchor: 'end' }
        : { x: (left + right) / 2, y: y - 6, text, anchor: 'middle' };
    const words = `Circuit ${d.i + 1}: end A ${d.a.join(' + ') || 'none'} to end B ${d.b.join(' + ') || 'none'}${paint.text ? `, ${paint.code} (${paint.words})` : ', no colour given'}${sizeLabel(c.size) ? `, ${sizeLabel(c.size)}` : ''}${termination ? `, leaves through ${termination}` : ''}`;
    const sig = [
      paths.join(''),
      paint.code,
      paint.base,
      paint.stripe,
      text,
      label.x,
      JSON.stringify(terminals),
      opens.length,
      strays.length,
    ].join('|');
    return { circuit: d.i, sig, paint, paths, label, joins, terminals, opens, strays, words };
  });

  const legendY = top + block + 52;
  const hasPlugs = ends.A.cavities.some((c) => c.plug) || ends.B.cavities.some((c) => c.plug);
  const hasSplices = wires.some((w) => w.joins.length > 0);
  const hasTerminals = wires.some((w) => w.terminals.length > 0);
  const legend = layoutLegend(
    [
      {
        key: 'wire' as const,
        text: 'wire in its colour, tracer as bands; circuit, code and size printed',
      },
      { key: 'unused' as const, text: 'unused cavity' },
      ...(hasPlugs ? [{ key: 'plug' as const, text: 'cavity plug needed (sealed end)' }] : []),
      ...(hasSplices ? [{ key: 'splice' as const, text: 'splice' }] : []),
      ...(hasTerminals ? [{ key: 'terminal' as const, text: 'leaves through a terminal' }] : []),
    ],
    width - GEO.margin * 2,
  );
  const legendRows = legend.length ? legend[legend.length - 1].y / LEGEND_ROW + 1 : 0;
  return {
    width,
    height: legendY + legendRows * LEGEND_ROW + GEO.margin,
    ends,
    wires,
    legendY,
    legend,
    hasPlugs,
    hasSplices,
    hasTerminals,
  };
}

const LEGEND_ROW = 26;

/** Legend items in rows that fit the drawing's width. */
function layoutLegend(
  items: Array<{ key: LegendKey; text: string }>,
  max: number,
): DiagramModel['legend'] {
  let x = 0;
  let y = 0;
  return items.map((item) => {
    const w = 40 + item.text.length * 6.4;
    if (x > 0 && x + w > max) {
      x = 0;
      y += LEGEND_ROW;
    }
    const out = { ...item, x: x + 4, y };
    x += w + 16;
    return out;
  });
}
