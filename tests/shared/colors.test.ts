import { describe, expect, it } from 'vitest';
import {
  WIRE_COLORS,
  colorByCode,
  contrastRatio,
  describeWireColor,
  needsOutline,
  outlineColor,
  parseWireColor,
  relativeLuminance,
} from '@shared/wire/colors';

function norm(text: string): string {
  const r = parseWireColor(text);
  if (!r.ok) throw new Error(`expected ${text} to parse: ${r.reason}`);
  return r.normalized;
}

describe('parseWireColor', () => {
  it.each(WIRE_COLORS.map((c) => [c.code, c.name]))('reads code %s and name %s', (code, name) => {
    expect(norm(code)).toBe(code);
    expect(norm(code.toLowerCase())).toBe(code);
    expect(norm(name)).toBe(code);
    expect(norm(name.toUpperCase())).toBe(code);
  });

  it('reads the alternative English spellings', () => {
    expect(norm('purple')).toBe('VT');
    expect(norm('gray')).toBe('GY');
    expect(norm('green-yellow')).toBe('GNYE');
    expect(norm('green and yellow')).toBe('GNYE');
  });

  it('reads base/tracer in codes, names and mixtures', () => {
    expect(norm('GN/YE')).toBe('GN/YE');
    expect(norm('gn / ye')).toBe('GN/YE');
    expect(norm('green/yellow')).toBe('GN/YE');
    expect(norm('Red/White')).toBe('RD/WH');
    expect(norm('BK/white')).toBe('BK/WH');
    const r = parseWireColor('GN/YE');
    expect(r.ok && r.base.name).toBe('green');
    expect(r.ok && r.tracer?.name).toBe('yellow');
  });

  it('reads a hyphen or no separator between two codes as base/tracer', () => {
    expect(norm('GN-YE')).toBe('GN/YE');
    expect(norm('rd - wh')).toBe('RD/WH');
    expect(norm('RDWH')).toBe('RD/WH');
    // GNYE stays the single two-colour insulation of the standard.
    expect(norm('GNYE')).toBe('GNYE');
  });

  it.each(['', 'LTGRN', 'sky', 'RD/WH/BK', 'RD/RD', 'XX-YY', 'RD/', 'QQRD', 'green-red'])(
    'refuses %j',
    (text) => {
      const r = parseWireColor(text);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.reason.length).toBeGreaterThan(10);
    },
  );

  it('refuses non-text', () => {
    expect(parseWireColor(5).ok).toBe(false);
    expect(parseWireColor(undefined).ok).toBe(false);
  });
});

describe('colour data and drawing', () => {
  it('has the fifteen colours with valid distinct display values', () => {
    expect(WIRE_COLORS).toHaveLength(15);
    for (const c of WIRE_COLORS) expect(c.hex).toMatch(/^#[0-9a-f]{6}$/);
    const solid = WIRE_COLORS.filter((c) => c.code !== 'GNYE').map((c) => c.hex);
    expect(new Set(solid).size).toBe(solid.length);
    expect(colorByCode('gnye')?.stripeHex).toBe(colorByCode('YE')?.hex);
  });

  it('describes colours in words', () => {
    expect(describeWireColor(colorByCode('GN')!, colorByCode('YE'))).toBe(
      'green with a yellow tracer',
    );
    expect(describeWireColor(colorByCode('RD')!)).toBe('red');
  });

  it('computes WCAG luminance and contrast', () => {
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 12);
    expect(relativeLuminance('#000')).toBe(0);
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 9);
    expect(contrastRatio('#777777', '#777777')).toBe(1);
  });

  it('outlines yellow and white on a light page, not black or blue', () => {
    expect(needsOutline(colorByCode('YE')!.hex)).toBe(true);
    expect(needsOutline(colorByCode('WH')!.hex)).toBe(true);
    expect(needsOutline(colorByCode('BK')!.hex)).toBe(false);
    expect(needsOutline(colorByCode('BU')!.hex)).toBe(false);
    expect(outlineColor(colorByCode('YE')!.hex)).toBe('#3c3c3c');
    expect(outlineColor(colorByCode('BK')!.hex)).toBeUndefined();
    // On a graphite background it is black that needs the (light) outline.
    expect(outlineColor(colorByCode('BK')!.hex, '#2b2b2b')).toBe('#e6e6e0');
  });
});
