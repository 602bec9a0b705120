import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { formatSi, fromSi, inputUnit, toSi } from '@shared/writeup/units';

// The factors themselves, the shared converters against mathjs, and the trade facts for
// convertTorque/convertPressure are checked in units.reference.test.ts. This file checks
// the write-up's own path: a value typed in the reader's units, stored in SI, shown again.

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('write-up values typed in inch-pound units and stored in SI', () => {
  it('stores inches, lbf·in and psi as mm, N·m and kPa, agreeing with mathjs', () => {
    expect(inputUnit('length', 'imperial')).toBe('in');
    expect(inputUnit('torque', 'imperial')).toBe('lbf·in');
    expect(inputUnit('pressure', 'imperial')).toBe('psi');
    // mathjs (outside oracle) uses the NIST SP 811 definitions.
    expect(rel(toSi('length', 13.75, 'imperial'), unit('13.75 inch').toNumber('mm'))).toBeLessThan(
      1e-12,
    );
    expect(rel(toSi('torque', 89, 'imperial'), unit('89 lbf in').toNumber('N m'))).toBeLessThan(
      1e-6,
    );
    expect(rel(toSi('pressure', 43.5, 'imperial'), unit('43.5 psi').toNumber('kPa'))).toBeLessThan(
      1e-6,
    );
  });

  it('uses NIST SP 811 factors: 1 lbf·in = 0.1129848 N·m, 1 psi = 6.894757 kPa, 1 in = 25.4 mm', () => {
    expect(toSi('torque', 1, 'imperial')).toBe(0.1129848); // NIST SP 811, Appendix B.8
    expect(toSi('pressure', 1, 'imperial')).toBe(6.894757); // NIST SP 811, Appendix B.8
    expect(toSi('length', 1, 'imperial')).toBe(25.4); // NIST SP 811: exact by definition
  });

  it('keeps metric values as typed', () => {
    expect(toSi('length', 350, 'metric')).toBe(350);
    expect(toSi('torque', 5, 'metric')).toBe(5);
    expect(toSi('pressure', 400, 'metric')).toBe(400);
    expect(toSi('length', Number.NaN, 'metric')).toBe(0);
  });

  it('shows two-pass torques of 44 and 89 lbf·in as 5.0 and 10.1 N·m (common practice)', () => {
    // Common practice: the pair is quoted both ways on fastener tables.
    expect(formatSi('torque', toSi('torque', 44, 'imperial'), 'metric')).toBe('5.0 N·m');
    expect(formatSi('torque', toSi('torque', 89, 'imperial'), 'metric')).toBe('10.1 N·m');
    expect(formatSi('torque', 10.1, 'imperial')).toBe('89 lbf·in');
  });

  it('shows 58 psi as 400 kPa within 0.1 %', () => {
    const kPa = toSi('pressure', 58, 'imperial');
    expect(rel(kPa, 400)).toBeLessThan(1e-3);
    expect(formatSi('pressure', kPa, 'metric')).toBe('400 kPa');
    expect(formatSi('pressure', 400, 'imperial')).toBe('58 psi');
  });

  it('round-trips through the editor fields without drift', () => {
    for (const v of [0.5, 1, 13.75, 39.37])
      expect(fromSi('length', toSi('length', v, 'imperial'), 'imperial')).toBe(v);
    for (const v of [44, 89, 120.5])
      expect(fromSi('torque', toSi('torque', v, 'imperial'), 'imperial')).toBe(v);
    for (const v of [58, 43.5])
      expect(fromSi('pressure', toSi('pressure', v, 'imperial'), 'imperial')).toBe(v);
    expect(fromSi('length', 350.4, 'metric')).toBe(350);
    expect(formatSi('length', 350, 'imperial')).toBe('13.8 in');
    expect(formatSi('length', 1250, 'metric')).toBe('1.25 m');
  });
});
