/**
 * Wire sizes: American Wire Gauge and metric cross-sections.
 *
 * AWG geometry follows the defining formula d = 0.127 mm × 92^((36 − n)/39), where the
 * aught sizes 0, 00, 000, 0000 take n = 0, −1, −2, −3.
 */

/** A wire size as the user wrote it, reduced to one of the two systems. */
export type WireSize =
  | { system: 'awg'; gauge: number; label: string }
  | { system: 'metric'; areaMm2: number; label: string };

/** Result of {@link parseWireSize}: a size with its copper cross-section, or why it failed. */
export type WireSizeResult =
  | { ok: true; size: WireSize; areaMm2: number; diameterMm?: number }
  | { ok: false; reason: string };

/** Thickest gauge handled (0000 = 4/0). */
export const AWG_MIN_GAUGE = -3;
/** Thinnest gauge handled. */
export const AWG_MAX_GAUGE = 40;
/** Largest metric cross-section accepted, in mm²; anything above is taken as a typo. */
export const METRIC_MAX_AREA_MM2 = 1000;

/** Diameter in mm of a solid round AWG conductor; `gauge` is n (0000 → −3). */
export function awgDiameterMm(gauge: number): number {
  return 0.127 * Math.pow(92, (36 - gauge) / 39);
}

/** Cross-section in mm² of an AWG conductor; `gauge` is n (0000 → −3). */
export function awgAreaMm2(gauge: number): number {
  const d = awgDiameterMm(gauge);
  return (Math.PI / 4) * d * d;
}

/** The gauge as people write it: 18 → "18", 0 → "1/0", −3 → "4/0". */
export function awgGaugeName(gauge: number): string {
  return gauge <= 0 ? `${1 - gauge}/0` : String(gauge);
}

const AWG_SUFFIX = /^(?:awg|ga|gauge)$/;
const METRIC_SUFFIX = /^(?:mm2|mm²|mm\^2|sq\.?mm|sqmm|mmsq)$/;

function parseGaugeToken(token: string): number | undefined {
  const aught = /^([1-4])\/0$/.exec(token);
  if (aught) return 1 - Number(aught[1]);
  if (/^0{1,4}$/.test(token)) return 1 - token.length;
  if (/^[1-9]\d?$/.test(token)) return Number(token);
  return undefined;
}

/**
 * Parses a wire size such as "18 AWG", "18awg", "18 ga", "4/0 AWG", "0000 AWG",
 * "0.5 mm2", "0,75 mm²" or "1.5 sq mm". Case and spacing do not matter. A bare number
 * is refused because it could be either system.
 */
