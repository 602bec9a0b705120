import { describe, expect, it } from 'vitest';
import {
  DEFAULT_LETTER_SKIP,
  MAX_CAVITIES,
  buildCavityLabels,
  cavityIndex,
  customLabels,
  endCavityLabels,
  letterLabels,
  normalizeCavityLabel,
  numericLabels,
  sameCavity,
} from '@shared/wire/cavities';

describe('cavity labels', () => {
  it('numbers from 1, or from another start', () => {
    expect(numericLabels(4)).toEqual(['1', '2', '3', '4']);
    expect(numericLabels(3, 0)).toEqual(['0', '1', '2']);
    expect(numericLabels(0)).toEqual([]);
    expect(numericLabels(-2)).toEqual([]);
    expect(numericLabels(MAX_CAVITIES + 5)).toHaveLength(MAX_CAVITIES);
  });

  it('letters skip I, O and Q by default', () => {
    expect(DEFAULT_LETTER_SKIP).toEqual(['I', 'O', 'Q']);
    const labels = letterLabels(23);
    expect(labels.join('')).toBe('ABCDEFGHJKLMNPRSTUVWXYZ');
    expect(letterLabels(25).slice(-2)).toEqual(['AA', 'AB']);
  });

  it('letters take a different skip list', () => {
    expect(letterLabels(10, [])).toEqual([...'ABCDEFGHIJ']);
    expect(letterLabels(5, ['b', 'd'])).toEqual(['A', 'C', 'E', 'F', 'G']);
    expect(letterLabels(3, [...'ABCDEFGHIJKLMNOPQRSTUVWXYZ'])).toEqual([]);
  });

  it('cleans custom lists', () => {
    expect(customLabels([' A1 ', 'a1', 'B1', '', '  ', 3])).toEqual(['A1', 'B1', '3']);
  });

  it('builds every scheme', () => {
    expect(buildCavityLabels({ kind: 'numeric', count: 2 })).toEqual(['1', '2']);
    expect(buildCavityLabels({ kind: 'letters', count: 9 })).toEqual([...'ABCDEFGHJ']);
    expect(buildCavityLabels({ kind: 'custom', labels: ['X', 'Y'] })).toEqual(['X', 'Y']);
  });

  it('reads an end from its list or its count', () => {
    expect(endCavityLabels({ cavities: ['A', 'B'] })).toEqual(['A', 'B']);
    expect(endCavityLabels({ cavityCount: 3 })).toEqual(['1', '2', '3']);
    expect(endCavityLabels({ cavities: ['A'], cavityCount: 3 })).toEqual(['A']);
    expect(endCavityLabels({ cavities: [], cavityCount: 2 })).toEqual(['1', '2']);
    expect(endCavityLabels({})).toEqual([]);
  });

  it('compares trimmed and case-insensitively', () => {
    expect(normalizeCavityLabel('  a1 ')).toBe('a1');
    expect(normalizeCavityLabel(7)).toBe('7');
    expect(sameCavity(' B ', 'b')).toBe(true);
    expect(sameCavity('1', '01')).toBe(false);
    const index = cavityIndex(['A', 'b', 'a']);
    expect(index.get('a')).toBe('A');
    expect(index.size).toBe(2);
  });
});
