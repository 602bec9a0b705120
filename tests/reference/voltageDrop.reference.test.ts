import { describe, expect, it } from 'vitest';
import {
  ABYC_E11_CRITICAL_DROP_PERCENT,
  ABYC_E11_NONCRITICAL_DROP_PERCENT,
  voltageDrop,
} from '@shared/wire/voltageDrop';
import { awgAreaMm2 } from '@shared/wire/awg';
import { checkAdapter } from '@shared/check';

describe('voltage drop against ABYC E-11', () => {
  it('names the two limits', () => {
    expect(ABYC_E11_CRITICAL_DROP_PERCENT).toBe(3); // ABYC E-11: critical circuits
    expect(ABYC_E11_NONCRITICAL_DROP_PERCENT).toBe(10); // ABYC E-11: non-critical circuits
  });

  it('works a 15 A feed over 3 m of 14 AWG by hand', () => {
    // Hand calculation, round trip (ABYC E-11 counts out and back):
    //   area 14 AWG = π/4 × (0.127 × 92^(22/39))² = 2.0810 mm² (ASTM B258 table: 2.081)
    //   R = ρ × 2L / A = 0.017241 × 6 m / 2.0810 mm² = 0.049711 Ω (IEC 60028 ρ)
    //   V = I × R = 15 A × 0.049711 Ω = 0.74567 V
    //   0.74567 V / 12 V = 6.214 %: over the 3 % limit, within the 10 % one.
    const r = voltageDrop({
      currentA: 15,
      lengthMm: 3000,
      areaMm2: awgAreaMm2(14),
      systemVoltage: 12,
    });
    expect(r.resistanceOhm).toBeCloseTo(0.049711, 5);
    expect(r.volts).toBeCloseTo(0.74567, 4);
    expect(r.percent).toBeCloseTo(6.214, 2);
    expect(r.exceeds).toBe(true);
    expect(
      voltageDrop({ currentA: 15, lengthMm: 3000, areaMm2: awgAreaMm2(14), limit: 'non-critical' })
        .exceeds,
    ).toBe(false);

    const check = checkAdapter({
      ends: { A: { cavityCount: 1 }, B: { cavityCount: 1 } },
      circuits: [{ a: ['1'], b: ['1'], size: '14 AWG', lengthMm: 3000, currentA: 15 }],
    });
    const high = check.warnings.find((w) => w.code === 'VOLTAGE_DROP_HIGH');
    expect(high?.message).toMatch(/0\.75 V \(6\.2 % of 12 V\)/);
  });

  it('works a 5 A circuit over 2 m of 16 AWG by hand', () => {
    //   area 16 AWG = 1.3088 mm²; R = 0.017241 × 4 / 1.3088 = 0.052693 Ω
    //   V = 5 × 0.052693 = 0.26347 V = 2.196 % of 12 V: within 3 %.
    const r = voltageDrop({ currentA: 5, lengthMm: 2000, areaMm2: awgAreaMm2(16) });
    expect(r.volts).toBeCloseTo(0.26347, 4);
    expect(r.percent).toBeCloseTo(2.196, 2);
    expect(r.exceeds).toBe(false);
  });
});