export function parseWireSize(input: unknown): WireSizeResult {
  if (typeof input === 'number') {
    return {
      ok: false,
      reason: `"${input}" has no unit; write it as "${input} AWG" or "${input} mm²".`,
    };
  }
  if (typeof input !== 'string') return { ok: false, reason: 'A wire size must be text.' };
  const text = input.trim().toLowerCase().replace(/\s+/g, ' ');
  if (!text) return { ok: false, reason: 'The wire size is empty.' };

  // "AWG 18" and "#18" are also seen on drawings.
  const prefixed = /^(?:awg ?|#)(\S+)$/.exec(text);
  let numberPart: string;
  let unitPart: string;
  if (prefixed) {
    numberPart = prefixed[1];
    unitPart = 'awg';
  } else {
    const m = /^([0-9][0-9.,/]*) ?(.*)$/.exec(text);
    if (!m)
      return {
        ok: false,
        reason: `"${input.trim()}" is not a wire size such as "18 AWG" or "0.75 mm²".`,
      };
    numberPart = m[1];
    unitPart = m[2].replace(/ /g, '');
  }

  if (AWG_SUFFIX.test(unitPart)) {
    const gauge = parseGaugeToken(numberPart);
    if (gauge === undefined || gauge < AWG_MIN_GAUGE || gauge > AWG_MAX_GAUGE) {
      return {
        ok: false,
        reason: `"${input.trim()}" is not an AWG size; AWG runs from 4/0 (0000) to 40 in whole gauges.`,
      };
    }
    return {
      ok: true,
      size: { system: 'awg', gauge, label: `${awgGaugeName(gauge)} AWG` },
      areaMm2: awgAreaMm2(gauge),
      diameterMm: awgDiameterMm(gauge),
    };
  }

  if (METRIC_SUFFIX.test(unitPart)) {
    // A decimal comma is normal in metric drawings; a thousands separator never is here.
    if (!/^\d+(?:[.,]\d+)?$/.test(numberPart)) {
      return { ok: false, reason: `"${input.trim()}" does not have a readable number of mm².` };
    }
    const area = Number(numberPart.replace(',', '.'));
    if (!(area > 0) || area > METRIC_MAX_AREA_MM2) {
      return {
        ok: false,
        reason: `"${input.trim()}" is outside the metric sizes handled (above 0 up to ${METRIC_MAX_AREA_MM2} mm²).`,
      };
    }
    return {
      ok: true,
      size: { system: 'metric', areaMm2: area, label: `${formatNumber(area)} mm²` },
      areaMm2: area,
    };
  }

  if (!unitPart) {
    return {
      ok: false,
      reason: `"${input.trim()}" has no unit; write it as "${numberPart} AWG" or "${numberPart} mm²".`,
    };
  }
  return { ok: false, reason: `"${input.trim()}" has a unit that is not AWG or mm².` };
}

function formatNumber(x: number): string {
  return String(Number(x.toPrecision(6)));
}

/** Copper cross-section in mm² of a parsed size. */
export function wireSizeAreaMm2(size: WireSize): number {
  return size.system === 'awg' ? awgAreaMm2(size.gauge) : size.areaMm2;
}

/**
 * Orders two sizes by cross-section: negative when `a` is thinner, positive when thicker,
 * 0 when equal within a relative 1e-9.
 */
export function compareWireSizes(a: WireSize, b: WireSize): number {
  const aa = wireSizeAreaMm2(a);
  const bb = wireSizeAreaMm2(b);
  if (Math.abs(aa - bb) <= 1e-9 * Math.max(aa, bb)) return 0;
  return aa < bb ? -1 : 1;
}

/**
 * Formats a size for display: "18 AWG", "4/0 AWG", "0.75 mm²". With `withArea`, an AWG
 * size also shows its cross-section: "18 AWG (0.823 mm²)".
 */
export function formatWireSize(size: WireSize, options: { withArea?: boolean } = {}): string {
  if (size.system === 'metric') return `${formatNumber(size.areaMm2)} mm²`;
  const base = `${awgGaugeName(size.gauge)} AWG`;
  return options.withArea ? `${base} (${Number(awgAreaMm2(size.gauge).toPrecision(3))} mm²)` : base;
}

/**
 * The AWG gauge whose cross-section is nearest to `areaMm2` on a logarithmic scale
 * (gauges are geometric steps), clamped to 4/0..40.
 */
export function nearestAwg(areaMm2: number): number {
  if (!(areaMm2 > 0)) return AWG_MAX_GAUGE;
  // Invert A(n): d = sqrt(4A/π), n = 36 − 39·log92(d / 0.127).
  const d = Math.sqrt((4 * areaMm2) / Math.PI);
  const n = 36 - (39 * Math.log(d / 0.127)) / Math.log(92);
  return Math.min(AWG_MAX_GAUGE, Math.max(AWG_MIN_GAUGE, Math.round(n)));
}

/**
 * The thinnest AWG gauge whose cross-section is at least `areaMm2`, or undefined when
 * even 4/0 is too thin.
 */
export function smallestAwgAtLeast(areaMm2: number): number | undefined {
  if (!(areaMm2 > 0)) return AWG_MAX_GAUGE;
  for (let g = AWG_MAX_GAUGE; g >= AWG_MIN_GAUGE; g--) {
    if (awgAreaMm2(g) >= areaMm2) return g;
  }
  return undefined;
}
