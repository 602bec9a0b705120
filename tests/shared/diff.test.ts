import { describe, expect, it } from 'vitest';
import { diffRevisions, diffRows, diffText } from '../../shared/diff/revisions';

describe('diffText', () => {
  it('diffs by line with line numbers on both sides', () => {
    const d = diffText('one\ntwo\nthree', 'one\nTWO\nthree\nfour');
    expect(d).toMatchObject({ changed: true, added: 2, removed: 1 });
    expect(d.lines).toEqual([
      { type: 'same', text: 'one', oldLine: 1, newLine: 1 },
      { type: 'removed', text: 'two', oldLine: 2 },
      { type: 'added', text: 'TWO', newLine: 2 },
      { type: 'same', text: 'three', oldLine: 3, newLine: 3 },
      { type: 'added', text: 'four', newLine: 4 },
    ]);
  });

  it('treats CRLF and a missing last newline as the same text', () => {
    expect(diffText('a\r\nb\r\n', 'a\nb').changed).toBe(false);
    expect(diffText('', '')).toEqual({ changed: false, added: 0, removed: 0, lines: [] });
    expect(diffText('', 'new')).toMatchObject({ changed: true, added: 1, removed: 0 });
  });
});

describe('diffRows', () => {
  const key = (r: { cavity: string }) => r.cavity;

  it('pairs rows by key and names the changed cells', () => {
    const d = diffRows(
      [
        { cavity: '1', role: 'signal', color: 'GN' },
        { cavity: '2', role: 'ground', color: 'BK' },
        { cavity: '3', role: 'shield', color: '' },
      ],
      [
        { cavity: '1', role: 'signal', color: 'GN/YE' },
        { cavity: '3', role: 'shield' },
        { cavity: '4', role: 'unused', color: '' },
      ],
      key,
    );
    expect(d.map((r) => [r.key, r.status, r.changed])).toEqual([
      ['1', 'changed', ['color']],
      ['2', 'removed', []],
      ['3', 'same', []],
      ['4', 'added', []],
    ]);
    expect(d[1]).toMatchObject({ before: { cavity: '2' }, after: null });
  });

  it('keeps repeated keys apart and puts rows removed at the top first', () => {
    const d = diffRows(
      [{ cavity: 'X' }, { cavity: 'A' }, { cavity: 'A', role: 'x' }],
      [{ cavity: 'A' }, { cavity: 'A', role: 'y' }],
      key,
    );
    expect(d.map((r) => [r.key, r.status])).toEqual([
      ['X', 'removed'],
      ['A', 'same'],
      ['A#2', 'changed'],
    ]);
  });
});

describe('diffRevisions', () => {
  it('diffs a connector sheet: pin rows by cavity (case-insensitive), fields by value, notes by line', () => {
    const d = diffRevisions(
      'connector',
      {
        title: 'Pedal plug',
        content: {
          view: 'mating-face',
          tags: ['a'],
          pins: [{ cavity: 'a', role: 'signal' }],
          notes: 'x',
        },
      },
      {
        title: 'Pedal plug',
        content: {
          view: 'wire-side',
          tags: ['a'],
          pins: [
            { cavity: 'A', role: 'signal' },
            { cavity: 'B', role: 'ground' },
          ],
          notes: 'x\ny',
        },
      },
    );
    expect(d.hasPrevious).toBe(true);
    expect(d.changed).toBe(true);
    expect(d.title.changed).toBe(false);
    expect(d.fields).toEqual([{ field: 'view', before: 'mating-face', after: 'wire-side' }]);
    expect(d.rows.pins.map((r) => [r.key, r.status, r.changed])).toEqual([
      ['cavity:a', 'changed', ['cavity']],
      ['cavity:b', 'added', []],
    ]);
    expect(d.text.notes).toMatchObject({ changed: true, added: 1, removed: 0 });
  });

  it('shows everything as added when there is nothing to compare with', () => {
    const d = diffRevisions('connector', null, {
      title: 'New',
      content: { pins: [{ cavity: '1' }, { cavity: '2' }] },
    });
    expect(d.hasPrevious).toBe(false);
    expect(d.title).toEqual({ before: null, after: 'New', changed: true });
    expect(d.rows.pins.every((r) => r.status === 'added')).toBe(true);
  });

  it('reports no change for the same revision, and diffs a write-up body by line', () => {
    const same = { title: 'T', content: { pins: [{ cavity: '1', role: 'signal' }] } };
    expect(diffRevisions('connector', same, same).changed).toBe(false);
    const w = diffRevisions(
      'writeup',
      { title: 'W', content: { body: '# Steps\n1. Unplug' } },
      { title: 'W', content: { body: '# Steps\n1. Disconnect the battery\n2. Unplug' } },
    );
    expect(w.text.body).toMatchObject({ changed: true, added: 2, removed: 1 });
  });

  it('diffs adapter circuits row by row', () => {
    const d = diffRevisions(
      'adapter',
      { title: 'A', content: { circuits: [{ a: ['1'], b: ['1'] }] } },
      {
        title: 'A',
        content: {
          circuits: [
            { a: ['1'], b: ['2'] },
            { a: ['2'], b: ['3'] },
          ],
        },
      },
    );
    expect(d.rows.circuits.map((r) => [r.status, r.changed])).toEqual([
      ['changed', ['b']],
      ['added', []],
    ]);
  });
});
