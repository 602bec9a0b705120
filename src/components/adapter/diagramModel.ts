/**
 * What the adapter diagram draws, worked out without Vue: both connectors laid out as
 * their sheets document them (shared layout), one track per circuit between them, and
 * each wire's path from its cavities to the track in the wire's colour.
 *
 * Two arrangements: `wide` puts end A left and end B right with horizontal tracks; on a
 * narrow screen (`width` below STACK_BELOW) `stacked` puts end A above end B, each circuit
 * a vertical lane, and gives every circuit's printed code (and its terminal's words) a row
 * of its own, so nothing overlaps and the drawing fits the width at full size.
 *
 * Drawing order (in the component): housings, wires, then cavity holes on top, so a
 * wire runs "behind" the other cavities of its row and its own hole shows its colour.
 */
import type { AdapterEnd, AdapterInput, CheckReport, CircuitInput } from '@shared/schemas/adapter';
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

/** Widths (px on screen) below which the ends are stacked instead of side by side. */
export const STACK_BELOW = 600;
/** More circuits than this stay side by side: their lanes would not fit a phone. */
export const STACK_MAX_CIRCUITS = 40;

/** Geometry of the stacked arrangement. */
export const STACK = {
  margin: 12,
  /** Vertical room where wires bend between a housing and the lanes. */
  bend: 56,
  laneMin: 14,
  laneMax: 44,
  row: 22,
  /** Rough advance of one character at the fonts the component uses, for fitting text. */
  titleChar: 8,
  codeChar: 7,
  termChar: 5.8,
} as const;

export interface DiagramOptions {
  /**
   * The width the drawing has on screen, in px. Below STACK_BELOW the ends are stacked
   * and the drawing is laid out to this width; without it, side by side.
   */
  width?: number;
}

export type DiagramLayout = 'wide' | 'stacked';

export interface DiagramText {
  kind: 'title' | 'view' | 'caption';
  text: string;
  x: number;
  y: number;
  anchor: 'start' | 'middle' | 'end';
}

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
  /** The title (one or more lines), the view side and the caption, placed. */
  texts: DiagramText[];
}

export interface DiagramWire {
  circuit: number;
  /** Changes whenever anything drawn for this wire changes (for v-memo). */
  sig: string;
  paint: WirePaint;
  /** SVG path data, one per wire piece (a splice has several). */
  paths: string[];
  label: {
    x: number;
    y: number;
    text: string;
    anchor: 'start' | 'middle' | 'end';
    /** Stacked: the paper behind the code, which lanes of other circuits pass under. */
    plate?: { x: number; y: number; w: number; h: number };
  };
  joins: Array<{ x: number; y: number }>;
  /**
   * Where a wire leaves through a termination (x, y): its crimp barrel, the ring, and its
   * words at (tx, ty).
   */
  terminals: Array<{
    x: number;
    y: number;
    text: string;
    dir: 1 | -1;
    tx: number;
    ty: number;
    anchor: 'start' | 'end';
    /** The words as drawn, one line each. */
    lines: string[];
    /** Stacked: the paper behind the words. */
    plate?: { x: number; y: number; w: number; h: number };
    ring: { x: number; y: number };
    barrel: { x: number; y: number; w: number; h: number };
  }>;
  /** A wire that ends nowhere: a cross (path `d`) and "open end" at (tx, ty). */
  opens: Array<{
    x: number;
    y: number;
    dir: 1 | -1;
    d: string;
    tx: number;
    ty: number;
    anchor: 'start' | 'end';
  }>;
  /** A cavity the end does not have, marked at (x, y) and named at (tx, ty). */
  strays: Array<{
    x: number;
    y: number;
    text: string;
    tx: number;
    ty: number;
    anchor: 'start' | 'middle';
  }>;
  words: string;
}

export type LegendKey = 'wire' | 'unused' | 'plug' | 'splice' | 'terminal';

