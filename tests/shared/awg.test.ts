import { describe, expect, it } from 'vitest';
import {
  awgAreaMm2,
  awgDiameterMm,
  awgGaugeName,
  compareWireSizes,
  formatWireSize,
  nearestAwg,
  parseWireSize,
  smallestAwgAtLeast,
  type WireSize,
} from '@shared/wire/awg';

function ok(text: string) {
  const r = parseWireSize(text);
  if (!r.ok) throw new Error(`expected ${text} to parse: ${r.reason}`);
  return r;
}

describe('AWG geometry', () => {
  it('gives 36 AWG the defining 0.127 mm and each 39 steps a factor 92', () => {
    expect(awgDiameterMm(36)).toBeCloseTo(0.127, 12);
    expect(awgDiameterMm(-3) / awgDiameterMm(36)).toBeCloseTo(92, 9);
  });

  it('doubles the area about every three gauges', () => {
    expect(awgAreaMm2(10) / awgAreaMm2(13)).toBeCloseTo(2, 1);
  });

  it('names aught gauges the way they are written', () => {
    expect(awgGaugeName(18)).toBe('18');
    expect(awgGaugeName(0)).toBe('1/0');
    expect(awgGaugeName(-3)).toBe('4/0');
  });
});

describe('parseWireSize', () => {
  it.each([
    ['18 AWG', 18],
    ['18AWG', 18],
    ['18 awg', 18],
    ['  18   AWG ', 18],
    ['18 ga', 18],
    ['18 gauge', 18],
    ['AWG 18', 18],
    ['#18', 18],
    ['40 AWG', 40],
    ['1/0 AWG', 0],
    ['2/0 AWG', -1],
    ['3/0 awg', -2],
    ['4/0 AWG', -3],
    ['0 AWG', 0],
    ['00 AWG', -1],
    ['000 AWG', -2],
    ['0000 AWG', -3],
  ])('reads %j as gauge %d', (text, gauge) => {
    const r = ok(text);
    expect(r.size).toMatchObject({ system: 'awg', gauge });
    expect(r.areaMm2).toBeCloseTo(awgAreaMm2(gauge), 12);
    expect(r.diameterMm).toBeCloseTo(awgDiameterMm(gauge), 12);
  });

  it('labels AWG sizes canonically', () => {
    expect(ok('0000 awg').size.label).toBe('4/0 AWG');
    expect(ok('18awg').size.label).toBe('18 AWG');
  });

  it.each([
    ['0.5 mm2', 0.5],
    ['0.75 mm²', 0.75],
    ['0,75 mm²', 0.75],
    ['1.5mm2', 1.5],
    ['2.5 MM2', 2.5],
    ['1 sq mm', 1],
    ['4 sq. mm', 4],
    ['6 mm^2', 6],
  ])('reads %j as %d mm²', (text, area) => {
    const r = ok(text);
    expect(r.size).toEqual({ system: 'metric', areaMm2: area, label: `${area} mm²` });
    expect(r.areaMm2).toBe(area);
    expect(r.diameterMm).toBeUndefined();
  });

  it.each([
    ['18', /no unit/],
    ['41 AWG', /AWG runs from/],
    ['18.5 AWG', /AWG runs from/],
    ['5/0 AWG', /AWG runs from/],
    ['00000 AWG', /AWG runs from/],
    ['0 mm2', /outside the metric sizes/],
    ['5000 mm2', /outside the metric sizes/],
    ['1.2.3 mm2', /readable number/],
    ['18 volts', /not AWG or mm²/],
    ['thick', /is not a wire size/],
    ['', /empty/],
  ])('refuses %j with a reason', (text, reason) => {
    const r = parseWireSize(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(reason);
  });

  it('refuses non-text and bare numbers', () => {
    expect(parseWireSize(18)).toMatchObject({
      ok: false,
      reason: expect.stringMatching(/no unit/),
    });
    expect(parseWireSize(null).ok).toBe(false);
    expect(parseWireSize({}).ok).toBe(false);
  });
});

describe('comparing and formatting', () => {
  const awg = (gauge: number): WireSize => ({ system: 'awg', gauge, label: '' });
  const mm = (areaMm2: number): WireSize => ({ system: 'metric', areaMm2, label: '' });

  it('orders by cross-section across systems', () => {
    expect(compareWireSizes(awg(18), awg(16))).toBe(-1);
    expect(compareWireSizes(awg(16), awg(18))).toBe(1);
    expect(compareWireSizes(awg(18), awg(18))).toBe(0);
    // 18 AWG is 0.823 mm², so 0.75 mm² is thinner and 1 mm² thicker.
    expect(compareWireSizes(mm(0.75), awg(18))).toBe(-1);
    expect(compareWireSizes(mm(1), awg(18))).toBe(1);
    expect(compareWireSizes(mm(awgAreaMm2(18)), awg(18))).toBe(0);
  });

  it('formats both systems', () => {
    expect(formatWireSize(awg(-3))).toBe('4/0 AWG');
    expect(formatWireSize(awg(18), { withArea: true })).toBe('18 AWG (0.823 mm²)');
    expect(formatWireSize(mm(0.75))).toBe('0.75 mm²');
  });

  it('finds the nearest and the smallest sufficient gauge', () => {
    expect(nearestAwg(0.823)).toBe(18);
    expect(nearestAwg(0.75)).toBe(18);
    // 1.5 mm² lies between 16 AWG (1.309) and 15 AWG (1.651), nearer 15 on a log scale.
    expect(nearestAwg(1.5)).toBe(15);
    expect(nearestAwg(2.5)).toBe(13);
    expect(nearestAwg(1e6)).toBe(-3);
    expect(nearestAwg(1e-9)).toBe(40);
    expect(smallestAwgAtLeast(0.75)).toBe(18);
    expect(smallestAwgAtLeast(0.83)).toBe(17);
    expect(smallestAwgAtLeast(awgAreaMm2(-3) * 1.01)).toBeUndefined();
  });
});
