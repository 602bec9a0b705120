import { describe, expect, it } from 'vitest';
import {
  convertLength,
  convertMassFlow,
  convertPressure,
  convertTorque,
  formatLength,
  formatMassFlow,
  formatPressure,
  formatTorque,
} from '@shared/wire/units';

describe('conversions', () => {
  it('converts lengths', () => {
    expect(convertLength(1, 'in', 'mm')).toBe(25.4);
    expect(convertLength(1, 'ft', 'm')).toBeCloseTo(0.3048, 15);
    expect(convertLength(12, 'in', 'ft')).toBeCloseTo(1, 15);
    expect(convertLength(250, 'mm', 'cm')).toBe(25);
    expect(convertLength(3, 'm', 'm')).toBe(3);
  });

  it('converts torques, pressures and mass flow', () => {
    expect(convertTorque(1, 'lbf·in', 'N·m')).toBeCloseTo(0.1129848, 12);
    expect(convertTorque(1, 'lbf·ft', 'lbf·in')).toBeCloseTo(12, 4);
    expect(convertPressure(1, 'psi', 'kPa')).toBeCloseTo(6.894757, 12);
    expect(convertPressure(1, 'bar', 'kPa')).toBe(100);
    expect(convertPressure(1, 'MPa', 'bar')).toBe(10);
    expect(convertMassFlow(1, 'lb/h', 'g/min')).toBeCloseTo(7.559873, 12);
  });
});

describe('display', () => {
  it('formats lengths', () => {
    expect(formatLength(250, 'metric')).toBe('250 mm');
    expect(formatLength(1250, 'metric')).toBe('1.25 m');
    expect(formatLength(250, 'imperial')).toBe('9.8 in');
    expect(formatLength(1250, 'imperial')).toBe('4.1 ft');
    expect(formatLength(254, 'imperial', { digits: 2 })).toBe('10.00 in');
  });

  it('formats torques in lbf·in for small fasteners and lbf·ft above', () => {
    expect(formatTorque(5, 'metric')).toBe('5.0 N·m');
    expect(formatTorque(5, 'imperial')).toBe('44 lbf·in');
    expect(formatTorque(40, 'imperial')).toBe('30 lbf·ft');
  });

  it('formats pressure and mass flow', () => {
    expect(formatPressure(400, 'metric')).toBe('400 kPa');
    expect(formatPressure(400, 'imperial')).toBe('58 psi');
    expect(formatMassFlow(189, 'imperial')).toBe('25.0 lb/h');
    expect(formatMassFlow(189, 'metric')).toBe('189 g/min');
    expect(formatLength(-0.1, 'metric')).toBe('0 mm');
  });
});
