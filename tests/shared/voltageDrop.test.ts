import { describe, expect, it } from 'vitest';
import {
  ABYC_E11_CRITICAL_DROP_PERCENT,
  ABYC_E11_NONCRITICAL_DROP_PERCENT,
  dropLimitPercent,
  minimumAreaForDrop,
  roundTripDropVolts,
  smallestAwgForDrop,
  voltageDrop,
} from '@shared/wire/voltageDrop';
import { awgAreaMm2 } from '@shared/wire/awg';

describe('voltage drop', () => {
  it('counts the wire out and back', () => {
    // 10 A through 1 m of 1 mm²: R = 2 m × 0.017241 / 1 = 0.034483 Ω, V = 0.34483 V.
    expect(roundTripDropVolts(10, 1000, 1)).toBeCloseTo(0.344828, 5);
  });

  it('reports volts, percent, the limit and whether it is exceeded', () => {
    const r = voltageDrop({ currentA: 10, lengthMm: 1000, areaMm2: 1, systemVoltage: 12 });
    expect(r.volts).toBeCloseTo(0.344828, 5);
    expect(r.percent).toBeCloseTo(2.8736, 3);
    expect(r.limitPercent).toBe(3);
    expect(r.exceeds).toBe(false);
    expect(r.resistanceOhm).toBeCloseTo(0.0344828, 6);

    const long = voltageDrop({ currentA: 10, lengthMm: 1100, areaMm2: 1 });
    expect(long.percent).toBeCloseTo(3.161, 3);
    expect(long.exceeds).toBe(true);
    expect(
      voltageDrop({ currentA: 10, lengthMm: 1100, areaMm2: 1, limit: 'non-critical' }).exceeds,
    ).toBe(false);
  });

  it('defaults to 12 V and 20 °C and accepts a warmer conductor', () => {
    const cold = voltageDrop({ currentA: 5, lengthMm: 2000, areaMm2: 0.5 });
    const warm = voltageDrop({ currentA: 5, lengthMm: 2000, areaMm2: 0.5, temperatureC: 70 });
    expect(cold.percent).toBeCloseTo((cold.volts / 12) * 100, 12);
    expect(warm.volts / cold.volts).toBeCloseTo(1 + 0.00393 * 50, 12);
  });

  it('names the two limits', () => {
    expect(ABYC_E11_CRITICAL_DROP_PERCENT).toBe(3);
    expect(ABYC_E11_NONCRITICAL_DROP_PERCENT).toBe(10);
    expect(dropLimitPercent()).toBe(3);
    expect(dropLimitPercent('non-critical')).toBe(10);
    expect(dropLimitPercent(5)).toBe(5);
  });

  it('finds the cross-section and gauge that keep within the limit', () => {
    const area = minimumAreaForDrop(10, 1100, 12, 3);
    expect(voltageDrop({ currentA: 10, lengthMm: 1100, areaMm2: area }).percent).toBeCloseTo(3, 9);
    const g = smallestAwgForDrop(10, 1100, 12, 3)!;
    expect(awgAreaMm2(g)).toBeGreaterThanOrEqual(area);
    expect(awgAreaMm2(g + 1)).toBeLessThan(area);
    expect(smallestAwgForDrop(10_000, 100_000)).toBeUndefined();
  });
});