export interface DiagramModel {
  layout: DiagramLayout;
  width: number;
  height: number;
  ends: Record<Side, DiagramEnd>;
  wires: DiagramWire[];
  legendX: number;
  legendY: number;
  /** Legend items; `lines` is `text` wrapped to the drawing's width. */
  legend: Array<{ key: LegendKey; text: string; lines: string[]; x: number; y: number }>;
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

/** Words in lines of at most `max` characters; past `maxLines` the last line is clipped. */
export function wrapWords(text: string, max: number, maxLines = Infinity): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter(Boolean)) {
    if (!line) line = word;
    else if (line.length + 1 + word.length <= max) line += ` ${word}`;
    else {
      lines.push(line);
      line = word;
    }
  }
  if (line) lines.push(line);
  const out = lines.map((l) => clip(l, max));
  if (out.length > maxLines) {
    const rest = out.slice(maxLines - 1).join(' ');
    return [...out.slice(0, maxLines - 1), clip(rest, max)];
  }
  return out;
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
 * unused and where plugs are needed; `options.width` below STACK_BELOW stacks the ends.
 */
export function buildDiagram(
  input: AdapterInput,
  report: CheckReport,
  linked: Partial<Record<Side, LinkedSheet | undefined>> = {},
  options: DiagramOptions = {},
): DiagramModel {
  const circuits = input.circuits ?? [];
  const drawn = circuits
    .map((c, i) => ({ c, i, a: splitSide(c.a), b: splitSide(c.b) }))
    .filter((x) => x.a.length || x.b.length);
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
  const sizes = { A: size('A'), B: size('B') };

  // What each end says about itself, before it is placed.
  const facts = {} as Record<
    Side,
    { title: string; viewText: string; caption: string; sealed: boolean; count: number }
  >;
  for (const side of sides) {
    const end = input.ends?.[side];
    const summary = report.summary.ends[side];
    const count = endLabels(end).length;
    const sealed = end?.sealed === true;
    const title = (end?.label ?? '').trim() || (linked[side]?.title ?? '');
    facts[side] = {
      title: `End ${side}${title ? ` · ${title}` : ''}`,
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
      count,
    };
  }

  const stacked =
    options.width !== undefined &&
    options.width > 0 &&
    options.width < STACK_BELOW &&
    drawn.length <= STACK_MAX_CIRCUITS;
  const frame = stacked
    ? stackedFrame(drawn, sizes, facts, options.width ?? 0)
    : wideFrame(drawn.length, sizes, facts);
  const { box, width } = frame;

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
    const b = box[side];
    const summary = report.summary.ends[side];
    const unused = new Set(summary.unused.map(normalizeCavityLabel));
    const { sealed, count } = facts[side];
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
    ends[side] = {
      side,
      title: clip(facts[side].title, 58),
      viewText: facts[side].viewText,
      caption: facts[side].caption,
      sealed,
      ...b,
      cavities,
      missing: count === 0,
      texts: frame.texts[side],
    };
  }

  if (stacked) placeLanes(frame as StackedFrame, drawn, cellAt);

  const wires: DiagramWire[] = drawn.map((d, t) => {
    const c = d.c;
    const paint = paintOf(d.i);
    const termination = (c.termination ?? '').trim();
    const code = paint.text ? paint.code : 'no colour';
    const text = [String(d.i + 1), code, sizeLabel(c.size)].filter(Boolean).join('  ');
    const cavityAt = (side: Side, label: string) =>
      cellAt[side].get(normalizeCavityLabel(label)) ?? null;
    const drawnWire = stacked
      ? stackedWire(d, t, frame as StackedFrame, cavityAt, termination, text)
      : wideWire(d, t, frame as WideFrame, cavityAt, termination, text);
    const { paths, label, joins, terminals, opens, strays } = drawnWire;
    const words = `Circuit ${d.i + 1}: end A ${d.a.join(' + ') || 'none'} to end B ${d.b.join(' + ') || 'none'}${paint.text ? `, ${paint.code} (${paint.words})` : ', no colour given'}${sizeLabel(c.size) ? `, ${sizeLabel(c.size)}` : ''}${termination ? `, leaves through ${termination}` : ''}`;
    const sig = [
      paths.join(''),
      paint.code,
      paint.base,
      paint.stripe,
      text,
      label.x,
      label.y,
      JSON.stringify(terminals),
      JSON.stringify(opens),
      JSON.stringify(strays),
    ].join('|');
    return { circuit: d.i, sig, paint, paths, label, joins, terminals, opens, strays, words };
  });

  const hasPlugs = ends.A.cavities.some((c) => c.plug) || ends.B.cavities.some((c) => c.plug);
  const hasSplices = wires.some((w) => w.joins.length > 0);
  const hasTerminals = wires.some((w) => w.terminals.length > 0);
  const legendX = stacked ? STACK.margin : GEO.margin;
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
    width - legendX * 2,
  );
  return {
    layout: stacked ? 'stacked' : 'wide',
    width,
    height: frame.legendY + legend.height + (stacked ? STACK.margin : GEO.margin),
    ends,
    wires,
    legendX,
    legendY: frame.legendY,
    legend: legend.items,
    hasPlugs,
    hasSplices,
    hasTerminals,
  };
}

