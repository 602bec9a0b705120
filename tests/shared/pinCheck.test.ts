import { describe, expect, it } from 'vitest';
import {
  checkAdapter,
  checkParsedAdapter,
  normalizeRole,
  reverseEnds,
  severityOf,
  type CheckReport,
  type Finding,
} from '@shared/check';
import { checkReportSchema } from '@shared/schemas/adapter';

/** The worked example of the pin-check contract, as posted by outside checks. */
const workedExample = () => ({
  systemVoltage: 12,
  ends: {
    A: {
      label: '10-cavity pump module plug',
      cavities: ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10'],
      sealed: true,
      roles: { '1': 'motor +', '2': 'motor -' },
      wireSize: { min: '22 AWG', max: '18 AWG' },
    },
    B: { label: '7-cavity body harness plug', cavityCount: 7, sealed: false },
  },
  circuits: [
    {
      a: ['1'],
      b: ['1'],
      role: 'motor +',
      size: '18 AWG',
      color: 'RD/WH',
      lengthMm: 250,
      currentA: 3,
    } as Record<string, unknown>,
    { a: ['7'], b: [], termination: 'ring terminal to engine ground' } as Record<string, unknown>,
  ],
});

/** Two plain ends and any circuits: the smallest adapter a rule test needs. */
function adapter(circuits: unknown[], ends: Record<string, unknown> = {}) {
  return {
    ends: { A: { cavityCount: 4 }, B: { cavityCount: 4 }, ...ends },
    circuits,
  };
}

const codes = (fs: Finding[]) => fs.map((f) => f.code);
const only = (r: CheckReport, code: string) =>
  [...r.errors, ...r.warnings].filter((f) => f.code === code);

