/**
 * What the pin map draws, worked out without Vue: each cavity's place in the drawing
 * (from the shared layout and mirror), its pin and the wire colour to paint.
 */
import type { ConnectorContent, ConnectorView } from '@shared/schemas/connector';
import { layoutCavities, mirrorLayout, type CavityLayout } from '@shared/connector/layout';
import { describeWireColor, parseWireColor } from '@shared/wire/colors';
import { normalizeCavityLabel } from '@shared/wire/cavities';
import { formatWireSize, parseWireSize } from '@shared/wire/awg';
import { toPinRow, type PinRow } from './pinTable';

/** The paint of one wire: base and optional tracer stripe, with words for screen readers. */
export interface WirePaint {
  /** As the sheet wrote it, trimmed; '' when blank. */
  text: string;
  /** The normalised code ("GN/YE") when it could be read, else the text. */
  code: string;
  ok: boolean;
  base?: string;
  stripe?: string;
  words: string;
}

export function wirePaint(raw: string | null | undefined): WirePaint {
  const text = (raw ?? '').trim();
  if (!text) return { text, code: '', ok: false, words: 'no wire colour given' };
  const parsed = parseWireColor(text);
  if (!parsed.ok)
    return { text, code: text, ok: false, words: `colour "${text}" (not a known code)` };
  return {
    text,
    code: parsed.normalized,
    ok: true,
    base: parsed.base.hex,
    stripe: parsed.tracer?.hex ?? parsed.base.stripeHex,
    words: describeWireColor(parsed.base, parsed.tracer),
  };
}

export interface MapCavity {
  label: string;
  row: number;
  col: number;
  pin: PinRow | null;
  paint: WirePaint;
}

export interface PinMapModel {
  layout: CavityLayout;
  /** The side the drawing is shown from, null when the sheet does not say. */
  shownView: ConnectorView | null;
  mirrored: boolean;
  cavities: MapCavity[];
  /** Pin rows whose cavity is not on the drawing. */
  strayPins: PinRow[];
}

/**
 * What the pin map needs from a sheet. Looser than the schema's type so a search result
 * or a half-typed draft can be drawn too: unknown `view` or `labels` words are ignored.
 */
export interface MapContent {
  cavities?: readonly string[] | null;
  cavityCount?: number | null;
  labels?: string | null;
  layout?: {
    rows?: number | null;
    cols?: number | null;
    positions?: readonly { label: string; row: number; col: number }[];
  } | null;
  view?: string | null;
  pins?: readonly Partial<Record<keyof PinRow, unknown>>[] | null;
  housing?: string | null;
  sealed?: boolean | null;
}

const VIEWS: readonly string[] = ['mating-face', 'wire-side'];
const SCHEMES: readonly string[] = ['numeric', 'alpha', 'custom'];

/** The fields the shared layout reads, with words it does not know dropped. */
export function layoutInput(
  content: MapContent,
): Pick<ConnectorContent, 'cavities' | 'cavityCount' | 'labels' | 'layout' | 'view'> {
  return {
    cavities: content.cavities ? [...content.cavities] : undefined,
    cavityCount: content.cavityCount ?? null,
    labels: SCHEMES.includes(content.labels ?? '')
      ? (content.labels as ConnectorContent['labels'])
      : null,
    layout: content.layout
      ? {
          rows: content.layout.rows ?? null,
          cols: content.layout.cols ?? null,
          ...(content.layout.positions
            ? { positions: content.layout.positions.map((p) => ({ ...p })) }
            : {}),
        }
      : null,
    view: VIEWS.includes(content.view ?? '') ? (content.view as ConnectorView) : null,
  };
}

/** The drawing of a sheet, as documented or (with `mirrored`) from the other side. */
export function buildPinMap(content: MapContent, mirrored: boolean): PinMapModel {
  const documented = layoutCavities(layoutInput(content));
  const layout = mirrored ? mirrorLayout(documented) : documented;
  const byCavity = new Map<string, PinRow>();
  const strayPins: PinRow[] = [];
  const onDrawing = new Set(layout.cells.map((c) => normalizeCavityLabel(c.label)));
  for (const raw of content.pins ?? []) {
    const pin = toPinRow(raw);
    const key = normalizeCavityLabel(pin.cavity);
    if (!pin.cavity.trim()) continue;
    if (onDrawing.has(key) && !byCavity.has(key)) byCavity.set(key, pin);
    else strayPins.push(pin);
  }
  const cavities = layout.cells.map((cell) => {
    const pin = byCavity.get(normalizeCavityLabel(cell.label)) ?? null;
    return { ...cell, pin, paint: wirePaint(pin?.color) };
  });
  return { layout, shownView: layout.view, mirrored, cavities, strayPins };
}