type Box = { x: number; y: number; w: number; h: number };
type Drawn = { c: CircuitInput; i: number; a: string[]; b: string[] };
type Point = { x: number; y: number };
type Facts = Record<Side, { title: string; viewText: string; caption: string }>;
type Sizes = Record<Side, { w: number; h: number }>;
type WirePieces = Pick<DiagramWire, 'paths' | 'label' | 'joins' | 'terminals' | 'opens' | 'strays'>;

interface WideFrame {
  width: number;
  box: Record<Side, Box>;
  texts: Record<Side, DiagramText[]>;
  legendY: number;
  trackTop: number;
  fieldLeft: number;
  fieldRight: number;
}

/** Side by side: A on the left, B on the right, a horizontal track per circuit between. */
function wideFrame(count: number, sizes: Sizes, facts: Facts): WideFrame {
  const trackBlock = Math.max(count, 1) * GEO.track;
  const sa = sizes.A;
  const sb = sizes.B;
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
  const texts = {} as Record<Side, DiagramText[]>;
  for (const side of ['A', 'B'] as const) {
    const x = side === 'A' ? GEO.margin : width - GEO.margin;
    const anchor = side === 'A' ? 'start' : 'end';
    const b = box[side];
    texts[side] = [
      { kind: 'title', text: clip(facts[side].title, 58), x, y: GEO.margin + 16, anchor },
      { kind: 'view', text: facts[side].viewText, x, y: GEO.margin + 36, anchor },
      {
        kind: 'caption',
        text: facts[side].caption,
        x: b.x + b.w / 2,
        y: b.y + b.h + 20,
        anchor: 'middle',
      },
    ];
  }
  return {
    width,
    box,
    texts,
    legendY: top + block + 52,
    trackTop: top + (block - trackBlock) / 2,
    fieldLeft,
    fieldRight,
  };
}