function expectReadable(r: CheckReport) {
  for (const f of [...r.errors, ...r.warnings]) {
    expect(f.message).toMatch(/^[A-Z"].*[.]$/s);
    expect(f.message).not.toMatch(/undefined|NaN|\[object/);
    expect(f.severity).toBe(severityOf(f.code));
  }
  expect(checkReportSchema.safeParse(r).success).toBe(true);
}

describe('the contract worked example', () => {
  const report = checkAdapter(workedExample());

  it('checks clean with the terminated circuit and the empty cavities as warnings', () => {
    expect(report.ok).toBe(true);
    expect(report.errors).toEqual([]);
    expect(report.warnings[0]).toMatchObject({ code: 'TERMINATED', circuit: 1, end: 'B' });
    const unusedA = only(report, 'CAVITY_UNUSED').filter((f) => f.end === 'A');
    expect(unusedA.map((f) => f.cavity)).toEqual(['2', '3', '4', '5', '6', '8', '9', '10']);
    expect(unusedA[0]).toMatchObject({ code: 'CAVITY_UNUSED', end: 'A', cavity: '2' });
    expect(
      codes(report.warnings).filter((c) => c !== 'CAVITY_UNUSED' && c !== 'TERMINATED'),
    ).toEqual([]);
    expectReadable(report);
  });

  it('gives the summary of the contract', () => {
    expect(report.summary).toEqual({
      circuits: 2,
      splices: 0,
      ends: {
        A: {
          cavities: 10,
          used: 2,
          unused: ['2', '3', '4', '5', '6', '8', '9', '10'],
          plugsNeeded: 8,
        },
        B: { cavities: 7, used: 1, unused: ['2', '3', '4', '5', '6', '7'], plugsNeeded: 0 },
      },
      landed: { A: 2, B: 1 },
    });
  });

  it('without the termination gives OPEN_END and COUNT_MISMATCH', () => {
    const input = workedExample();
    delete input.circuits[1].termination;
    const r = checkAdapter(input);
    expect(r.ok).toBe(false);
    expect(codes(r.errors).sort()).toEqual(['COUNT_MISMATCH', 'OPEN_END']);
    expect(only(r, 'OPEN_END')[0]).toMatchObject({ circuit: 1, end: 'B', field: 'b' });
    expect(only(r, 'COUNT_MISMATCH')[0].message).toMatch(
      /End A carries 2 circuits but end B carries 1/,
    );
    expect(only(r, 'TERMINATED')).toEqual([]);
    expectReadable(r);
  });
});

describe('errors', () => {
  it('END_MISSING for an absent end, an end without cavities, and no ends at all', () => {
    const absent = checkAdapter({ ends: { A: { cavityCount: 2 } }, circuits: [] });
    expect(absent.errors).toEqual([expect.objectContaining({ code: 'END_MISSING', end: 'B' })]);
    expect(absent.errors[0].message).toMatch(/End B is missing/);

    const empty = checkAdapter({
      ends: { A: { cavities: [], label: '2-cavity sensor plug' }, B: { cavityCount: 0 } },
    });
    expect(empty.errors.map((f) => f.end)).toEqual(['A', 'B']);
    expect(empty.errors[0].message).toMatch(/2-cavity sensor plug.*has no cavities/);

    const none = checkAdapter({});
    expect(codes(none.errors)).toEqual(['END_MISSING', 'END_MISSING']);
    expect(none.summary.circuits).toBe(0);
    expectReadable(none);
  });

  it('END_MISSING does not also call every cavity on that end unknown', () => {
    const r = checkAdapter({ ends: { A: { cavityCount: 2 } }, circuits: [{ a: ['1'], b: ['1'] }] });
    expect(codes(r.errors)).toEqual(['END_MISSING']);
  });

  it('CAVITY_UNKNOWN for a label the end does not have', () => {
    const r = checkAdapter(adapter([{ a: ['1'], b: ['9'] }]));
    expect(r.errors).toEqual([
      expect.objectContaining({
        code: 'CAVITY_UNKNOWN',
        circuit: 0,
        end: 'B',
        cavity: '9',
        field: 'b',
      }),
    ]);
    expect(r.errors[0].message).toBe(
      'Circuit 1 names cavity 9 on end B, but end B has no cavity with that label.',
    );
    expect(r.summary.ends.B.used).toBe(0);
  });

  it('compares labels trimmed and case-insensitively, and keeps the end’s spelling', () => {
    const r = checkAdapter({
      ends: { A: { cavities: ['A1', 'B1'] }, B: { cavities: ['x', 'y'] } },
      circuits: [
        { a: [' a1 '], b: ['X'] },
        { a: ['b1'], b: ['Y '] },
      ],
    });
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([]);
    expect(r.summary.ends.A).toEqual({ cavities: 2, used: 2, unused: [], plugsNeeded: 0 });
  });

  it('CAVITY_REUSED for one cavity in two circuits, with a message naming both', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'] },
        { a: ['2'], b: ['2'] },
        { a: ['3'], b: ['1'] },
      ]),
    );
    expect(r.errors).toEqual([
      expect.objectContaining({
        code: 'CAVITY_REUSED',
        circuit: 2,
        end: 'B',
        cavity: '1',
        field: 'b',
      }),
    ]);
    expect(r.errors[0].message).toBe(
      'Circuit 3 uses cavity 1 on end B, which is also used by circuit 1. A cavity holds one terminal; join wires with a splice inside one circuit instead.',
    );
  });

  it('a splice may name several cavities on one side without reuse', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1', '2'], b: ['1'] },
        { a: ['3'], b: ['2', '3', '4'] },
      ]),
    );
    expect(r.errors).toEqual([]);
    expect(r.summary.splices).toBe(2);
    expect(r.summary.landed).toEqual({ A: 2, B: 2 });
  });

  it('OPEN_END for a side with no cavity and no termination', () => {
    const r = checkAdapter(adapter([{ b: ['2'] }, { a: ['1'] }]));
    expect(only(r, 'OPEN_END')).toEqual([
      expect.objectContaining({ circuit: 0, end: 'A', field: 'a' }),
      expect.objectContaining({ circuit: 1, end: 'B', field: 'b' }),
    ]);
    // One lands only on A and one only on B: the counts agree, so no COUNT_MISMATCH.
    expect(only(r, 'COUNT_MISMATCH')).toEqual([]);
  });

  it('a blank termination is no termination', () => {
    const r = checkAdapter(adapter([{ a: ['1'], termination: '   ' }]));
    expect(codes(r.errors)).toEqual(['OPEN_END', 'COUNT_MISMATCH']);
  });

  it('EMPTY_CIRCUIT for a row with no cavity on either side', () => {
    const r = checkAdapter(
      adapter([
        { a: [], b: [] },
        { a: [' '], termination: 'to ground' },
      ]),
    );
    expect(r.errors).toEqual([
      expect.objectContaining({ code: 'EMPTY_CIRCUIT', circuit: 0 }),
      expect.objectContaining({ code: 'EMPTY_CIRCUIT', circuit: 1 }),
    ]);
    expect(r.errors[0].message).toMatch(/^Circuit 1 has no cavity on either end/);
  });

  it('COUNT_MISMATCH counts circuits with at least one cavity per end, leaving out terminated ones', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'] },
        { a: ['2'], b: [], termination: 'to chassis ground' },
        { a: ['3'] },
      ]),
    );
    expect(r.summary.landed).toEqual({ A: 3, B: 1 });
    const mismatch = only(r, 'COUNT_MISMATCH');
    expect(mismatch).toHaveLength(1);
    expect(mismatch[0].message).toMatch(/End A carries 2 circuits but end B carries 1/);
    expect(mismatch[0].circuit).toBeUndefined();
  });

  it('SIZE_UNREADABLE for a size that is present but cannot be read', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'], size: 'thick' },
        { a: ['2'], b: ['2'], size: 18 },
        { a: ['3'], b: ['3'], size: '' },
        { a: ['4'], b: ['4'], size: null },
      ]),
    );
    expect(r.errors).toEqual([
      expect.objectContaining({ code: 'SIZE_UNREADABLE', circuit: 0, field: 'size' }),
      expect.objectContaining({ code: 'SIZE_UNREADABLE', circuit: 1, field: 'size' }),
    ]);
    expect(r.errors[1].message).toMatch(/write it as "18 AWG" or "18 mm²"/);
  });
});

