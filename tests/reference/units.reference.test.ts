import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import {
  G_PER_MIN_PER_LB_PER_H,
  KPA_PER_PSI,
  MM_PER_INCH,
  M_PER_FOOT,
  NM_PER_LBF_FT,
  NM_PER_LBF_IN,
  convertLength,
  convertMassFlow,
  convertPressure,
  convertTorque,
  formatTorque,
} from '@shared/wire/units';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('unit factors against NIST SP 811 Appendix B', () => {
  it('inch and foot are exact', () => {
    expect(MM_PER_INCH).toBe(25.4); // NIST SP 811: 1 in = 2.54 cm exactly
    expect(M_PER_FOOT).toBe(0.3048); // NIST SP 811: 1 ft = 0.3048 m exactly
    expect(convertLength(1, 'ft', 'in')).toBeCloseTo(12, 12);
  });

  it('torque, pressure and mass-flow factors', () => {
    expect(NM_PER_LBF_IN).toBe(0.1129848); // NIST SP 811: lbf·in → N·m
    expect(NM_PER_LBF_FT).toBe(1.355818); // NIST SP 811: lbf·ft → N·m
    expect(KPA_PER_PSI).toBe(6.894757); // NIST SP 811: psi → kPa
    expect(G_PER_MIN_PER_LB_PER_H).toBe(7.559873); // NIST SP 811: lb/h → g/min
  });

  it('agrees with mathjs as an independent oracle', () => {
    expect(rel(convertTorque(1, 'lbf·in', 'N·m'), unit('1 lbf in').toNumber('N m'))).toBeLessThan(
      1e-6,
    );
    expect(rel(convertTorque(1, 'lbf·ft', 'N·m'), unit('1 lbf ft').toNumber('N m'))).toBeLessThan(
      1e-6,
    );
    expect(rel(convertPressure(1, 'psi', 'kPa'), unit('1 psi').toNumber('kPa'))).toBeLessThan(1e-6);
    expect(rel(convertPressure(1, 'bar', 'kPa'), unit('1 bar').toNumber('kPa'))).toBeLessThan(
      1e-12,
    );
    expect(convertLength(1, 'in', 'mm')).toBe(unit('1 inch').toNumber('mm'));
    expect(rel(convertLength(1, 'ft', 'm'), unit('1 ft').toNumber('m'))).toBeLessThan(1e-15);
    // mathjs's lb is a mass, which is what lb/h of fuel flow means.
    expect(
      rel(convertMassFlow(1, 'lb/h', 'g/min'), unit('1 lb/hour').toNumber('g/minute')),
    ).toBeLessThan(1e-6);
  });

  it('two-pass torques of 44 and 89 lbf·in are 5.0 and 10.1 N·m (common practice)', () => {
    // Common practice, no published source: the pair is often quoted both ways.
    expect(convertTorque(44, 'lbf·in', 'N·m').toFixed(1)).toBe('5.0');
    expect(convertTorque(89, 'lbf·in', 'N·m').toFixed(1)).toBe('10.1');
    expect(formatTorque(convertTorque(44, 'lbf·in', 'N·m'), 'metric')).toBe('5.0 N·m');
    expect(formatTorque(5.0, 'imperial')).toBe('44 lbf·in');
  });

  it('58 psi is about 400 kPa, within 0.1 %', () => {
    expect(rel(convertPressure(58, 'psi', 'kPa'), 400)).toBeLessThan(1e-3);
  });

  it('1 lb/h of gasoline at 0.72 g/cm³ is about 10.5 cm³/min (common practice)', () => {
    // Common practice, no published source for the density; EN 228 allows 0.720–0.775 g/cm³.
    expect(rel(convertMassFlow(1, 'lb/h', 'g/min') / 0.72, 10.5)).toBeLessThan(1e-3);
  });
});