function wideWire(
  d: Drawn,
  t: number,
  f: WideFrame,
  cavityAt: (side: Side, label: string) => Point | null,
  termination: string,
  text: string,
): WirePieces {
  const { fieldLeft, fieldRight } = f;
  const y = f.trackTop + t * GEO.track + GEO.track / 2;
  const paths: string[] = [];
  const joins: DiagramWire['joins'] = [];
  const terminals: DiagramWire['terminals'] = [];
  const opens: DiagramWire['opens'] = [];
  const strays: DiagramWire['strays'] = [];
  const edgeA = f.box.A.x + f.box.A.w;
  const edgeB = f.box.B.x;
  const terminal = (
    x: number,
    ty: number,
    dir: 1 | -1,
    tx: number,
    tty: number,
    anchor: 'start' | 'end',
  ) => {
    terminals.push({
      x,
      y: ty,
      text: termination,
      lines: [clip(termination, 40)],
      dir,
      tx,
      ty: tty,
      anchor,
      ring: { x: x + dir * 14, y: ty },
      barrel: { x: dir === 1 ? x - 2 : x - 8, y: ty - 3.5, w: 10, h: 7 },
    });
  };

  const pointsOf = (side: Side, labels: string[]) =>
    labels.map((l, k) => {
      const at = cavityAt(side, l);
      if (at) return at;
      // A cavity the end does not have: drawn at the housing's edge with a question mark.
      const x = side === 'A' ? edgeA : edgeB;
      const py = y + (k ? k * 8 : 0);
      strays.push({ x, y: py, text: `${l}?`, tx: x, ty: py - 11, anchor: 'middle' });
      return { x, y: py };
    });
  const pa = pointsOf('A', d.a);
  const pb = pointsOf('B', d.b);
  const curveA = (p: Point, toX: number) =>
    `M${p.x} ${p.y}C${edgeA + GEO.bend * 0.6} ${p.y} ${toX - GEO.bend * 0.6} ${y} ${toX} ${y}`;
  const curveB = (p: Point, fromX: number) =>
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
      if (termination) terminal(left, y, -1, left + 6, y - 6, 'start');
      else opens.push(wideOpen(left, y, -1));
    }
    if (!pb.length) {
      right = fieldRight - 24;
      if (termination) terminal(right, y, 1, right - 6, y - 6, 'end');
      else opens.push(wideOpen(right, y, 1));
    }
    paths.push(`M${left} ${y}L${right} ${y}`);
  }
  if (termination && pa.length && pb.length) {
    // A branch that also leaves the adapter: a splice on the track and a short pigtail.
    const mx = (fieldLeft + fieldRight) / 2 + 60;
    joins.push({ x: mx, y });
    terminal(mx + 26, y + 10, 1, mx + 52, y + 14, 'start');
    paths.push(`M${mx} ${y}L${mx + 14} ${y + 10}L${mx + 26} ${y + 10}`);
  }

  const leftHeavy = terminals.some((x) => x.dir === 1) || opens.some((x) => x.dir === 1);
  const rightHeavy = terminals.some((x) => x.dir === -1) || opens.some((x) => x.dir === -1);
  const label: DiagramWire['label'] = leftHeavy
    ? { x: left + 10, y: y - 6, text, anchor: 'start' }
    : rightHeavy
      ? { x: right - 10, y: y - 6, text, anchor: 'end' }
      : { x: (left + right) / 2, y: y - 6, text, anchor: 'middle' };
  return { paths, label, joins, terminals, opens, strays };
}

function wideOpen(x: number, y: number, dir: 1 | -1): DiagramWire['opens'][number] {
  const sx = dir === -1 ? x - 16 : x;
  return {
    x,
    y,
    dir,
    d: `M${sx + dir * 4} ${y - 6}l12 12M${sx + dir * 4} ${y + 6}l12 -12`,
    tx: x + dir * 22,
    ty: y + 4,
    anchor: dir === 1 ? 'start' : 'end',
  };
}

interface StackedFrame {
  width: number;
  box: Record<Side, Box>;
  texts: Record<Side, DiagramText[]>;
  legendY: number;
  /** Where the lanes start (below end A's bend) and end (above end B's). */
  fieldTop: number;
  fieldBottom: number;
  /** Per drawn circuit, its lane; set once the cavities are placed (placeLanes). */
  laneX: number[];
  firstLane: number;
  lane: number;
  /** Per drawn circuit: the top of its rows. */
  rowTop: number[];
  /** Per drawn circuit: its termination's words in lines. */
  termLines: string[][];
}