describe('warnings', () => {
  it('CAVITY_UNUSED per empty cavity, with plugs only on a sealed end', () => {
    const r = checkAdapter(
      adapter([{ a: ['1'], b: ['1'] }], { A: { cavityCount: 3, sealed: true } }),
    );
    expect(r.ok).toBe(true);
    expect(only(r, 'CAVITY_UNUSED').map((f) => `${f.end}${f.cavity}`)).toEqual([
      'A2',
      'A3',
      'B2',
      'B3',
      'B4',
    ]);
    expect(r.summary.ends.A.plugsNeeded).toBe(2);
    expect(r.summary.ends.B.plugsNeeded).toBe(0);
    expect(only(r, 'CAVITY_UNUSED')[0].message).toMatch(/sealed, so it needs a cavity plug/);
    expect(only(r, 'CAVITY_UNUSED')[2].message).not.toMatch(/plug/);
  });

  it('ROLE_MISMATCH between an end’s documented role and the circuit role', () => {
    const r = checkAdapter(
      adapter([{ a: ['1'], b: ['1'], role: 'signal' }], {
        A: { cavityCount: 1, roles: { '1': '5 V reference' } },
      }),
    );
    expect(only(r, 'ROLE_MISMATCH')).toEqual([
      expect.objectContaining({ circuit: 0, end: 'A', cavity: '1', field: 'role' }),
    ]);
    expect(only(r, 'ROLE_MISMATCH')[0].message).toBe(
      'Circuit 1 is a "signal" wire, but end A documents cavity 1 as "5 V reference".',
    );
  });

  it('ROLE_MISMATCH between the roles the two ends document for one circuit', () => {
    const r = checkAdapter({
      ends: {
        A: { cavities: ['A', 'B'], roles: { A: 'signal', B: 'low reference' } },
        B: { cavityCount: 2, roles: { '1': 'signal', '2': '5 V reference' } },
      },
      circuits: [
        { a: ['A'], b: ['1'] },
        { a: ['B'], b: ['2'] },
      ],
    });
    expect(only(r, 'ROLE_MISMATCH')).toEqual([
      expect.objectContaining({ circuit: 1, field: 'role' }),
    ]);
    expect(only(r, 'ROLE_MISMATCH')[0].message).toBe(
      'Circuit 2 joins cavity "B" on end A, documented as "low reference", to cavity 2 on end B, documented as "5 V reference".',
    );
  });

  it('compares roles ignoring case, spacing and the kind of minus sign', () => {
    expect(normalizeRole('Motor −')).toBe(normalizeRole('motor -'));
    expect(normalizeRole('motor-')).toBe(normalizeRole('  MOTOR   - '));
    expect(normalizeRole('motor +')).not.toBe(normalizeRole('motor -'));
    expect(normalizeRole('gnd')).not.toBe(normalizeRole('ground'));
    const r = checkAdapter(
      adapter([{ a: ['1'], b: ['1'], role: 'Motor −' }], {
        A: { cavityCount: 1, roles: { '1': 'motor -' } },
        B: { cavityCount: 1, roles: { '1': 'MOTOR-' } },
      }),
    );
    expect(r.warnings).toEqual([]);
  });

  it('SIZE_OUT_OF_RANGE against the end’s wire-size range, on the ends the circuit lands on', () => {
    const ends = {
      A: { cavityCount: 3, wireSize: { min: '22 AWG', max: '18 AWG' } },
      B: { cavityCount: 3, wireSize: { min: '0.5 mm2' } },
    };
    const r = checkAdapter(
      adapter(
        [
          { a: ['1'], b: ['1'], size: '16 AWG' },
          { a: ['2'], b: ['2'], size: '24 AWG' },
          { a: ['3'], b: ['3'], size: '0.75 mm²' },
        ],
        ends,
      ),
    );
    expect(only(r, 'SIZE_OUT_OF_RANGE').map((f) => [f.circuit, f.end])).toEqual([
      [0, 'A'],
      [1, 'A'],
      [1, 'B'],
    ]);
    expect(only(r, 'SIZE_OUT_OF_RANGE')[0].message).toMatch(
      /^Circuit 1 uses 16 AWG, thicker than the largest wire end A takes \(18 AWG\)/,
    );
  });

  it('SIZE_OUT_OF_RANGE reads a range written in gauge order, and ignores unreadable bounds', () => {
    const swapped = { A: { cavityCount: 1, wireSize: { min: '18 AWG', max: '22 AWG' } } };
    expect(
      only(
        checkAdapter(adapter([{ a: ['1'], b: ['1'], size: '20 AWG' }], swapped)),
        'SIZE_OUT_OF_RANGE',
      ),
    ).toEqual([]);
    const odd = { A: { cavityCount: 1, wireSize: { min: 'small', max: '22 AWG' } } };
    expect(
      only(
        checkAdapter(adapter([{ a: ['1'], b: ['1'], size: '20 AWG' }], odd)),
        'SIZE_OUT_OF_RANGE',
      ),
    ).toHaveLength(1);
  });

  it('VOLTAGE_DROP_HIGH above 3 % of the system voltage, giving volts and percent', () => {
    // 10 A over 1100 mm of 1 mm²: 10 × 0.017241 × 2.2 / 1 = 0.3793 V = 3.16 % of 12 V.
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'], size: '1 mm2', lengthMm: 1100, currentA: 10 },
        { a: ['2'], b: ['2'], size: '1 mm2', lengthMm: 1000, currentA: 10 },
        { a: ['3'], b: ['3'], size: '1 mm2', lengthMm: 1100 },
      ]),
    );
    const high = only(r, 'VOLTAGE_DROP_HIGH');
    expect(high).toEqual([expect.objectContaining({ circuit: 0, field: 'size' })]);
    expect(high[0].message).toMatch(/0\.38 V \(3\.2 % of 12 V\)/);
    expect(high[0].message).toMatch(/3 % allowed for critical circuits/);
    expect(high[0].message).toMatch(/16 AWG or thicker/);
  });

  it('VOLTAGE_DROP_HIGH follows systemVoltage', () => {
    const circuit = { a: ['1'], b: ['1'], size: '1 mm2', lengthMm: 1100, currentA: 10 };
    const at24 = checkAdapter({ ...adapter([circuit]), systemVoltage: 24 });
    expect(only(at24, 'VOLTAGE_DROP_HIGH')).toEqual([]);
    const at6 = checkAdapter({ ...adapter([circuit]), systemVoltage: 6 });
    expect(only(at6, 'VOLTAGE_DROP_HIGH')[0].message).toMatch(/6\.3 % of 6 V/);
  });

  it('COLOR_UNKNOWN for an unrecognised colour', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'], color: 'GN/YE' },
        { a: ['2'], b: ['2'], color: 'LTGRN' },
        { a: ['3'], b: ['3'], color: '' },
      ]),
    );
    expect(only(r, 'COLOR_UNKNOWN')).toEqual([
      expect.objectContaining({ circuit: 1, field: 'color' }),
    ]);
    expect(r.ok).toBe(true);
  });

  it('DUPLICATE_CIRCUIT for two circuits joining exactly the same cavities', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1', '2'], b: ['1'] },
        { a: ['3'], b: ['2'] },
        { a: ['2', '1'], b: ['1'] },
        { a: ['1'], b: ['1'] },
      ]),
    );
    expect(only(r, 'DUPLICATE_CIRCUIT')).toEqual([expect.objectContaining({ circuit: 2 })]);
    expect(only(r, 'DUPLICATE_CIRCUIT')[0].message).toMatch(
      /^Circuit 3 joins exactly the same cavities as circuit 1\./,
    );
    // The rows still reuse cavities, which is the error that blocks the build.
    expect(only(r, 'CAVITY_REUSED').length).toBeGreaterThan(0);
  });

  it('DUPLICATE_CIRCUIT names the first of several copies', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1', '2'], b: ['1'] },
        { a: ['1'], b: ['1'] },
        { a: ['1'], b: ['1'] },
      ]),
    );
    expect(only(r, 'DUPLICATE_CIRCUIT').map((f) => f.circuit)).toEqual([2]);
    expect(only(r, 'DUPLICATE_CIRCUIT')[0].message).toMatch(/as circuit 2\./);
  });

  it('TERMINATED for a circuit that leaves through a termination', () => {
    const r = checkAdapter(
      adapter([
        { a: ['1'], b: ['1'], termination: 'splice to the lamp feed' },
        { b: ['2'], termination: 'ring terminal to ground' },
      ]),
    );
    expect(only(r, 'TERMINATED')).toEqual([
      expect.objectContaining({ circuit: 0, field: 'termination' }),
      expect.objectContaining({ circuit: 1, end: 'A', field: 'termination' }),
    ]);
    expect(only(r, 'TERMINATED')[0].end).toBeUndefined();
    expect(r.ok).toBe(true);
  });
});

