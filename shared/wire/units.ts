/**
 * Unit conversion and display for lengths, torques, pressures and mass flow.
 * Factors are the exact or published NIST SP 811 values.
 */

/** Which units a reader wants to see. */
export type UnitSystem = 'metric' | 'imperial';

/** Millimetres in one inch (exact). */
export const MM_PER_INCH = 25.4;
/** Metres in one foot (exact). */
export const M_PER_FOOT = 0.3048;
/** N·m in one pound-force inch. */
export const NM_PER_LBF_IN = 0.1129848;
/** N·m in one pound-force foot. */
export const NM_PER_LBF_FT = 1.355818;
/** kPa in one pound-force per square inch. */
export const KPA_PER_PSI = 6.894757;
/** kPa in one bar (exact). */
export const KPA_PER_BAR = 100;
/** g/min in one pound (mass) per hour. */
export const G_PER_MIN_PER_LB_PER_H = 7.559873;

export type LengthUnit = 'mm' | 'cm' | 'm' | 'in' | 'ft';
export type TorqueUnit = 'N·m' | 'lbf·in' | 'lbf·ft';
export type PressureUnit = 'kPa' | 'MPa' | 'bar' | 'psi';
export type MassFlowUnit = 'g/min' | 'lb/h';

const MM_IN: Record<LengthUnit, number> = {
  mm: 1,
  cm: 10,
  m: 1000,
  in: MM_PER_INCH,
  ft: M_PER_FOOT * 1000,
};
const NM_IN: Record<TorqueUnit, number> = {
  'N·m': 1,
  'lbf·in': NM_PER_LBF_IN,
  'lbf·ft': NM_PER_LBF_FT,
};
const KPA_IN: Record<PressureUnit, number> = {
  kPa: 1,
  MPa: 1000,
  bar: KPA_PER_BAR,
  psi: KPA_PER_PSI,
};
const GMIN_IN: Record<MassFlowUnit, number> = { 'g/min': 1, 'lb/h': G_PER_MIN_PER_LB_PER_H };

/** Converts a length between mm, cm, m, in and ft. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  return from === to ? value : (value * MM_IN[from]) / MM_IN[to];
}

/** Converts a torque between N·m, lbf·in and lbf·ft. */
export function convertTorque(value: number, from: TorqueUnit, to: TorqueUnit): number {
  return from === to ? value : (value * NM_IN[from]) / NM_IN[to];
}

/** Converts a pressure between kPa, MPa, bar and psi. */
export function convertPressure(value: number, from: PressureUnit, to: PressureUnit): number {
  return from === to ? value : (value * KPA_IN[from]) / KPA_IN[to];
}

/** Converts a mass flow between g/min and lb/h. */
export function convertMassFlow(value: number, from: MassFlowUnit, to: MassFlowUnit): number {
  return from === to ? value : (value * GMIN_IN[from]) / GMIN_IN[to];
}

/** Rounds to `digits` decimals and drops a trailing "-0". */
function fixed(value: number, digits: number): string {
  const s = value.toFixed(digits);
  return /^-0(?:\.0+)?$/.test(s) ? s.slice(1) : s;
}

export interface FormatOptions {
  /** Decimals to show; each formatter has a sensible default for its unit. */
  digits?: number;
}

/**
 * A length given in mm, for display: metric in mm below 1 m and in m above
 * ("250 mm", "1.25 m"); imperial in inches below 3 ft and in feet above
 * ("9.8 in", "4.1 ft").
 */
export function formatLength(mm: number, system: UnitSystem, options: FormatOptions = {}): string {
  if (system === 'metric') {
    return Math.abs(mm) < 1000
      ? `${fixed(mm, options.digits ?? 0)} mm`
      : `${fixed(mm / 1000, options.digits ?? 2)} m`;
  }
  const inches = mm / MM_PER_INCH;
  return Math.abs(inches) < 36
    ? `${fixed(inches, options.digits ?? 1)} in`
    : `${fixed(convertLength(mm, 'mm', 'ft'), options.digits ?? 1)} ft`;
}

/**
 * A torque given in N·m, for display: "5.0 N·m"; imperial in lbf·in up to 120 lbf·in
 * (small fasteners are specified that way) and in lbf·ft above.
 */
export function formatTorque(nm: number, system: UnitSystem, options: FormatOptions = {}): string {
  if (system === 'metric') return `${fixed(nm, options.digits ?? 1)} N·m`;
  const lbfIn = nm / NM_PER_LBF_IN;
  return Math.abs(lbfIn) <= 120
    ? `${fixed(lbfIn, options.digits ?? 0)} lbf·in`
    : `${fixed(nm / NM_PER_LBF_FT, options.digits ?? 0)} lbf·ft`;
}

/** A pressure given in kPa, for display: "400 kPa" or "58 psi". */
export function formatPressure(
  kPa: number,
  system: UnitSystem,
  options: FormatOptions = {},
): string {
  return system === 'metric'
    ? `${fixed(kPa, options.digits ?? 0)} kPa`
    : `${fixed(kPa / KPA_PER_PSI, options.digits ?? 0)} psi`;
}

/** A mass flow given in g/min, for display: "190 g/min" or "25 lb/h". */
export function formatMassFlow(
  gPerMin: number,
  system: UnitSystem,
  options: FormatOptions = {},
): string {
  return system === 'metric'
    ? `${fixed(gPerMin, options.digits ?? 0)} g/min`
    : `${fixed(gPerMin / G_PER_MIN_PER_LB_PER_H, options.digits ?? 1)} lb/h`;
}
