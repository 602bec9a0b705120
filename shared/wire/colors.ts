/**
 * Wire colours: IEC 60757 letter codes, English names, base/tracer pairs.
 *
 * Accepted spellings (case and spacing do not matter):
 * - a letter code ("RD", "GNYE") or an English name ("red", "violet"/"purple",
 *   "grey"/"gray", "green-yellow"/"green-and-yellow" for GNYE);
 * - base and tracer separated by "/" ("GN/YE", "green/yellow", "GN / yellow");
 * - two letter codes joined by "-" ("GN-YE") or written together ("RDWH"), both read
 *   as base/tracer because drawings use them; a hyphen between names is not a
 *   separator, so "green-yellow" stays the single IEC colour GNYE.
 * The normalised form is always `BASE` or `BASE/TRACER` in letter codes.
 */

export type ColorCode =
  | 'BK'
  | 'BN'
  | 'RD'
  | 'OG'
  | 'YE'
  | 'GN'
  | 'BU'
  | 'VT'
  | 'GY'
  | 'WH'
  | 'PK'
  | 'GD'
  | 'TQ'
  | 'SR'
  | 'GNYE';

/** One insulation colour with a display value for drawings (sRGB, our own choice). */
export interface WireColor {
  code: ColorCode;
  name: string;
  hex: string;
  /** Second colour of a two-colour insulation (GNYE), for drawing its stripe. */
  stripeHex?: string;
}

/** Result of {@link parseWireColor}. */
export type WireColorResult =
  | { ok: true; base: WireColor; tracer?: WireColor; normalized: string }
  | { ok: false; reason: string };

/** The IEC 60757 colours, in the standard's order, with display values. */
export const WIRE_COLORS: readonly WireColor[] = Object.freeze([
  { code: 'BK', name: 'black', hex: '#1b1b1b' },
  { code: 'BN', name: 'brown', hex: '#7a4b2a' },
  { code: 'RD', name: 'red', hex: '#d62828' },
  { code: 'OG', name: 'orange', hex: '#f27f1b' },
  { code: 'YE', name: 'yellow', hex: '#f7d31e' },
  { code: 'GN', name: 'green', hex: '#2e9b45' },
  { code: 'BU', name: 'blue', hex: '#2463c9' },
  { code: 'VT', name: 'violet', hex: '#7b45b0' },
  { code: 'GY', name: 'grey', hex: '#8e8e8e' },
  { code: 'WH', name: 'white', hex: '#f8f8f4' },
  { code: 'PK', name: 'pink', hex: '#f59ac0' },
  { code: 'GD', name: 'gold', hex: '#c9a13b' },
  { code: 'TQ', name: 'turquoise', hex: '#30bfc0' },
  { code: 'SR', name: 'silver', hex: '#c3c7cc' },
  { code: 'GNYE', name: 'green-and-yellow', hex: '#2e9b45', stripeHex: '#f7d31e' },
] as WireColor[]);

const BY_CODE = new Map<string, WireColor>(WIRE_COLORS.map((c) => [c.code.toLowerCase(), c]));

const NAME_ALIASES: Record<string, ColorCode> = {
  black: 'BK',
  brown: 'BN',
  red: 'RD',
  orange: 'OG',
  yellow: 'YE',
  green: 'GN',
  blue: 'BU',
  violet: 'VT',
  purple: 'VT',
  grey: 'GY',
  gray: 'GY',
  white: 'WH',
  pink: 'PK',
  gold: 'GD',
  turquoise: 'TQ',
  silver: 'SR',
};
const BY_NAME = new Map<string, WireColor>(
  Object.entries(NAME_ALIASES).map(([name, code]) => [name, BY_CODE.get(code.toLowerCase())!]),
);
const GNYE_NAME = /^green(?: ?- ?| )(?:and(?: ?- ?| ))?yellow$/;

/** The colour for a letter code ("gn" works too), or undefined. */
export function colorByCode(code: string): WireColor | undefined {
  return BY_CODE.get(code.trim().toLowerCase());
}

function resolveToken(token: string): WireColor | undefined {
  const t = token.trim();
  if (!t) return undefined;
  if (GNYE_NAME.test(t)) return BY_CODE.get('gnye');
  return BY_CODE.get(t) ?? BY_NAME.get(t);
}