describe('shape and robustness', () => {
  it('accepts the editor’s extra fields', () => {
    const r = checkAdapter({
      ends: {
        A: {
          label: '3-cavity sensor plug',
          connectorId: 'c-17',
          view: 'wire-side',
          layout: { rows: 1, cols: 3 },
          cavityCount: 3,
        },
        B: { connectorId: 4, view: 'mating-face', cavities: ['A', 'B', 'C'] },
      },
      circuits: [
        {
          id: 'r1',
          a: '1',
          b: 'A',
          note: 'shielded',
          color: 'BK',
          role: 'signal',
          termination: null,
        },
        { id: 2, a: [2], b: ['b'], lengthMm: 0, currentA: 0 },
        { a: ['3'], b: ['C'], unknownExtra: { anything: true } },
      ],
      title: 'ignored',
    });
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([]);
  });

  it.each([
    ['a string body', 'not an adapter'],
    ['an array body', [1, 2]],
    ['circuits that are not a list', { circuits: 'many' }],
    ['a cavity list holding objects', { circuits: [{ a: [{ label: '1' }] }] }],
    ['a circuit that is not an object', { circuits: [null] }],
    ['a fractional cavity count', { ends: { A: { cavityCount: 2.5 } } }],
    ['a negative length', { circuits: [{ a: ['1'], lengthMm: -5 }] }],
    ['a sealed flag in words', { ends: { A: { sealed: 'yes' } } }],
    ['an unknown view', { ends: { B: { view: 'top' } } }],
  ])('reports INPUT_INVALID for %s', (_label, body) => {
    const r = checkAdapter(body);
    expect(r.ok).toBe(false);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0].code).toBe('INPUT_INVALID');
    expect(r.errors[0].message).toMatch(/^The adapter cannot be checked\. /);
  });

  it('points INPUT_INVALID at the circuit cell when it can', () => {
    const r = checkAdapter({ circuits: [{ a: ['1'] }, { a: ['1'], currentA: 'lots' }] });
    expect(r.errors[0]).toMatchObject({ code: 'INPUT_INVALID', circuit: 1, field: 'currentA' });
    expect(r.errors[0].message).toBe(
      'The adapter cannot be checked. circuits[1]: currentA must be a number.',
    );
  });

  it('gives the same report from the fast path and from a parsed body', () => {
    const raw = workedExample();
    expect(checkAdapter(raw)).toEqual(checkParsedAdapter(raw));
    // A class instance is left to the schema, which accepts it as an object.
    class Body {
      ends = raw.ends;
      circuits = raw.circuits;
    }
    expect(checkAdapter(new Body())).toEqual(checkAdapter(raw));
  });

  it('ignores roles keyed "__proto__" rather than failing', () => {
    const body = JSON.parse(
      '{"ends":{"A":{"cavityCount":1,"roles":{"__proto__":"signal","1":"signal"}},"B":{"cavityCount":1}},"circuits":[{"a":["1"],"b":["1"],"role":"signal"}]}',
    );
    const r = checkAdapter(body);
    expect(r.ok).toBe(true);
    expect(r.warnings).toEqual([]);
  });

  it('reverseEnds swaps the ends and each circuit’s sides, leaving the input alone', () => {
    const input = workedExample();
    const before = JSON.stringify(input);
    const reversed = reverseEnds(input);
    expect(JSON.stringify(input)).toBe(before);
    expect(reversed.ends.A).toBe(input.ends.B);
    expect(reversed.ends.B).toBe(input.ends.A);
    expect(reversed.circuits[1]).toEqual({
      a: [],
      b: ['7'],
      termination: 'ring terminal to engine ground',
    });
    expect(reverseEnds(reversed)).toEqual(input);
    expect(reverseEnds({ ends: { A: { cavityCount: 1 } } })).toEqual({
      ends: { B: { cavityCount: 1 } },
    });
    expect(reverseEnds(null)).toBeNull();
    expect(reverseEnds('x')).toBe('x');
  });

  it('is fast on 1 000 circuits', () => {
    const circuits = Array.from({ length: 1000 }, (_, i) => ({
      a: [String(i + 1)],
      b: [String(i + 1)],
      size: '18 AWG',
      color: 'RD',
      role: 'signal',
      lengthMm: 500,
      currentA: 1,
    }));
    const body = { ends: { A: { cavityCount: 1000 }, B: { cavityCount: 1000 } }, circuits };
    for (let i = 0; i < 20; i++) checkAdapter(body);
    const times: number[] = [];
    for (let i = 0; i < 21; i++) {
      const t0 = performance.now();
      checkAdapter(body);
      times.push(performance.now() - t0);
    }
    times.sort((x, y) => x - y);
    // Generous bound for a shared test machine; tests/bench measures properly.
    expect(times[10]).toBeLessThan(25);
  });
});
