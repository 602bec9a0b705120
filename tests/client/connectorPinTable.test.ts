// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import {
  applyPaste,
  csvToPins,
  emptyPin,
  isMultiCellPaste,
  moveFrom,
  parseClipboard,
  pinsToCsv,
  syncRowsToCavities,
  cellIssues,
  type PinRow,
} from '../../src/components/connector/pinTable';

const rows = (...cavities: string[]): PinRow[] => cavities.map((c) => emptyPin(c));

describe('pin table keyboard movement', () => {
  it('moves Enter down the same column', () => {
    expect(moveFrom({ row: 0, col: 2 }, 'Enter', 3)).toEqual({
      pos: { row: 1, col: 2 },
      append: false,
    });
  });

  it('asks for a new row when Enter is pressed on the last row', () => {
    expect(moveFrom({ row: 2, col: 1 }, 'Enter', 3)).toEqual({
      pos: { row: 3, col: 1 },
      append: true,
    });
  });

  it('moves Shift+Enter and ArrowUp up, stopping at the first row', () => {
    expect(moveFrom({ row: 2, col: 3 }, 'ShiftEnter', 3).pos).toEqual({ row: 1, col: 3 });
    expect(moveFrom({ row: 0, col: 3 }, 'ArrowUp', 3).pos).toEqual({ row: 0, col: 3 });
  });

  it('moves ArrowDown without adding rows', () => {
    expect(moveFrom({ row: 2, col: 0 }, 'ArrowDown', 3)).toEqual({
      pos: { row: 2, col: 0 },
      append: false,
    });
  });
});

describe('pin table paste', () => {
  it('reads tab-separated rows from a spreadsheet, dropping the trailing line break', () => {
    expect(parseClipboard('1\tsignal\tGN/YE\r\n2\tground\tBK\r\n')).toEqual([
      ['1', 'signal', 'GN/YE'],
      ['2', 'ground', 'BK'],
    ]);
  });

  it('honours spreadsheet quoting of a cell with a line break', () => {
    expect(parseClipboard('3\t"two\nlines"\tRD\n')).toEqual([['3', 'two\nlines', 'RD']]);
  });

  it('tells a multi-cell paste from a plain one', () => {
    expect(isMultiCellPaste('GN/YE')).toBe(false);
    expect(isMultiCellPaste('GN/YE\n')).toBe(false);
    expect(isMultiCellPaste('GN\tYE')).toBe(true);
    expect(isMultiCellPaste('a\nb')).toBe(true);
  });

  it('fills from the focused cell and adds rows as needed', () => {
    const before = rows('1', '2');
    const after = applyPaste(before, { row: 1, col: 1 }, [
      ['signal', 'GY', '20 AWG'],
      ['ground', 'BK', '18 AWG', 'c1', 'n', 'ignored'],
    ]);
    expect(before[1].role).toBe('');
    expect(after).toHaveLength(3);
    expect(after[1]).toMatchObject({ cavity: '2', role: 'signal', color: 'GY', size: '20 AWG' });
    expect(after[2]).toMatchObject({
      cavity: '',
      role: 'ground',
      color: 'BK',
      circuit: 'c1',
      note: 'n',
    });
  });
});

describe('pin table CSV', () => {
  it('exports and imports the same rows', () => {
    const table: PinRow[] = [
      {
        cavity: 'A',
        role: '5 V reference',
        color: 'GY',
        size: '20 AWG',
        circuit: '410',
        note: 'says "hi", ok',
      },
      {
        cavity: 'B',
        role: 'low reference',
        color: 'BK/WH',
        size: '0.5 mm²',
        circuit: '',
        note: '',
      },
    ];
    const csv = pinsToCsv(table);
    expect(csv.split('\r\n')[0]).toBe('cavity,role,color,size,circuit,note');
    expect(csvToPins(csv)).toEqual({ rows: table, problems: [] });
  });

  it('finds columns by their names in any order and reports the others', () => {
    const { rows: read, problems } = csvToPins('Wire colour,Cavity,Extra\nRD,1,x\n');
    expect(read).toEqual([{ ...emptyPin('1'), color: 'RD' }]);
    expect(problems).toEqual(['Columns left out: Extra.']);
  });

  it('takes the table order when there is no header row', () => {
    expect(csvToPins('1,signal,GN\n').rows[0]).toMatchObject({
      cavity: '1',
      role: 'signal',
      color: 'GN',
    });
  });
});

describe('pin table messages', () => {
  it('puts the shared findings beside the cell: colour, size, cavity not in the layout, repeats', () => {
    const table: PinRow[] = [
      { ...emptyPin('1'), role: 'signal', color: 'XX' },
      { ...emptyPin('2'), role: 'signal', size: '18' },
      { ...emptyPin('9'), role: 'signal' },
      { ...emptyPin('1'), role: 'ground' },
      { ...emptyPin('3'), role: 'ground', color: 'gn/ye', size: '0.75 mm2' },
    ];
    const { issues } = cellIssues(
      { cavityCount: 3, labels: 'numeric', view: 'mating-face', housing: 'pin' },
      table,
    );
    expect(issues.map((i) => [i.row, i.col]).sort()).toEqual(
      [
        [0, 'color'],
        [1, 'size'],
        [2, 'cavity'],
        [3, 'cavity'],
      ].sort(),
    );
    expect(issues.find((i) => i.row === 2)!.message).toMatch(/does not have/);
    expect(issues.find((i) => i.row === 3)!.message).toMatch(/described twice/);
    expect(issues.find((i) => i.row === 0)!.message).not.toMatch(/^Row/);
  });

  it('keeps typed rows when the layout shrinks and adds rows for new cavities', () => {
    const table: PinRow[] = [{ ...emptyPin('3'), role: 'signal' }, emptyPin('1'), emptyPin('4')];
    const synced = syncRowsToCavities(table, ['1', '2', '3']);
    expect(synced.map((r) => r.cavity)).toEqual(['1', '2', '3']);
    expect(synced[2].role).toBe('signal');
    const shrunk = syncRowsToCavities(synced, ['1', '2']);
    expect(shrunk.map((r) => r.cavity)).toEqual(['1', '2', '3']);
  });
});
