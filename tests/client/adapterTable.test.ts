// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { checkAdapter } from '../../shared/check';
import type { AdapterInput } from '../../shared/schemas/adapter';
import {
  applyPaste,
  canonicalJson,
  cellText,
  circuitToRow,
  csvToRows,
  emptyRow,
  moveRow,
  parseLengthCell,
  placeFindings,
  rowInUnits,
  rowToCircuit,
  rowsToCsv,
  splitLabels,
  type CircuitRow,
} from '../../src/components/adapter/circuitTable';
import { buildDiagram } from '../../src/components/adapter/diagramModel';
import { adapterFieldText } from '../../src/components/adapter/diffText';

const row = (cells: Partial<CircuitRow>): CircuitRow => ({ ...emptyRow(), ...cells });

describe('adapter table cells', () => {
  it('reads several cavities in a cell as a splice, in any common separator', () => {
    expect(splitLabels('3, 4')).toEqual(['3', '4']);
    expect(splitLabels(' A1+A2 ;a1 ')).toEqual(['A1', 'A2']);
    expect(splitLabels('')).toEqual([]);
  });

  it('reads lengths in the reader’s unit unless the cell names its own', () => {
    expect(parseLengthCell('250', 'metric')).toEqual({ ok: true, value: 250 });
    expect(parseLengthCell('10', 'imperial')).toEqual({ ok: true, value: 254 });
    expect(parseLengthCell('25 cm', 'imperial')).toEqual({ ok: true, value: 250 });
    expect(parseLengthCell('9.8"', 'metric')).toEqual({ ok: true, value: 248.92 });
    expect(parseLengthCell('0,5 m', 'metric')).toEqual({ ok: true, value: 500 });
    expect(parseLengthCell('long', 'metric').ok).toBe(false);
  });

  it('turns a row into a circuit of the check’s input, leaving blank cells out', () => {
    const c = rowToCircuit(
      row({
        id: 'c1',
        a: '3, 4',
        b: '2',
        role: 'ground',
        size: '1.5 mm2',
        length: '650',
        current: '6 A',
      }),
      'metric',
    );
    expect(c).toEqual({
      id: 'c1',
      a: ['3', '4'],
      b: ['2'],
      role: 'ground',
      size: '1.5 mm2',
      lengthMm: 650,
      currentA: 6,
    });
  });

  it('keeps a stored length exact while its cell is untouched, in either unit', () => {
    const r = circuitToRow({ a: ['1'], b: ['1'], lengthMm: 250 }, 'imperial');
    expect(r.length).toBe('9.84');
    expect(rowToCircuit(r, 'imperial').lengthMm).toBe(250);
    const back = rowInUnits(r, 'imperial', 'metric');
    expect(back.length).toBe('250');
    expect(rowToCircuit(back, 'metric').lengthMm).toBe(250);
    // Typed over, the new text counts.
    expect(rowToCircuit({ ...r, length: '10' }, 'imperial').lengthMm).toBe(254);
  });
});