function pair(base: WireColor, tracer: WireColor | undefined, original: string): WireColorResult {
  if (tracer && tracer.code === base.code) {
    return { ok: false, reason: `"${original}" gives the same colour as base and tracer.` };
  }
  return tracer
    ? { ok: true, base, tracer, normalized: `${base.code}/${tracer.code}` }
    : { ok: true, base, normalized: base.code };
}

/**
 * Parses a wire colour: "RD", "red", "GN/YE", "green/yellow", "GN-YE", "GNYE".
 * Unknown spellings give `{ ok: false, reason }`.
 */
export function parseWireColor(input: unknown): WireColorResult {
  if (typeof input !== 'string') return { ok: false, reason: 'A wire colour must be text.' };
  const original = input.trim();
  const text = original.toLowerCase().replace(/\s+/g, ' ');
  if (!text) return { ok: false, reason: 'The wire colour is empty.' };
  const unknown: WireColorResult = {
    ok: false,
    reason: `"${original}" is not a known wire colour; use IEC 60757 codes such as RD or GN/YE, or names such as red.`,
  };

  if (text.includes('/')) {
    const parts = text.split('/');
    if (parts.length !== 2) return unknown;
    const base = resolveToken(parts[0]);
    const tracer = resolveToken(parts[1]);
    return base && tracer ? pair(base, tracer, original) : unknown;
  }

  const single = resolveToken(text);
  if (single) return pair(single, undefined, original);

  const hyphenated = /^([a-z]{2}) ?- ?([a-z]{2})$/.exec(text);
  if (hyphenated) {
    const base = BY_CODE.get(hyphenated[1]);
    const tracer = BY_CODE.get(hyphenated[2]);
    return base && tracer ? pair(base, tracer, original) : unknown;
  }

  const joined = /^([a-z]{2})([a-z]{2})$/.exec(text);
  if (joined) {
    const base = BY_CODE.get(joined[1]);
    const tracer = BY_CODE.get(joined[2]);
    return base && tracer ? pair(base, tracer, original) : unknown;
  }
  return unknown;
}

/** A colour in words: "green with a yellow tracer", "red". */
export function describeWireColor(base: WireColor, tracer?: WireColor): string {
  return tracer ? `${base.name} with a ${tracer.name} tracer` : base.name;
}

function channel(c: number): number {
  const s = c / 255;
  return s <= 0.04045 ? s / 12.92 : Math.pow((s + 0.055) / 1.055, 2.4);
}

/** Relative luminance (WCAG 2) of a "#rrggbb" or "#rgb" colour; 0 for unreadable input. */
export function relativeLuminance(hex: string): number {
  let h = hex.trim().replace(/^#/, '');
  if (/^[0-9a-f]{3}$/i.test(h)) h = h.replace(/./g, (x) => x + x);
  if (!/^[0-9a-f]{6}$/i.test(h)) return 0;
  const r = parseInt(h.slice(0, 2), 16);
  const g = parseInt(h.slice(2, 4), 16);
  const b = parseInt(h.slice(4, 6), 16);
  return 0.2126 * channel(r) + 0.7152 * channel(g) + 0.0722 * channel(b);
}

/** WCAG contrast ratio between two colours, 1 (none) to 21. */
export function contrastRatio(hexA: string, hexB: string): number {
  const a = relativeLuminance(hexA);
  const b = relativeLuminance(hexB);
  return (Math.max(a, b) + 0.05) / (Math.min(a, b) + 0.05);
}

/** Contrast below which a swatch gets an outline (the WCAG figure for graphics). */
export const OUTLINE_MIN_CONTRAST = 3;

/**
 * True when a swatch of `hex` would not stand out from `background` on its own
 * (yellow, white, silver, pink on a light page), so it must be drawn with an outline.
 */
export function needsOutline(hex: string, background: string = '#ffffff'): boolean {
  return contrastRatio(hex, background) < OUTLINE_MIN_CONTRAST;
}

/**
 * The outline colour to draw around a swatch of `hex` on `background`, or undefined
 * when none is needed: dark grey on light backgrounds, light grey on dark ones.
 */
export function outlineColor(hex: string, background: string = '#ffffff'): string | undefined {
  if (!needsOutline(hex, background)) return undefined;
  return relativeLuminance(background) > 0.18 ? '#3c3c3c' : '#e6e6e0';
}
