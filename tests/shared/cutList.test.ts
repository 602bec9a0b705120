import { describe, expect, it } from 'vitest';
import { buildCutList } from '../../shared/adapter/cutList';
import type { AdapterInput } from '../../shared/schemas/adapter';

/** An 8-cavity sealed plug to a 6-cavity unsealed one, six circuits (common practice). */
function conversion(): AdapterInput {
  return {
    ends: {
      A: { label: '8-way sealed plug', cavityCount: 8, sealed: true },
      B: { label: '6-way plug', cavityCount: 6, sealed: false },
    },
    circuits: [1, 2, 3, 4, 5, 6].map((n) => ({
      a: [String(n)],
      b: [String(n)],
      size: n <= 2 ? '14 AWG' : '20 AWG',
      color: n === 1 ? 'GY' : n === 2 ? 'black' : 'gn/ye',
      lengthMm: 250,
    })),
  };
}

describe('buildCutList', () => {
  it('counts one terminal per used cavity, seals only on the sealed end, and plugs for its empty cavities', () => {
    const list = buildCutList(conversion());
    expect(list.ends.A).toMatchObject({
      label: '8-way sealed plug',
      sealed: true,
      cavities: 8,
      terminals: 6,
      seals: 6,
      plugs: 2,
      unused: ['7', '8'],
    });
    expect(list.ends.B).toMatchObject({
      sealed: false,
      cavities: 6,
      terminals: 6,
      seals: 0,
      plugs: 0,
    });
  });

  it('lists one wire per plain circuit with its length, size and colour in normalised form', () => {
    const list = buildCutList(conversion());
    expect(list.wires).toHaveLength(6);
    expect(list.wires[0]).toEqual({
      circuit: 0,
      kind: 'wire',
      from: 'A 1',
      to: 'B 1',
      lengthMm: 250,
      size: '14 AWG',
      areaMm2: expect.closeTo(2.08, 2),
      color: 'GY',
      role: '',
    });
    expect(list.wires[1].color).toBe('BK');
    expect(list.wires[2].color).toBe('GN/YE');
    expect(list.totalLengthMm).toBe(1500);
    expect(list.unmeasured).toBe(0);
  });

  it('totals wire by size and colour, thickest first', () => {
    const list = buildCutList(conversion());
    expect(list.bySizeAndColor).toEqual([
      { size: '14 AWG', color: 'BK', pieces: 1, lengthMm: 250, unmeasured: 0 },
      { size: '14 AWG', color: 'GY', pieces: 1, lengthMm: 250, unmeasured: 0 },
      { size: '20 AWG', color: 'GN/YE', pieces: 4, lengthMm: 1000, unmeasured: 0 },
    ]);
    expect(list.bySize).toEqual([
      { size: '14 AWG', color: null, pieces: 2, lengthMm: 500, unmeasured: 0 },
      { size: '20 AWG', color: null, pieces: 4, lengthMm: 1000, unmeasured: 0 },
    ]);
  });

  it('gives a splice its main wire and a pigtail cut to suit for every further cavity', () => {
    const list = buildCutList({
      ends: { A: { cavityCount: 4 }, B: { cavityCount: 2 } },
      circuits: [
        { a: ['3', '4'], b: ['2'], role: 'ground', size: '1.5 mm2', color: 'BK', lengthMm: 600 },
        { a: ['1'], b: ['1'], size: '0.5 mm²' },
      ],
    });
    expect(list.wires.map((w) => [w.kind, w.from, w.to, w.lengthMm])).toEqual([
      ['wire', 'A 3', 'B 2', 600],
      ['pigtail', 'A 4', 'splice of circuit 1', null],
      ['wire', 'A 1', 'B 1', null],
    ]);
    expect(list.splices).toEqual([{ circuit: 0, wires: 3 }]);
    expect(list.ends.A.terminals).toBe(3);
    expect(list.bySizeAndColor[0]).toEqual({
      size: '1.5 mm²',
      color: 'BK',
      pieces: 2,
      lengthMm: 600,
      unmeasured: 1,
    });
    expect(list.unmeasured).toBe(2);
    // A wire with no colour given is totalled under "no colour", not dropped.
    expect(list.bySizeAndColor[1]).toMatchObject({ size: '0.5 mm²', color: null, pieces: 1 });
  });

  it('runs a terminated wire to its termination and counts the fittings by kind', () => {
    const list = buildCutList({
      ends: { A: { cavities: ['A', 'B'], sealed: true }, B: { cavityCount: 1, sealed: true } },
      circuits: [
        { a: ['A'], b: ['1'], size: '10 AWG', color: 'RD', lengthMm: 600 },
        {
          a: ['B'],
          b: [],
          size: '10 AWG',
          color: 'BK',
          lengthMm: 400,
          termination: 'Ring terminal (M6) to the front ground stud',
        },
      ],
    });
    expect(list.wires[1]).toMatchObject({
      from: 'A B',
      to: 'Ring terminal (M6) to the front ground stud',
      lengthMm: 400,
    });
    expect(list.terminations).toEqual([
      { text: 'Ring terminal (M6) to the front ground stud', count: 1 },
    ]);
    expect(list.ends.A).toMatchObject({ terminals: 2, seals: 2, plugs: 0 });
    expect(list.ends.B).toMatchObject({ terminals: 1, seals: 1, plugs: 0 });
    expect(list.bySize).toEqual([
      { size: '10 AWG', color: null, pieces: 2, lengthMm: 1000, unmeasured: 0 },
    ]);
  });

  it('adds a pigtail for a circuit that lands on both ends and also leaves through a termination', () => {
    const list = buildCutList({
      ends: { A: { cavityCount: 1 }, B: { cavityCount: 1 } },
      circuits: [{ a: ['1'], b: ['1'], termination: 'ring terminal to ground', lengthMm: 100 }],
    });
    expect(list.wires.map((w) => [w.kind, w.from, w.to])).toEqual([
      ['wire', 'A 1', 'B 1'],
      ['pigtail', 'splice of circuit 1', 'ring terminal to ground'],
    ]);
    expect(list.splices).toEqual([{ circuit: 0, wires: 3 }]);
  });

  it('skips empty rows, keeps unreadable sizes as written, and does not count unknown cavities', () => {
    const list = buildCutList({
      ends: { A: { cavityCount: 2, sealed: true }, B: { cavityCount: 2, sealed: true } },
      circuits: [
        { a: [], b: [] },
        { a: ['1'], b: ['9'], size: 'thick', color: 'plaid' },
      ],
    });
    expect(list.wires).toHaveLength(1);
    expect(list.wires[0]).toMatchObject({ size: 'thick', areaMm2: null, color: 'plaid' });
    expect(list.ends.B).toMatchObject({ terminals: 0, seals: 0, plugs: 2 });
    expect(list.ends.A).toMatchObject({ terminals: 1, seals: 1, plugs: 1 });
  });

  it('uses a report it is given rather than checking again', () => {
    const input = conversion();
    const list = buildCutList(input, {
      ok: true,
      errors: [],
      warnings: [],
      summary: {
        circuits: 6,
        splices: 0,
        landed: { A: 6, B: 6 },
        ends: {
          A: { cavities: 10, used: 6, unused: ['7', '8', '9', '10'], plugsNeeded: 4 },
          B: { cavities: 6, used: 6, unused: [], plugsNeeded: 0 },
        },
      },
    });
    expect(list.ends.A.plugs).toBe(4);
  });
});