describe('adapter table paste, moves and CSV', () => {
  it('fills from the focused cell across and down, adding rows, changing only touched rows', () => {
    const rows = [row({ a: '1' }), row({ a: '2' })];
    const out = applyPaste(rows, { row: 1, col: 1 }, [
      ['5', 'signal'],
      ['6', 'low reference'],
    ]);
    expect(out).toHaveLength(3);
    expect(out[0]).toBe(rows[0]);
    expect([out[1].a, out[1].b, out[1].role]).toEqual(['2', '5', 'signal']);
    expect([out[2].b, out[2].role]).toEqual(['6', 'low reference']);
  });

  it('moves a row up and down', () => {
    expect(moveRow(['a', 'b', 'c'], 0, 2)).toEqual(['b', 'c', 'a']);
    expect(moveRow(['a', 'b', 'c'], 2, 0)).toEqual(['c', 'a', 'b']);
  });

  it('round-trips the table through CSV with lengths stored in mm', () => {
    const rows = [
      row({ a: '1', b: '1', role: 'motor +', size: '14 AWG', color: 'GY', length: '12' }),
      row({ a: '3, 4', b: '3', termination: 'ring terminal, "M6"' }),
      emptyRow(),
    ];
    const csv = rowsToCsv(rows, 'imperial');
    expect(csv.split('\r\n')[0]).toBe(
      'end_a,end_b,role,size,color,length_mm,current_a,termination,note',
    );
    expect(csv).toContain('304.8');
    const back = csvToRows(csv, 'metric');
    expect(back.problems).toEqual([]);
    expect(back.rows).toHaveLength(2);
    expect(back.rows[0]).toMatchObject({ a: '1', role: 'motor +', length: '304.8' });
    expect(back.rows[1]).toMatchObject({ a: '3, 4', termination: 'ring terminal, "M6"' });
  });

  it('reads a CSV without a header in table order, and one with inches by its header', () => {
    expect(csvToRows('1,2,signal\n', 'metric').rows[0]).toMatchObject({
      a: '1',
      b: '2',
      role: 'signal',
    });
    const inches = csvToRows('End A,End B,Length (in)\n1,1,10\n', 'metric');
    expect(inches.rows[0].length).toBe('254');
  });

  it('compares content whatever its key order, ignoring empty values', () => {
    expect(canonicalJson({ b: 1, a: { d: null, c: [1, 2] } })).toBe(
      canonicalJson({ a: { c: [1, 2] }, b: 1 }),
    );
  });
});

describe('findings placed on the table', () => {
  const input = (circuits: AdapterInput['circuits']): AdapterInput => ({
    ends: {
      A: { cavityCount: 4, roles: { '1': 'signal' } },
      B: { cavityCount: 4, wireSize: { min: '22 AWG', max: '18 AWG' } },
    },
    circuits,
  });

  it('puts a reused cavity on both rows, in the end’s cavity cell', () => {
    const rows = [row({ a: '1', b: '1' }), row({ a: '2', b: '1' })];
    const report = checkAdapter(input(rows.map((r) => rowToCircuit(r, 'metric'))));
    const placed = placeFindings(report, rows);
    expect(placed.get(1)!.cells.b![0]).toMatchObject({
      severity: 'error',
      code: 'CAVITY_REUSED',
      text: 'Cavity 1 is also used by circuit 1: one terminal per cavity',
    });
    expect(placed.get(0)!.cells.b![0].text).toBe('Cavity 1 is also used by circuit 2');
    expect(placed.get(1)!.worst).toBe('error');
    expect(placed.get(1)!.cells.b![0].full).toMatch(/^Circuit 2 uses cavity 1 on end B/);
  });

  it('puts each finding in the cell its field names, and circuit-wide ones on the row', () => {
    const rows = [
      row({ a: '1', b: '2', role: 'ground', size: '12 AWG', color: 'plaid' }),
      row({ a: '3', b: '' }),
      row({ a: '', b: '' }),
      row({ a: '4', b: '4', termination: 'ring terminal to ground' }),
    ];
    const report = checkAdapter(input(rows.map((r) => rowToCircuit(r, 'metric'))));
    const placed = placeFindings(report, rows);
    const codes = (i: number, col: keyof CircuitRow) =>
      (placed.get(i)?.cells[col as 'a'] ?? []).map((m) => m.code);
    expect(codes(0, 'role')).toEqual(['ROLE_MISMATCH']);
    expect(codes(0, 'size')).toEqual(['SIZE_OUT_OF_RANGE']);
    expect(codes(0, 'color')).toEqual(['COLOR_UNKNOWN']);
    expect(codes(1, 'b')).toEqual(['OPEN_END']);
    expect(placed.get(2)!.row.map((m) => m.code)).toEqual(['EMPTY_CIRCUIT']);
    expect(codes(3, 'termination')).toEqual(['TERMINATED']);
    expect(placed.get(3)!.worst).toBe('note');
    expect(placed.get(0)!.cells.size![0].text).toBe('Thicker than end B takes (18 AWG)');
    expect(placed.get(0)!.cells.role![0].text).toBe('End A documents cavity 1 as "signal"');
  });

  it('adds the cells that never became values', () => {
    const rows = [row({ a: '1', b: '1', length: 'long' })];
    const report = checkAdapter(input([rowToCircuit(rows[0], 'metric')]));
    const placed = placeFindings(report, rows, new Map([[0, { length: 'Give a number.' }]]));
    expect(placed.get(0)!.cells.length![0]).toMatchObject({
      severity: 'warning',
      text: 'Not kept: Give a number.',
    });
  });

  it('words a voltage drop for a cell', () => {
    const text = cellText({
      code: 'VOLTAGE_DROP_HIGH',
      severity: 'warning',
      circuit: 0,
      field: 'size',
      message:
        'Circuit 1 loses 0.52 V (4.3 % of 12 V) carrying 10 A through 3000 mm of 18 AWG and back, more than the 3 % allowed for critical circuits. 14 AWG or thicker would stay within it.',
    });
    expect(text).toBe('Drops 0.52 V (4.3 %): 14 AWG or thicker keeps it within the limit');
  });
});

