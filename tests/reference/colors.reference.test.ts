import { describe, expect, it } from 'vitest';
import { WIRE_COLORS, parseWireColor } from '@shared/wire/colors';

// IEC 60757, code for designation of colours.
const IEC_60757 = {
  black: 'BK', // IEC 60757
  brown: 'BN', // IEC 60757
  red: 'RD', // IEC 60757
  orange: 'OG', // IEC 60757
  yellow: 'YE', // IEC 60757
  green: 'GN', // IEC 60757
  blue: 'BU', // IEC 60757
  violet: 'VT', // IEC 60757
  grey: 'GY', // IEC 60757
  white: 'WH', // IEC 60757
  pink: 'PK', // IEC 60757
  gold: 'GD', // IEC 60757
  turquoise: 'TQ', // IEC 60757
  silver: 'SR', // IEC 60757
  'green-and-yellow': 'GNYE', // IEC 60757
};

describe('colour codes against IEC 60757', () => {
  it('has exactly the standard’s codes', () => {
    expect(WIRE_COLORS.map((c) => c.code).sort()).toEqual(Object.values(IEC_60757).sort());
  });

  it.each(Object.entries(IEC_60757))('%s is %s', (name, code) => {
    const byName = parseWireColor(name);
    const byCode = parseWireColor(code);
    expect(byName.ok && byName.normalized).toBe(code);
    expect(byCode.ok && byCode.base.name).toBe(name);
  });

  it('writes a tracer after the base colour (common practice in vehicle wiring)', () => {
    // Common practice, no published source: GN/YE is green with a yellow tracer.
    const r = parseWireColor('GN/YE');
    expect(r.ok && [r.base.code, r.tracer?.code]).toEqual(['GN', 'YE']);
    // IEC 60757 itself concatenates: GNYE is the single green-and-yellow colour.
    const joined = parseWireColor('GNYE');
    expect(joined.ok && [joined.base.code, joined.tracer]).toEqual(['GNYE', undefined]);
  });
});
