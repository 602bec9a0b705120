import { describe, expect, it } from 'vitest';
import { connectorCautions, connectorFindings } from '../../shared/connector/findings';
import type { ConnectorContent } from '../../shared/schemas/connector';

const codes = (list: Array<{ code: string }>) => list.map((f) => f.code);

const clean: ConnectorContent = {
  cavities: ['A', 'B', 'C'],
  layout: { rows: 1, cols: 3 },
  housing: 'socket',
  view: 'wire-side',
  wireSize: { min: '22 AWG', max: '18 AWG' },
  component: 'coolant temperature sensor',
  pins: [
    { cavity: 'A', role: '5 V reference', color: 'GY', size: '20 AWG' },
    { cavity: 'B', role: 'signal', color: 'GN/YE', size: '20 AWG' },
    { cavity: 'C', role: 'low reference', color: 'BK/WH', size: '0.5 mm²' },
  ],
};

describe('connectorFindings', () => {
  it('finds nothing on a complete three-wire sensor sheet', () => {
    const f = connectorFindings(clean);
    expect(f).toMatchObject({ ok: true, errors: [], warnings: [], cautions: [] });
    expect(f.summary).toEqual({ cavities: 3, documented: 3, undocumented: [] });
  });

  it('asks for the view side and the housing', () => {
    const f = connectorFindings({ ...clean, view: '', housing: null });
    expect(codes(f.errors)).toEqual(['VIEW_MISSING']);
    expect(codes(f.warnings)).toEqual(['HOUSING_MISSING']);
    expect(f.ok).toBe(false);
  });

  it('finds unknown, repeated and missing cavities in the pin table, with the row and field', () => {
    const f = connectorFindings({
      ...clean,
      pins: [
        { cavity: 'A', role: 'signal' },
        { cavity: 'a', role: 'ground' },
        { cavity: 'D', role: 'signal' },
        { cavity: '', role: 'shield' },
        { cavity: '', role: '', color: '', size: '' },
      ],
    });
    expect(codes(f.errors)).toEqual([
      'PIN_CAVITY_REPEATED',
      'PIN_CAVITY_UNKNOWN',
      'PIN_CAVITY_MISSING',
    ]);
    expect(f.errors[0]).toMatchObject({ row: 1, field: 'cavity', cavity: 'a' });
    expect(f.errors[1]).toMatchObject({ row: 2, cavity: 'D' });
    expect(f.errors[1].message).toContain('A, B, C');
    expect(codes(f.warnings)).toEqual(['CAVITY_UNDOCUMENTED']);
    expect(f.summary.undocumented).toEqual(['B', 'C']);
  });

  it('reports repeated labels in the cavity list', () => {
    expect(codes(connectorFindings({ ...clean, cavities: ['A', 'B', 'a', 'C'] }).errors)).toEqual([
      'CAVITY_DUPLICATE',
    ]);
  });

  it('warns about unknown colours, errs on unreadable sizes, warns outside the wire-size range', () => {
    const f = connectorFindings({
      ...clean,
      pins: [
        { cavity: 'A', role: 'signal', color: 'GN/ZZ', size: '20 AWG' },
        { cavity: 'B', role: 'signal', color: 'green/yellow', size: '20' },
        { cavity: 'C', role: 'signal', color: 'RD', size: '14 AWG' },
      ],
    });
    expect(codes(f.errors)).toEqual(['SIZE_UNREADABLE']);
    expect(f.errors[0]).toMatchObject({ row: 1, field: 'size' });
    expect(codes(f.warnings)).toEqual(['COLOR_UNKNOWN', 'SIZE_OUT_OF_RANGE']);
    expect(f.warnings[0]).toMatchObject({ row: 0, field: 'color' });
    expect(f.warnings[1]).toMatchObject({ row: 2 });
  });

  it('notices a wire-size range written backwards or unreadable', () => {
    expect(
      codes(connectorFindings({ ...clean, wireSize: { min: '18 AWG', max: '22 AWG' } }).warnings),
    ).toEqual(['WIRE_RANGE_INVERTED']);
    expect(
      codes(connectorFindings({ ...clean, wireSize: { min: 'fine', max: '' } }).warnings),
    ).toEqual(['WIRE_RANGE_UNREADABLE']);
  });

  it('asks for a role per cavity and the layout to fit', () => {
    const f = connectorFindings({
      ...clean,
      layout: { rows: 1, cols: 2 },
      pins: [...clean.pins!.slice(0, 2), { cavity: 'C' }],
    });
    expect(codes(f.warnings)).toEqual(['ROLE_MISSING', 'LAYOUT_TOO_SMALL']);
  });

  it('reports positions that name unknown cavities, share a cell or leave one out', () => {
    const f = connectorFindings({
      ...clean,
      layout: {
        rows: 1,
        cols: 3,
        positions: [
          { label: 'A', row: 0, col: 0 },
          { label: 'B', row: 0, col: 0 },
          { label: 'X', row: 0, col: 2 },
        ],
      },
    });
    expect(codes(f.warnings)).toEqual(['POSITION_PROBLEM']);
    expect(f.warnings[0].message).toMatch(/"X" is not one of the cavities/);
    expect(f.warnings[0].message).toMatch(/share row 1, column 1/);
    expect(f.warnings[0].message).toMatch(/B, C have no position/);
  });

  it('needs cavities', () => {
    expect(codes(connectorFindings({ view: 'wire-side', housing: 'pin' }).errors)).toEqual([
      'NO_CAVITIES',
    ]);
  });
});

describe('connectorCautions', () => {
  it('names battery, airbag, fuel and high-current circuits', () => {
    expect(connectorCautions({ pins: [{ cavity: '1', role: 'battery feed' }] })).toEqual([
      'battery',
    ]);
    expect(
      connectorCautions({ pins: [{ cavity: '1', role: 'signal', note: 'SRS squib loop' }] }),
    ).toEqual(['airbag']);
    expect(connectorCautions({ component: 'airbag control module', pins: [] })).toEqual(['airbag']);
    expect(connectorCautions({ component: '10-cavity fuel pump module plug', pins: [] })).toEqual([
      'fuel',
    ]);
    expect(connectorCautions({ pins: [{ cavity: '1', role: 'motor +', size: '12 AWG' }] })).toEqual(
      ['high-current'],
    );
    expect(connectorCautions({ pins: [{ cavity: '1', role: 'motor +', size: '4 mm²' }] })).toEqual([
      'high-current',
    ]);
    expect(connectorCautions({ pins: [{ cavity: '1', role: 'motor +', size: '14 AWG' }] })).toEqual(
      [],
    );
    expect(
      connectorCautions({
        component: 'injector',
        pins: [
          { cavity: '1', role: 'battery feed', size: '10 AWG' },
          { cavity: '2', role: 'air bag' },
        ],
      }),
    ).toEqual(['airbag', 'fuel', 'battery', 'high-current']);
  });

  it('stays quiet for ordinary sensor circuits', () => {
    expect(
      connectorCautions({ component: 'coolant temperature sensor', pins: clean.pins }),
    ).toEqual([]);
    expect(connectorCautions({ pins: [{ cavity: '1', role: 'switched ignition feed' }] })).toEqual(
      [],
    );
  });
});