/** The rows a circuit takes in the stacked lanes: its code, and its terminal or open end. */
function stackedRows(d: Drawn, termLines: number): { pre: number; post: number } {
  const termination = (d.c.termination ?? '').trim() !== '';
  const a = d.a.length > 0;
  const b = d.b.length > 0;
  const more = Math.max(0, termLines - 1) * TERM_LINE;
  return {
    pre: a ? 0 : termination ? 26 + more : 26,
    post: !b ? (termination ? 34 + more : 26) : termination ? 38 + more : 0,
  };
}

const TERM_LINE = 13;

/**
 * Stacked: A on top, B below, one vertical lane per circuit between them; each circuit's
 * code (and terminal) on rows of its own, so texts never overlap one another.
 */
function stackedFrame(drawn: Drawn[], sizes: Sizes, facts: Facts, avail: number): StackedFrame {
  const m = STACK.margin;
  const n = Math.max(drawn.length, 1);
  const lane = Math.min(STACK.laneMax, Math.max(STACK.laneMin, (avail - 2 * m) / n));
  const width = Math.round(Math.max(avail, sizes.A.w + 2 * m, sizes.B.w + 2 * m, n * lane + 2 * m));
  const first = (width - drawn.length * lane) / 2 + lane / 2;
  const chars = Math.max(12, Math.floor((width - 2 * m) / STACK.titleChar));
  const viewChars = Math.floor((width - 2 * m) / 6.8);
  const capChars = Math.floor((width - 2 * m) / 6.2);

  // End A: its words above the housing (its wires leave from the bottom).
  const textsA: DiagramText[] = [];
  let y = m;
  for (const line of wrapWords(facts.A.title, chars, 3)) {
    y += 19;
    textsA.push({ kind: 'title', text: line, x: m, y: y - 4, anchor: 'start' });
  }
  y += 18;
  textsA.push({
    kind: 'view',
    text: clip(facts.A.viewText, viewChars),
    x: m,
    y: y - 3,
    anchor: 'start',
  });
  y += 17;
  textsA.push({
    kind: 'caption',
    text: clip(facts.A.caption, capChars),
    x: m,
    y: y - 3,
    anchor: 'start',
  });
  const boxA = { x: Math.round((width - sizes.A.w) / 2), y: y + 18, ...sizes.A };

  const fieldTop = boxA.y + boxA.h + STACK.bend;
  let cursor = fieldTop + 4;
  const rowTop: number[] = [];
  // A terminal's words wrap to the room beside any lane (the middle one has the least).
  const termChars = Math.max(8, Math.floor((width / 2 - m - 22) / STACK.termChar));
  const termLines = drawn.map((d) => wrapWords((d.c.termination ?? '').trim(), termChars, 3));
  for (const d of drawn) {
    rowTop.push(cursor);
    const r = stackedRows(d, termLines[rowTop.length - 1].length);
    cursor += r.pre + STACK.row + r.post;
  }
  const fieldBottom = cursor + 6;
  const boxB = {
    x: Math.round((width - sizes.B.w) / 2),
    y: fieldBottom + STACK.bend,
    ...sizes.B,
  };

  // End B: its words below the housing (its wires come in from the top).
  const textsB: DiagramText[] = [];
  y = boxB.y + boxB.h + 10;
  for (const line of wrapWords(facts.B.title, chars, 3)) {
    y += 19;
    textsB.push({ kind: 'title', text: line, x: m, y: y - 4, anchor: 'start' });
  }
  y += 18;
  textsB.push({
    kind: 'view',
    text: clip(facts.B.viewText, viewChars),
    x: m,
    y: y - 3,
    anchor: 'start',
  });
  y += 17;
  textsB.push({
    kind: 'caption',
    text: clip(facts.B.caption, capChars),
    x: m,
    y: y - 3,
    anchor: 'start',
  });

  return {
    width,
    box: { A: boxA, B: boxB },
    texts: { A: textsA, B: textsB },
    legendY: y + 28,
    fieldTop,
    fieldBottom,
    laneX: [],
    firstLane: first,
    lane,
    rowTop,
    termLines,
  };
}