export const VIEW_WORDS: Record<ConnectorView, string> = {
  'mating-face': 'mating face',
  'wire-side': 'wire side',
};

/** "mating face", "wire side", or a plain statement that the sheet does not say. */
export function viewWords(view: string | null | undefined): string {
  return view && VIEWS.includes(view) ? VIEW_WORDS[view as ConnectorView] : 'side not stated';
}

/** One cavity in words for its tooltip and for screen readers: "Cavity 3: signal, GN/YE (…), 20 AWG". */
export function describeCavity(c: Pick<MapCavity, 'label' | 'pin' | 'paint'>): string {
  const pin = c.pin;
  if (!pin || isEmptyPin(pin)) return `Cavity ${c.label}: no pin recorded`;
  const parts = [pin.role.trim() || 'role not given'];
  if (c.paint.text) parts.push(c.paint.ok ? `${c.paint.code} (${c.paint.words})` : c.paint.words);
  if (pin.size.trim()) parts.push(sizeText(pin.size));
  if (pin.circuit.trim()) parts.push(`circuit ${pin.circuit.trim()}`);
  if (pin.note.trim()) parts.push(pin.note.trim());
  return `Cavity ${c.label}: ${parts.join(', ')}`;
}

function isEmptyPin(pin: PinRow): boolean {
  return (
    !pin.role.trim() &&
    !pin.color.trim() &&
    !pin.size.trim() &&
    !pin.circuit.trim() &&
    !pin.note.trim()
  );
}

/** A wire size as printed on the sheet: "0.5 mm2" reads "0.5 mm²"; unreadable text stays as written. */
export function sizeText(raw: string | null | undefined): string {
  const text = (raw ?? '').trim();
  if (!text) return '';
  const parsed = parseWireSize(text);
  return parsed.ok ? formatWireSize(parsed.size) : text;
}

// ── Geometry of the drawing (SVG user units; 1 unit = 1 CSS px at natural size) ──

/** Smallest text the drawing may show on screen, in CSS px. */
export const MIN_TEXT_PX = 10;
/** Narrowest cavity pitch of the phone drawing: a 5-letter code still fits under its hole. */
export const MIN_PITCH = 46;
const NATURAL_PITCH = 92;
/** The smallest print on the natural drawing (the caption, 12 units). */
const NATURAL_SMALLEST_TEXT = 12;
const NARROW_CODE = 11;

export interface PinMapGeometry {
  /**
   * `natural`: the drawing as on a wide screen and on paper, code beside each swatch;
   * `narrow`: pitched to the box it is in, code under each swatch, drawn 1:1;
   * `compact`: the result-card thumbnail.
   */
  mode: 'natural' | 'narrow' | 'compact';
  /** False when even the narrowest pitch is wider than the box: the page offers a zoom. */
  fits: boolean;
  /** How wide to draw it (CSS px) at natural size; the box may scale a natural drawing down. */
  drawWidth: number;
  px: number;
  py: number;
  r: number;
  sw: number;
  sh: number;
  /** Font size of the printed codes, units. */
  codeSize: number;
  /** Longest code printed in full; longer ones end in "…". */
  codeChars: number;
  width: number;
  height: number;
  gridX: number;
  gridY: number;
  body: { x: number; y: number; w: number; h: number };
  latch: { x: number; y: number; w: number; h: number };
}

/**
 * The drawing's geometry for a grid of `rows` × `cols` in a box `available` px wide
 * (undefined: as wide as it likes, e.g. on paper). The natural drawing is kept while the
 * box shows it at a scale where its smallest text stays ≥ MIN_TEXT_PX; below that the
 * cavities are pitched to the box (text drawn 1:1), down to MIN_PITCH.
 */
