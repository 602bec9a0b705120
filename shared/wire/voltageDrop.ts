/**
 * Voltage drop along a copper circuit, out and back.
 */
import { smallestAwgAtLeast } from './awg';
import { COPPER_REFERENCE_TEMP_C, copperResistivity } from './copper';

/** ABYC E-11: largest drop for critical circuits (feeders, electronics, navigation lights), %. */
export const ABYC_E11_CRITICAL_DROP_PERCENT = 3;
/** ABYC E-11: largest drop for other, non-critical circuits such as general lighting, %. */
export const ABYC_E11_NONCRITICAL_DROP_PERCENT = 10;
/** System voltage assumed when none is given, V. */
export const DEFAULT_SYSTEM_VOLTAGE = 12;

/** Which limit applies: one of the two named classes, or an explicit percentage. */
export type DropLimit = 'critical' | 'non-critical' | number;

export interface VoltageDropInput {
  /** Current through the circuit, A. */
  currentA: number;
  /** One-way length of the wire, mm; the return path doubles it. */
  lengthMm: number;
  /** Copper cross-section, mm². */
  areaMm2: number;
  /** Nominal system voltage, V (default 12). */
  systemVoltage?: number;
  /** Conductor temperature, °C (default 20). */
  temperatureC?: number;
  /** Limit to judge against (default 'critical', 3 %). */
  limit?: DropLimit;
}

export interface VoltageDropResult {
  /** Round-trip drop, V. */
  volts: number;
  /** Drop as a percentage of the system voltage. */
  percent: number;
  /** Limit it was judged against, %. */
  limitPercent: number;
  /** True when `percent` is above `limitPercent`. */
  exceeds: boolean;
  /** Round-trip resistance, Ω. */
  resistanceOhm: number;
}

/** The limit in percent for a {@link DropLimit}. */
export function dropLimitPercent(limit: DropLimit = 'critical'): number {
  if (limit === 'critical') return ABYC_E11_CRITICAL_DROP_PERCENT;
  if (limit === 'non-critical') return ABYC_E11_NONCRITICAL_DROP_PERCENT;
  return limit;
}

/** Round-trip drop V = I · R, with R the resistance of 2 × `lengthMm` of copper. */
export function roundTripDropVolts(
  currentA: number,
  lengthMm: number,
  areaMm2: number,
  temperatureC: number = COPPER_REFERENCE_TEMP_C,
): number {
  const roundTripM = (2 * lengthMm) / 1000;
  return (currentA * copperResistivity(temperatureC) * roundTripM) / areaMm2;
}

/**
 * Computes the round-trip drop of a circuit and judges it against an ABYC E-11 limit
 * (3 % critical by default, 10 % non-critical, or an explicit percentage).
 */
export function voltageDrop(input: VoltageDropInput): VoltageDropResult {
  const systemVoltage = input.systemVoltage ?? DEFAULT_SYSTEM_VOLTAGE;
  const temperatureC = input.temperatureC ?? COPPER_REFERENCE_TEMP_C;
  const resistanceOhm = roundTripDropVolts(1, input.lengthMm, input.areaMm2, temperatureC);
  const volts = input.currentA * resistanceOhm;
  const percent = (volts / systemVoltage) * 100;
  const limitPercent = dropLimitPercent(input.limit);
  return { volts, percent, limitPercent, exceeds: percent > limitPercent, resistanceOhm };
}

/**
 * Smallest cross-section in mm² that keeps the round-trip drop at or under `limitPercent`.
 */
export function minimumAreaForDrop(
  currentA: number,
  lengthMm: number,
  systemVoltage: number = DEFAULT_SYSTEM_VOLTAGE,
  limitPercent: number = ABYC_E11_CRITICAL_DROP_PERCENT,
  temperatureC: number = COPPER_REFERENCE_TEMP_C,
): number {
  const allowedVolts = (systemVoltage * limitPercent) / 100;
  return (currentA * copperResistivity(temperatureC) * ((2 * lengthMm) / 1000)) / allowedVolts;
}

/**
 * Thinnest AWG gauge that keeps the round-trip drop within `limitPercent`, or undefined
 * when even 4/0 is not enough.
 */
export function smallestAwgForDrop(
  currentA: number,
  lengthMm: number,
  systemVoltage: number = DEFAULT_SYSTEM_VOLTAGE,
  limitPercent: number = ABYC_E11_CRITICAL_DROP_PERCENT,
): number | undefined {
  return smallestAwgAtLeast(minimumAreaForDrop(currentA, lengthMm, systemVoltage, limitPercent));
}
