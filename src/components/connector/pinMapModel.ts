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