export function pinMapGeometry(
  rows: number,
  cols: number,
  { compact = false, available }: { compact?: boolean; available?: number } = {},
): PinMapGeometry {
  if (compact) {
    const px = 22;
    const pad = 8;
    const bodyW = cols * px + pad * 2;
    const bodyH = rows * px + pad * 2;
    const width = bodyW + 4;
    const latch = { w: Math.min(28, bodyW / 2), h: 5 };
    const top = latch.h + 2;
    return {
      mode: 'compact',
      fits: true,
      drawWidth: width,
      px,
      py: px,
      r: 8,
      sw: 0,
      sh: 0,
      codeSize: 0,
      codeChars: 0,
      width,
      height: top + bodyH + 2,
      gridX: 2 + pad,
      gridY: top + pad,
      body: { x: 2, y: top, w: bodyW, h: bodyH },
      latch: { x: width / 2 - latch.w / 2, y: 1, w: latch.w, h: latch.h },
    };
  }
  const natural = naturalGeometry(rows, cols);
  const shown =
    available === undefined ? natural.drawWidth : Math.min(available, natural.drawWidth);
  if (available === undefined || (shown / natural.width) * NATURAL_SMALLEST_TEXT >= MIN_TEXT_PX)
    return natural;

  const pad = 8;
  const margin = 4;
  const room = available - 2 * (pad + margin);
  const fits = cols * MIN_PITCH <= room;
  const px = Math.max(MIN_PITCH, Math.min(NATURAL_PITCH, Math.floor(room / cols)));
  const r = Math.max(12, Math.min(20, Math.round(px * 0.3)));
  const sw = Math.min(20, px - 20);
  const sh = 10;
  const py = 2 * r + 6 + 5 + sh + 3 + NARROW_CODE + 8;
  const bodyW = cols * px + pad * 2;
  const bodyH = rows * py + pad * 2;
  const width = fits ? Math.max(available, bodyW + 2 * margin) : bodyW + 2 * margin;
  const latch = { w: Math.min(72, Math.max(36, bodyW / 3)), h: 10 };
  const top = 34 + latch.h;
  const bodyX = (width - bodyW) / 2;
  return {
    mode: 'narrow',
    fits,
    drawWidth: width,
    px,
    py,
    r,
    sw,
    sh,
    codeSize: NARROW_CODE,
    codeChars: Math.max(3, Math.floor((px - 4) / (0.62 * NARROW_CODE))),
    width,
    height: top + bodyH + 34,
    gridX: bodyX + pad,
    gridY: top + pad,
    body: { x: bodyX, y: top, w: bodyW, h: bodyH },
    latch: { x: width / 2 - latch.w / 2, y: top - latch.h, w: latch.w, h: latch.h },
  };
}

function naturalGeometry(rows: number, cols: number): PinMapGeometry {
  const px = NATURAL_PITCH;
  const py = 84;
  const pad = 14;
  const bodyW = cols * px + pad * 2;
  const bodyH = rows * py + pad * 2;
  const width = Math.max(bodyW + 24, 260);
  const latch = { w: Math.min(72, Math.max(36, bodyW / 3)), h: 12 };
  const top = 34 + latch.h;
  const bodyX = (width - bodyW) / 2;
  return {
    mode: 'natural',
    fits: true,
    // Small housings are drawn a little larger than their natural size where there is room.
    drawWidth: Math.round(width * (cols <= 4 ? 1.25 : 1)),
    px,
    py,
    r: 20,
    sw: 20,
    sh: 13,
    codeSize: 13,
    codeChars: 9,
    width,
    height: top + bodyH + 34,
    gridX: bodyX + pad,
    gridY: top + pad,
    body: { x: bodyX, y: top, w: bodyW, h: bodyH },
    latch: { x: width / 2 - latch.w / 2, y: top - latch.h, w: latch.w, h: latch.h },
  };
}

/** Where one cavity's hole, label, swatch and printed code go in `geo`. */
export interface PlacedCavity {
  cx: number;
  cy: number;
  /** The swatch's top left corner. */
  sx: number;
  sy: number;
  /** The printed code: its anchor point and alignment. */
  codeX: number;
  codeY: number;
  codeAnchor: 'start' | 'middle';
  codeText: string;
  labelSize: number;
}

export function placeCavity(
  geo: PinMapGeometry,
  c: Pick<MapCavity, 'label' | 'row' | 'col' | 'paint'>,
): PlacedCavity {
  const cx = geo.gridX + c.col * geo.px + geo.px / 2;
  const code = c.paint.code;
  const codeText =
    code.length > geo.codeChars ? `${code.slice(0, Math.max(1, geo.codeChars - 1))}…` : code;
  if (geo.mode === 'narrow') {
    const cy = geo.gridY + c.row * geo.py + geo.r + 6;
    const sy = cy + geo.r + 5;
    return {
      cx,
      cy,
      sx: cx - geo.sw / 2,
      sy,
      codeX: cx,
      codeY: sy + geo.sh + 3 + geo.codeSize / 2,
      codeAnchor: 'middle',
      codeText,
      labelSize: Math.max(
        MIN_TEXT_PX,
        Math.min(16, (2 * geo.r - 6) / Math.max(1, c.label.length * 0.62)),
      ),
    };
  }
  const cy = geo.gridY + c.row * geo.py + (geo.mode === 'compact' ? geo.py / 2 : 28);
  // Swatch and code centred together under the cavity.
  const groupW = geo.sw + 4 + codeText.length * 7.8;
  const sx = cx - groupW / 2;
  const sy = cy + geo.r + 9;
  return {
    cx,
    cy,
    sx,
    sy,
    codeX: sx + geo.sw + 4,
    codeY: sy + geo.sh / 2,
    codeAnchor: 'start',
    codeText,
    labelSize: Math.max(9, Math.min(16, 34 / Math.max(1, c.label.length * 0.62))),
  };
}
