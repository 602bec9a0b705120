import { describe, expect, it } from 'vitest';
import {
  connectorCavityLabels,
  layoutCavities,
  layoutFromView,
  layoutGrid,
  mirrorLayout,
  mirrorPosition,
  otherView,
} from '../../shared/connector/layout';

describe('connectorCavityLabels', () => {
  it('uses the listed labels, else the count in the labelling scheme', () => {
    expect(connectorCavityLabels({ cavities: [' A', 'B', '', 'b', 'C'] })).toEqual(['A', 'B', 'C']);
    expect(connectorCavityLabels({ cavityCount: 4 })).toEqual(['1', '2', '3', '4']);
    expect(connectorCavityLabels({ cavityCount: 4, labels: 'numeric' })).toEqual([
      '1',
      '2',
      '3',
      '4',
    ]);
    // I and O are left out of lettered housings (common practice).
    expect(connectorCavityLabels({ cavityCount: 10, labels: 'alpha' })).toEqual([
      'A',
      'B',
      'C',
      'D',
      'E',
      'F',
      'G',
      'H',
      'J',
      'K',
    ]);
    expect(connectorCavityLabels({ cavities: [], cavityCount: 2 })).toEqual(['1', '2']);
    expect(connectorCavityLabels({})).toEqual([]);
  });
});

describe('layoutCavities', () => {
  it('fills a rows × cols grid row by row, left to right', () => {
    const l = layoutCavities({ cavityCount: 6, layout: { rows: 2, cols: 3 }, view: 'mating-face' });
    expect(l).toMatchObject({ rows: 2, cols: 3, view: 'mating-face', unplaced: [] });
    expect(layoutGrid(l)).toEqual([
      ['1', '2', '3'],
      ['4', '5', '6'],
    ]);
  });

  it('grows by rows when the grid is too small, and picks rows of up to eight with no layout', () => {
    expect(layoutGrid(layoutCavities({ cavityCount: 5, layout: { rows: 1, cols: 3 } }))).toEqual([
      ['1', '2', '3'],
      ['4', '5', ''],
    ]);
    const none = layoutCavities({ cavityCount: 10 });
    expect([none.rows, none.cols]).toEqual([2, 8]);
    expect(layoutCavities({ cavityCount: 3 })).toMatchObject({ rows: 1, cols: 3, view: null });
  });

  it('places labelled positions and reports the labels left without one', () => {
    const l = layoutCavities({
      cavities: ['A', 'B', 'C', 'D'],
      layout: {
        rows: 2,
        cols: 3,
        positions: [
          { label: 'A', row: 0, col: 0 },
          { label: 'b', row: 0, col: 2 },
          { label: 'C', row: 1, col: 1 },
          { label: 'Z', row: 1, col: 2 },
          { label: 'D', row: 1, col: 1 },
        ],
      },
    });
    expect(layoutGrid(l)).toEqual([
      ['A', '', 'B'],
      ['', 'C', ''],
    ]);
    expect(l.unplaced).toEqual(['D']);
  });
});

describe('the mirror between mating face and wire side', () => {
  it('maps column c to cols − 1 − c and keeps the row', () => {
    expect(mirrorPosition({ label: '1', row: 1, col: 0 }, 3)).toEqual({
      label: '1',
      row: 1,
      col: 2,
    });
    expect(mirrorPosition({ label: '2', row: 0, col: 1 }, 3)).toEqual({
      label: '2',
      row: 0,
      col: 1,
    });
    expect(otherView('mating-face')).toBe('wire-side');
    expect(otherView('wire-side')).toBe('mating-face');
  });

  it('gives the original 2 × 3 grid when mirrored twice', () => {
    const l = layoutCavities({ cavityCount: 6, layout: { rows: 2, cols: 3 }, view: 'mating-face' });
    const twice = mirrorLayout(mirrorLayout(l));
    expect(twice).toEqual(l);
    expect(layoutGrid(twice)).toEqual(layoutGrid(l));
  });

  it('puts each label where a person holding the connector sees it from the other side', () => {
    // Cavity 1 top left on the mating face is top right seen from the wire side.
    const face = layoutCavities({
      cavityCount: 6,
      layout: { rows: 2, cols: 3 },
      view: 'mating-face',
    });
    const wire = mirrorLayout(face);
    expect(wire.view).toBe('wire-side');
    expect(layoutGrid(wire)).toEqual([
      ['3', '2', '1'],
      ['6', '5', '4'],
    ]);
    expect(wire.cells.find((c) => c.label === '1')).toEqual({ label: '1', row: 0, col: 2 });
    expect(wire.cells.find((c) => c.label === '5')).toEqual({ label: '5', row: 1, col: 1 });
  });

  it('mirrors labelled positions within the full width, empty cells included', () => {
    const l = layoutCavities({
      cavities: ['A', 'B'],
      view: 'wire-side',
      layout: {
        rows: 1,
        cols: 4,
        positions: [
          { label: 'A', row: 0, col: 0 },
          { label: 'B', row: 0, col: 1 },
        ],
      },
    });
    expect(layoutGrid(mirrorLayout(l))).toEqual([['', '', 'B', 'A']]);
  });

  it('draws a sheet from a requested side: as documented, or mirrored', () => {
    const l = layoutCavities({ cavityCount: 3, layout: { rows: 1, cols: 3 }, view: 'wire-side' });
    expect(layoutGrid(layoutFromView(l, 'wire-side'))).toEqual([['1', '2', '3']]);
    expect(layoutGrid(layoutFromView(l, 'mating-face'))).toEqual([['3', '2', '1']]);
    const unknown = layoutCavities({ cavityCount: 3, layout: { rows: 1, cols: 3 } });
    expect(layoutGrid(layoutFromView(unknown, 'mating-face'))).toEqual([['1', '2', '3']]);
  });
});
