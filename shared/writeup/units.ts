/**
 * Write-up values in the reader's units. Stored in SI (mm, N·m, kPa); typed and shown
 * in mm / N·m / kPa (metric) or in / lbf·in / psi (inch-pound), using the shared
 * conversions and formatters.
 */
import type { SpecQuantity } from '../schemas/writeup';
import {
  convertLength,
  convertPressure,
  convertTorque,
  formatLength,
  formatPressure,
  formatTorque,
  type LengthUnit,
  type PressureUnit,
  type TorqueUnit,
  type UnitSystem,
} from '../wire/units';

export type InputUnit = LengthUnit | TorqueUnit | PressureUnit;

/** The unit a value of `quantity` is typed in under `system`. */
export function inputUnit(quantity: SpecQuantity, system: UnitSystem): InputUnit {
  if (quantity === 'torque') return system === 'metric' ? 'N·m' : 'lbf·in';
  if (quantity === 'pressure') return system === 'metric' ? 'kPa' : 'psi';
  return system === 'metric' ? 'mm' : 'in';
}

/** Decimals a typed value keeps in each input unit: enough for the bench, no noise. */
const INPUT_DIGITS: Record<string, number> = {
  mm: 0,
  in: 2,
  'N·m': 2,
  'lbf·in': 1,
  kPa: 1,
  psi: 1,
};

/** A value typed in the reader's unit, converted to its SI unit for storing. */
export function toSi(quantity: SpecQuantity, value: number, system: UnitSystem): number {
  if (!Number.isFinite(value)) return 0;
  const unit = inputUnit(quantity, system);
  if (quantity === 'torque') return convertTorque(value, unit as TorqueUnit, 'N·m');
  if (quantity === 'pressure') return convertPressure(value, unit as PressureUnit, 'kPa');
  return convertLength(value, unit as LengthUnit, 'mm');
}

/** A stored SI value in the reader's input unit, rounded for an input field. */
export function fromSi(quantity: SpecQuantity, si: number, system: UnitSystem): number {
  const unit = inputUnit(quantity, system);
  let v: number;
  if (quantity === 'torque') v = convertTorque(si, 'N·m', unit as TorqueUnit);
  else if (quantity === 'pressure') v = convertPressure(si, 'kPa', unit as PressureUnit);
  else v = convertLength(si, 'mm', unit as LengthUnit);
  const f = 10 ** (INPUT_DIGITS[unit] ?? 2);
  return Math.round(v * f) / f;
}

/** A stored SI value for display in the reader's units: "250 mm", "9.8 in", "5.0 N·m", "58 psi". */
export function formatSi(quantity: SpecQuantity, si: number, system: UnitSystem): string {
  if (quantity === 'torque') return formatTorque(si, system);
  if (quantity === 'pressure') return formatPressure(si, system);
  return formatLength(si, system);
}

/** An added wire length for the wire-run table, in the reader's units. */
export function formatAddedLength(mm: number, system: UnitSystem): string {
  return formatLength(mm, system);
}