/**
 * Lanes left to right in the order of the cavities they leave end A from (end B's for a
 * wire without an A side), so the wires fanning out of end A hardly cross; the printed
 * codes still go down in circuit order.
 */
function placeLanes(
  f: StackedFrame,
  drawn: Drawn[],
  cellAt: Record<Side, Map<string, Point>>,
): void {
  const keyOf = (d: Drawn): [number, number, number] => {
    for (const side of ['A', 'B'] as const) {
      for (const l of side === 'A' ? d.a : d.b) {
        const at = cellAt[side].get(normalizeCavityLabel(l));
        if (at) return [side === 'A' ? 0 : 1, at.x, at.y];
      }
    }
    return [2, 0, 0];
  };
  const keys = drawn.map(keyOf);
  const order = drawn
    .map((_, t) => t)
    .sort((p, q) => {
      const a = keys[p];
      const b = keys[q];
      return a[0] - b[0] || a[1] - b[1] || a[2] - b[2] || p - q;
    });
  f.laneX = new Array<number>(drawn.length);
  order.forEach((t, rank) => {
    f.laneX[t] = Math.round((f.firstLane + rank * f.lane) * 10) / 10;
  });
}

function stackedWire(
  d: Drawn,
  t: number,
  f: StackedFrame,
  cavityAt: (side: Side, label: string) => Point | null,
  termination: string,
  text: string,
): WirePieces {
  const x = f.laneX[t];
  const paths: string[] = [];
  const joins: DiagramWire['joins'] = [];
  const terminals: DiagramWire['terminals'] = [];
  const opens: DiagramWire['opens'] = [];
  const strays: DiagramWire['strays'] = [];
  const edgeA = f.box.A.y + f.box.A.h;
  const edgeB = f.box.B.y;
  const rows = stackedRows(d, f.termLines[t].length);
  // Words beside the lane: to its right on the left half, to its left on the right half.
  const right = x <= f.width / 2;
  const beside = (gap: number) => ({
    tx: right ? x + gap : x - gap,
    anchor: right ? ('start' as const) : ('end' as const),
  });
  const terminalAt = (cx: number, ry: number, barrelY: number, dir: 1 | -1, ty: number) => {
    const tx = right ? cx + 12 : cx - 12;
    const lines = f.termLines[t];
    const w = Math.max(...lines.map((l) => l.length)) * STACK.termChar + 8;
    terminals.push({
      x: cx,
      y: barrelY,
      text: termination,
      lines,
      plate: {
        x: right ? tx - 4 : tx - w + 4,
        y: ty - 10,
        w,
        h: (lines.length - 1) * TERM_LINE + 14,
      },
      dir,
      tx,
      ty,
      anchor: right ? 'start' : 'end',
      ring: { x: cx, y: ry },
      barrel: { x: cx - 3.5, y: barrelY, w: 7, h: 10 },
    });
  };

  const pointsOf = (side: Side, labels: string[]) =>
    labels.map((l, k) => {
      const at = cavityAt(side, l);
      if (at) return at;
      // A cavity the end does not have: marked just outside the housing, above its lane.
      const px = x + k * 12;
      const py = side === 'A' ? edgeA + 12 : edgeB - 12;
      strays.push({ x: px, y: py, text: `${l}?`, tx: px + 11, ty: py + 4, anchor: 'start' });
      return { x: px, y: py };
    });
  const pa = pointsOf('A', d.a);
  const pb = pointsOf('B', d.b);
  const top = f.fieldTop;
  const bottom = f.fieldBottom;
  const curveA = (p: Point) => {
    const e = Math.max(p.y, edgeA);
    const c = (top - e) * 0.6;
    return `M${p.x} ${p.y}L${p.x} ${e}C${p.x} ${e + c} ${x} ${top - c} ${x} ${top}`;
  };
  const curveB = (p: Point, from: boolean) => {
    const e = Math.min(p.y, edgeB);
    const c = (e - bottom) * 0.6;
    return `${from ? `M${x} ${bottom}` : ''}C${x} ${bottom + c} ${p.x} ${e - c} ${p.x} ${e}L${p.x} ${p.y}`;
  };

  const rowTop = f.rowTop[t];
  const labelY = rowTop + rows.pre + 15;
  const afterLabel = rowTop + rows.pre + STACK.row;
  if (pa.length === 1 && pb.length === 1 && !termination) {
    paths.push(`${curveA(pa[0])}L${x} ${bottom}${curveB(pb[0], false)}`);
  } else {
    for (const p of pa) paths.push(curveA(p));
    for (const p of pb) paths.push(curveB(p, true));
    if (pa.length > 1) joins.push({ x, y: top });
    if (pb.length > 1) joins.push({ x, y: bottom });
    let from = top;
    let to = bottom;
    if (!pa.length) {
      // Starts at its own first row: the terminal (pointing up) or an open end.
      from = termination ? rowTop + 20 : rowTop + 10;
      if (termination) terminalAt(x, rowTop + 6, rowTop + 10, -1, rowTop + 10);
      else opens.push(stackedOpen(x, rowTop + 6, -1, beside(12)));
    }
    if (!pb.length) {
      to = afterLabel + 2;
      if (termination) terminalAt(x, to + 16, to - 1, 1, to + 20);
      else opens.push(stackedOpen(x, to + 2, 1, beside(12)));
    }
    paths.push(`M${x} ${from}L${x} ${to}`);
    if (termination && pa.length && pb.length) {
      // A branch that also leaves the adapter: a splice on the lane and a short pigtail.
      const jy = afterLabel + 2;
      const px = right ? x + 10 : x - 10;
      joins.push({ x, y: jy });
      paths.push(`M${x} ${jy}L${px} ${jy + 10}L${px} ${jy + 14}`);
      terminalAt(px, jy + 28, jy + 12, 1, jy + 32);
    }
  }
  const at = beside(8);
  // On a plate of paper: other lanes pass behind the code.
  const w = text.length * STACK.codeChar + 8;
  const label: DiagramWire['label'] = {
    x: at.tx,
    y: labelY,
    text,
    anchor: at.anchor,
    plate: { x: at.anchor === 'start' ? at.tx - 4 : at.tx - w + 4, y: labelY - 12, w, h: 16 },
  };
  return { paths, label, joins, terminals, opens, strays };
}

