import { describe, expect, it } from 'vitest';
import { awgAreaMm2, awgDiameterMm, parseWireSize } from '@shared/wire/awg';

// ASTM B258, standard nominal diameters and cross-sectional areas of AWG solid round wires.
// Tabulated diameters are rounded to four significant figures, hence the 2e-3 tolerance.
const ASTM_B258 = [
  { awg: 4, dIn: 0.2043, dMm: 5.189, areaMm2: 21.15, cmil: 41_741 }, // ASTM B258
  { awg: 6, dIn: 0.162, dMm: 4.115, areaMm2: 13.3, cmil: 26_251 }, // ASTM B258
  { awg: 8, dIn: 0.1285, dMm: 3.264, areaMm2: 8.366, cmil: 16_510 }, // ASTM B258
  { awg: 10, dIn: 0.1019, dMm: 2.588, areaMm2: 5.261, cmil: 10_383 }, // ASTM B258
  { awg: 12, dIn: 0.0808, dMm: 2.053, areaMm2: 3.309, cmil: 6_530 }, // ASTM B258
  { awg: 14, dIn: 0.0641, dMm: 1.628, areaMm2: 2.081, cmil: 4_107 }, // ASTM B258
  { awg: 16, dIn: 0.0508, dMm: 1.291, areaMm2: 1.309, cmil: 2_583 }, // ASTM B258
  { awg: 18, dIn: 0.0403, dMm: 1.024, areaMm2: 0.823, cmil: 1_624 }, // ASTM B258
  { awg: 20, dIn: 0.032, dMm: 0.8118, areaMm2: 0.5176, cmil: 1_022 }, // ASTM B258
  { awg: 22, dIn: 0.0253, dMm: 0.6438, areaMm2: 0.3255, cmil: 642.4 }, // ASTM B258
  { awg: 24, dIn: 0.0201, dMm: 0.5106, areaMm2: 0.2047, cmil: 404.0 }, // ASTM B258
  { awg: 26, dIn: 0.0159, dMm: 0.4049, areaMm2: 0.1288, cmil: 254.1 }, // ASTM B258
];

const MM_PER_IN = 25.4; // NIST SP 811, exact

function relErr(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

describe('AWG geometry against ASTM B258', () => {
  it.each(ASTM_B258)('$awg AWG: diameter $dMm mm, area $areaMm2 mm²', (row) => {
    const d = awgDiameterMm(row.awg);
    expect(relErr(d, row.dMm)).toBeLessThan(2e-3);
    // Inch diameters are printed to 0.0001 in, which is only three figures below 24 AWG.
    expect(Math.abs(d / MM_PER_IN - row.dIn)).toBeLessThanOrEqual(0.00005 + 1e-12);
    expect(relErr(awgAreaMm2(row.awg), row.areaMm2)).toBeLessThan(2e-3);
    // Circular mils: the square of the diameter in thousandths of an inch.
    const mils = (d / MM_PER_IN) * 1000;
    expect(relErr(mils * mils, row.cmil)).toBeLessThan(2e-3);
  });

  it('parses each tabulated size to the same area', () => {
    for (const row of ASTM_B258) {
      const r = parseWireSize(`${row.awg} AWG`);
      expect(r.ok && relErr(r.areaMm2, row.areaMm2)).toBeLessThan(2e-3);
    }
  });

  it('the aught sizes follow the same formula with n = 0, −1, −2, −3', () => {
    // ASTM B258: 4/0 AWG = 0.4600 in.
    expect(relErr(awgDiameterMm(-3) / MM_PER_IN, 0.46)).toBeLessThan(2e-3);
    // ASTM B258: 1/0 AWG = 0.3249 in.
    expect(relErr(awgDiameterMm(0) / MM_PER_IN, 0.3249)).toBeLessThan(2e-3);
  });
});
