import { describe, expect, it } from 'vitest';
import { emptyWire, type WireRunWire } from '@shared/schemas/writeup';
import { wireRunLine, wireRunTotals } from '@shared/writeup/wireRun';
import { awgAreaMm2 } from '@shared/wire/awg';

const wire = (over: Partial<WireRunWire>): WireRunWire => ({ ...emptyWire(), ...over });

describe('wireRunTotals', () => {
  const run = {
    systemVoltage: 12,
    wires: [
      wire({
        color: 'GN/YE',
        size: '0.5 mm²',
        role: 'signal',
        from: 'sensor',
        to: 'bracket',
        addedLengthMm: 350,
        join: 'crimped-splice',
        currentA: 0.01,
      }),
      wire({
        color: 'BN/WH',
        size: '0.5 mm2',
        role: 'low reference',
        from: 'sensor',
        to: 'bracket',
        addedLengthMm: 350,
        join: 'crimped-splice',
      }),
      wire({
        color: 'gn/ye',
        size: '0,5 mm²',
        role: 'signal',
        from: 'gauge',
        to: 'bracket',
        addedLengthMm: 200,
        join: 'soldered-sealed-splice',
        splices: 1,
      }),
      wire({
        color: 'RD',
        size: '14 AWG',
        role: 'battery feed',
        from: 'fuse box',
        to: 'pump relay',
        addedLengthMm: 1200,
        join: 'soldered-sealed-splice',
        currentA: 15,
      }),
      wire({
        color: 'BK',
        size: '14 AWG',
        role: 'ground',
        from: 'pump',
        to: 'chassis stud',
        addedLengthMm: 0,
        join: 'none',
      }),
      wire({
        color: 'BU',
        size: '20 AWG',
        role: 'signal',
        from: 'loom',
        to: 'loom',
        addedLengthMm: 150,
        join: 'none',
      }),
    ],
  };
  const t = wireRunTotals(run);

  it('adds up the length per size and colour, reading each spelling of a size or colour the same', () => {
    expect(t.bySizeAndColor).toEqual([
      { size: '14 AWG', color: 'RD', wires: 1, addedLengthMm: 1200 },
      { size: '20 AWG', color: 'BU', wires: 1, addedLengthMm: 150 },
      { size: '0.5 mm²', color: 'BN/WH', wires: 1, addedLengthMm: 350 },
      { size: '0.5 mm²', color: 'GN/YE', wires: 2, addedLengthMm: 550 },
    ]);
    // Thickest first: 20 AWG (0.518 mm²) is a little larger than 0.5 mm².
    expect(t.bySize).toEqual([
      { size: '14 AWG', wires: 1, addedLengthMm: 1200 },
      { size: '20 AWG', wires: 1, addedLengthMm: 150 },
      { size: '0.5 mm²', wires: 3, addedLengthMm: 900 },
    ]);
    expect(t.totalAddedMm).toBe(2250);
    expect(t.lengthened).toBe(5);
    expect(t.wires).toBe(6);
  });

  it('counts two splices per joined wire unless it says one, and one sleeve per splice (common practice)', () => {
    // Common practice: an inserted extension piece is joined at both ends; each splice gets one heat-shrink sleeve.
    expect(t.splices).toEqual({ crimped: 4, soldered: 3, total: 7 });
    expect(t.sleeves).toBe(7);
    expect(t.lines.map((l) => l.splices)).toEqual([2, 2, 1, 2, 0, 0]);
  });

  it('computes the drop across each lengthened wire with the shared copper resistance', () => {
    const feed = t.lines[3];
    // 15 A × (1/58 Ω·mm²/m × 1.2 m / 2.0820 mm²) = 0.1491 V
    const expected = (15 * (1 / 58) * 1.2) / awgAreaMm2(14);
    expect(feed.drop!.volts).toBeCloseTo(expected, 10);
    expect(feed.drop!.volts).toBeCloseTo(0.149, 3);
    expect(feed.drop!.percent).toBeCloseTo((expected / 12) * 100, 10);
    expect(t.worstDrop).toMatchObject({ index: 3 });
    // No current given, or nothing added: no drop.
    expect(t.lines[1].drop).toBeNull();
    expect(t.lines[4].drop).toBeNull();
    expect(t.dropLimitPercent).toBe(3);
  });

  it('keeps unknown sizes and colours as written and flags them', () => {
    const line = wireRunLine(wire({ size: 'thick', color: 'mauve', addedLengthMm: 10 }), 0, 12);
    expect(line).toMatchObject({
      size: 'thick',
      sizeOk: false,
      color: 'MAUVE',
      colorOk: false,
      drop: null,
    });
    const blank = wireRunLine(wire({ addedLengthMm: 10 }), 0, 12);
    expect(blank).toMatchObject({ size: 'size not given', color: 'colour not given' });
  });

  it('is empty for no wire run, and uses 12 V by default', () => {
    const none = wireRunTotals(undefined);
    expect(none).toMatchObject({
      wires: 0,
      totalAddedMm: 0,
      sleeves: 0,
      systemVoltage: 12,
      worstDrop: null,
    });
    expect(wireRunTotals({ wires: [] }).bySizeAndColor).toEqual([]);
  });

  it('judges drops against the system voltage given', () => {
    const long = {
      wires: [wire({ size: '22 AWG', color: 'RD', addedLengthMm: 5000, currentA: 5 })],
    };
    const at12 = wireRunTotals(long).lines[0].drop!;
    const at24 = wireRunTotals({ ...long, systemVoltage: 24 }).lines[0].drop!;
    expect(at24.volts).toBeCloseTo(at12.volts, 12);
    expect(at24.percent).toBeCloseTo(at12.percent / 2, 12);
  });
});
