import { describe, expect, it } from 'vitest';
import { awgAreaMm2 } from '@shared/wire/awg';
import {
  COPPER_ALPHA_20,
  COPPER_RESISTIVITY_20C,
  ohmsPer1000Ft,
  ohmsPerKm,
} from '@shared/wire/copper';

// IEC 60028 (International Annealed Copper Standard): resistance at 20 °C of the ASTM B258
// cross-sections, Ω/km and Ω/1000 ft.
const IEC_60028_20C = [
  { awg: 10, perKm: 3.277, per1000Ft: 0.9989 }, // IEC 60028
  { awg: 12, perKm: 5.211, per1000Ft: 1.588 }, // IEC 60028
  { awg: 14, perKm: 8.286, per1000Ft: 2.525 }, // IEC 60028
  { awg: 16, perKm: 13.17, per1000Ft: 4.016 }, // IEC 60028
  { awg: 18, perKm: 20.95, per1000Ft: 6.385 }, // IEC 60028
  { awg: 20, perKm: 33.31, per1000Ft: 10.15 }, // IEC 60028
  { awg: 22, perKm: 52.96, per1000Ft: 16.14 }, // IEC 60028
  { awg: 24, perKm: 84.22, per1000Ft: 25.67 }, // IEC 60028
  { awg: 26, perKm: 133.9, per1000Ft: 40.81 }, // IEC 60028
];

// NEC (NFPA 70) Chapter 9 Table 8, uncoated copper, DC resistance at 75 °C, Ω/1000 ft.
const NEC_TABLE_8_75C = [
  { awg: 18, solid: 7.77, stranded: 7.95 }, // NFPA 70 Ch. 9 Table 8
  { awg: 16, solid: 4.89, stranded: 4.99 }, // NFPA 70 Ch. 9 Table 8
  { awg: 14, solid: 3.07, stranded: 3.14 }, // NFPA 70 Ch. 9 Table 8
  { awg: 12, solid: 1.93, stranded: 1.98 }, // NFPA 70 Ch. 9 Table 8
  { awg: 10, solid: 1.21, stranded: 1.24 }, // NFPA 70 Ch. 9 Table 8
];

// IEC 60228, class 5 (flexible) plain copper conductors, maximum resistance at 20 °C, Ω/km.
const IEC_60228_CLASS5_MAX = [
  { mm2: 0.5, max: 39.0 }, // IEC 60228 class 5
  { mm2: 0.75, max: 26.0 }, // IEC 60228 class 5
  { mm2: 1, max: 19.5 }, // IEC 60228 class 5
  { mm2: 1.5, max: 13.3 }, // IEC 60228 class 5
  { mm2: 2.5, max: 7.98 }, // IEC 60228 class 5
];

/** One unit in the last printed place of a tabulated value. */
function ulp(decimals: number): number {
  return 10 ** -decimals + 1e-12;
}

describe('copper resistance against published tables', () => {
  it('uses the IEC 60028 constants', () => {
    expect(COPPER_RESISTIVITY_20C).toBeCloseTo(0.017241, 6); // IEC 60028: 1/58 Ω·mm²/m
    expect(COPPER_ALPHA_20).toBe(0.00393); // IEC 60028: α20 for annealed copper
  });

  it.each(IEC_60028_20C)('$awg AWG: $perKm Ω/km at 20 °C (IEC 60028)', (row) => {
    const perKm = ohmsPerKm(awgAreaMm2(row.awg));
    expect(Math.abs(perKm - row.perKm) / row.perKm).toBeLessThan(2e-3);
    const perKft = ohmsPer1000Ft(awgAreaMm2(row.awg));
    expect(Math.abs(perKft - row.per1000Ft) / row.per1000Ft).toBeLessThan(2e-3);
  });

  it.each(NEC_TABLE_8_75C)(
    '$awg AWG at 75 °C reproduces the NEC solid column ($solid Ω/1000 ft) within its rounding',
    (row) => {
      const at75 = ohmsPer1000Ft(awgAreaMm2(row.awg), 75);
      // Same as the 20 °C value × (1 + 0.00393 × 55).
      expect(at75).toBeCloseTo(ohmsPer1000Ft(awgAreaMm2(row.awg)) * (1 + 0.00393 * 55), 12);
      // The table is computed from its own base values: four rows agree to half a unit in the
      // last place, 16 AWG to 0.0065, so the bound is one unit (0.01 Ω/1000 ft).
      expect(Math.abs(at75 - row.solid)).toBeLessThanOrEqual(ulp(2));
      // Stranding adds length to each strand, so the stranded column is higher.
      expect(at75).toBeLessThan(row.stranded);
    },
  );

  it.each(IEC_60228_CLASS5_MAX)(
    '$mm2 mm² computes below the IEC 60228 class 5 maximum of $max Ω/km',
    (row) => {
      const computed = ohmsPerKm(row.mm2);
      expect(computed).toBeLessThan(row.max);
      // Below, but not absurdly: stranding and tolerance account for some percent, not half.
      expect(computed).toBeGreaterThan(0.8 * row.max);
    },
  );
});