describe('the adapter diagram model', () => {
  const input: AdapterInput = {
    ends: {
      A: {
        label: 'Module plug',
        cavityCount: 4,
        sealed: true,
        view: 'wire-side',
        layout: { rows: 2, cols: 2 },
      },
      B: { label: 'Harness plug', cavities: ['A', 'B'], view: 'mating-face' },
    },
    circuits: [
      { a: ['1', '2'], b: ['A'], color: 'BK', size: '1 mm2' },
      { a: ['3'], b: [], termination: 'ring terminal to ground', color: 'GN/YE' },
      { a: ['4'], b: ['C'], color: 'WH' },
    ],
  };
  const report = checkAdapter(input);
  const model = buildDiagram(input, report);

  it('prints the view side on each end and draws the documented grid', () => {
    expect(model.ends.A.viewText).toBe('Viewed from: wire side');
    expect(model.ends.B.viewText).toBe('Viewed from: mating face');
    const c = model.ends.A.cavities;
    expect(c.map((x) => x.label)).toEqual(['1', '2', '3', '4']);
    expect(c[1].x).toBeGreaterThan(c[0].x);
    expect(c[2].y).toBeGreaterThan(c[0].y);
  });

  it('draws a splice as a join, a termination as a terminal, and marks unknown cavities', () => {
    const [spliced, terminated, stray] = model.wires;
    expect(spliced.joins).toHaveLength(1);
    // Two curves into the join, the track, and the curve into end B.
    expect(spliced.paths).toHaveLength(4);
    expect(spliced.label.text).toBe('1  BK  1 mm²');
    expect(terminated.terminals[0].text).toBe('ring terminal to ground');
    expect(terminated.paint.stripe).toBeDefined();
    expect(stray.strays[0].text).toBe('C?');
    expect(model.hasSplices && model.hasTerminals).toBe(true);
  });

  it('marks unused cavities, and plugs on a sealed end only', () => {
    const bUnused = model.ends.B.cavities.find((c) => c.label === 'B')!;
    expect(bUnused.unused).toBe(true);
    expect(bUnused.plug).toBe(false);
    expect(model.ends.A.cavities.every((c) => !c.unused)).toBe(true);
    expect(model.legend.map((l) => l.key)).toEqual(['wire', 'unused', 'splice', 'terminal']);
  });
});

describe('adapter fields in the review diff', () => {
  it('says what an end is in words', () => {
    expect(
      adapterFieldText('ends', {
        A: {
          label: 'Pump plug',
          connectorId: 7,
          cavities: ['1', '2'],
          sealed: true,
          view: 'mating-face',
        },
        B: { cavityCount: 6, wireSize: { min: '22 AWG', max: '14 AWG' } },
      }),
    ).toBe(
      'End A “Pump plug”: linked sheet 7, 2 cavities, sealed, viewed from mating face; End B: described here, 6 cavities, unsealed, viewed from side not stated, wire 22 AWG to 14 AWG',
    );
    expect(adapterFieldText('systemVoltage', 24)).toBe('24 V');
    expect(adapterFieldText('notes', 'x')).toBeNull();
  });
});
