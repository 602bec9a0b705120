import { describe, expect, it } from 'vitest';
import {
  COPPER_ALPHA_20,
  COPPER_RESISTIVITY_20C,
  copperResistance,
  copperResistivity,
  ohmsPer1000Ft,
  ohmsPerKm,
  resistancePerMetre,
} from '@shared/wire/copper';

describe('copper resistance', () => {
  it('uses 1/58 Ω·mm²/m and 0.00393 /°C', () => {
    expect(COPPER_RESISTIVITY_20C).toBeCloseTo(0.017241, 6);
    expect(COPPER_ALPHA_20).toBe(0.00393);
  });

  it('scales linearly with temperature about 20 °C', () => {
    expect(copperResistivity(20)).toBe(COPPER_RESISTIVITY_20C);
    expect(copperResistivity(70) / copperResistivity(20)).toBeCloseTo(1 + 0.00393 * 50, 12);
    expect(copperResistivity(-20)).toBeLessThan(COPPER_RESISTIVITY_20C);
  });

  it('gives Ω/m, Ω/km and Ω/1000 ft consistently', () => {
    expect(resistancePerMetre(1)).toBeCloseTo(0.017241, 6);
    expect(ohmsPerKm(1)).toBeCloseTo(17.241, 3);
    expect(ohmsPer1000Ft(1)).toBeCloseTo(17.241 * 0.3048, 3);
    expect(ohmsPerKm(2)).toBeCloseTo(ohmsPerKm(1) / 2, 12);
    expect(copperResistance(0.5, 3)).toBeCloseTo((3 * 0.0172414) / 0.5, 5);
  });
});