function stackedOpen(
  x: number,
  y: number,
  dir: 1 | -1,
  at: { tx: number; anchor: 'start' | 'end' },
): DiagramWire['opens'][number] {
  return {
    x,
    y,
    dir,
    d: `M${x - 6} ${y - 6}l12 12M${x + 6} ${y - 6}l-12 12`,
    tx: at.tx,
    ty: y + 4,
    anchor: at.anchor,
  };
}

const LEGEND_ROW = 26;
const LEGEND_LINE = 15;
const LEGEND_CHAR = 6.4;

/** Legend items in rows that fit the drawing's width; a long one wraps onto more lines. */
function layoutLegend(
  items: Array<{ key: LegendKey; text: string }>,
  max: number,
): { items: DiagramModel['legend']; height: number } {
  let x = 0;
  let y = 0;
  let rowHeight = 0;
  const perLine = Math.max(8, Math.floor((max - 44) / LEGEND_CHAR));
  const out = items.map((item) => {
    const lines =
      40 + item.text.length * LEGEND_CHAR > max ? wrapWords(item.text, perLine) : [item.text];
    const w = 40 + Math.max(...lines.map((l) => l.length)) * LEGEND_CHAR;
    if (x > 0 && x + w > max) {
      x = 0;
      y += rowHeight;
      rowHeight = 0;
    }
    rowHeight = Math.max(rowHeight, LEGEND_ROW + (lines.length - 1) * LEGEND_LINE);
    const placed = { ...item, lines, x: x + 4, y };
    x += w + 16;
    return placed;
  });
  return { items: out, height: out.length ? y + rowHeight : 0 };
}
