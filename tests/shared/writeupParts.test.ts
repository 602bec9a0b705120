import { describe, expect, it } from 'vitest';
import type { PartsList } from '@shared/schemas/writeup';
import {
  ALL_PARTS,
  formatDifference,
  formatPrice,
  formatRange,
  itemRange,
  partsTotals,
} from '@shared/writeup/parts';

const list: PartsList = {
  currency: 'EUR',
  options: [
    { id: 'a', name: 'Splice in the loom' },
    { id: 'b', name: 'Pigtail extension' },
    { id: 'c', name: 'New sub-harness' },
  ],
  items: [
    {
      name: 'Heat-shrink sleeves, pack',
      quantity: 1,
      priceLow: 4,
      priceHigh: 6,
      options: ['a', 'b', 'c'],
    },
    { name: 'Crimp splices', quantity: 6, priceLow: 0.25, priceHigh: 0.4, options: ['a', 'b'] },
    { name: 'Pigtail, 3-cavity', quantity: 1, priceLow: 12, priceHigh: 18, options: ['b'] },
    { name: '0.5 mm² wire, 5 m', quantity: 2, priceLow: 3, priceHigh: 5, options: ['a', 'b', 'c'] },
    { name: 'Sub-harness kit', quantity: 1, priceLow: 45, priceHigh: 70, options: ['c'] },
    { name: 'Spare terminals', quantity: 10, priceLow: 0.1, priceHigh: 0, options: [] },
  ],
};

describe('partsTotals', () => {
  const t = partsTotals(list);

  it('adds up each option from its low and its high estimates', () => {
    expect(t.options).toEqual([
      { id: 'a', name: 'Splice in the loom', low: 11.5, high: 18.4, parts: 3 },
      { id: 'b', name: 'Pigtail extension', low: 23.5, high: 36.4, parts: 4 },
      { id: 'c', name: 'New sub-harness', low: 55, high: 86, parts: 3 },
    ]);
  });

  it('gives the difference of every pair at both ends, and the parts that make it', () => {
    expect(t.differences).toEqual([
      { from: 'a', to: 'b', low: 12, high: 18, added: ['Pigtail, 3-cavity'], dropped: [] },
      {
        from: 'a',
        to: 'c',
        low: 43.5,
        high: 67.6,
        added: ['Sub-harness kit'],
        dropped: ['Crimp splices'],
      },
      {
        from: 'b',
        to: 'c',
        low: 31.5,
        high: 49.6,
        added: ['Sub-harness kit'],
        dropped: ['Crimp splices', 'Pigtail, 3-cavity'],
      },
    ]);
  });

  it('lists parts that no option includes', () => {
    expect(t.unassigned).toEqual([5]);
  });

  it('treats a list without options as one option of every part', () => {
    const one = partsTotals({ options: [], items: list.items.slice(0, 2) });
    expect(one.options).toEqual([
      { id: ALL_PARTS, name: 'All parts', low: 5.5, high: 8.4, parts: 2 },
    ]);
    expect(one.differences).toEqual([]);
    expect(one.unassigned).toEqual([]);
    expect(partsTotals(undefined).options[0]).toMatchObject({ low: 0, high: 0, parts: 0 });
  });

  it('reads a missing high price as exact, and a reversed range the right way round', () => {
    expect(itemRange({ quantity: 10, priceLow: 0.1, priceHigh: 0 })).toEqual({ low: 1, high: 1 });
    expect(itemRange({ quantity: 2, priceLow: 5, priceHigh: 3 })).toEqual({ low: 6, high: 10 });
    expect(itemRange({ quantity: 3, priceLow: 0.1, priceHigh: 0.2 })).toEqual({
      low: 0.3,
      high: 0.6,
    });
  });
});

describe('price formatting', () => {
  it('formats prices and ranges with a code or a sign', () => {
    expect(formatPrice(12.5, 'eur')).toBe('EUR 12.50');
    expect(formatPrice(12.5, '$')).toBe('$12.50');
    expect(formatPrice(3)).toBe('3.00');
    expect(formatRange({ low: 11.5, high: 18.4 }, 'EUR')).toBe('EUR 11.50–18.40');
    expect(formatRange({ low: 4, high: 4 }, '£')).toBe('£4.00');
  });

  it('formats differences with their direction', () => {
    expect(formatDifference({ low: 12, high: 18 }, 'EUR')).toBe('+EUR 12.00–18.00');
    expect(formatDifference({ low: -5, high: -3 }, 'EUR')).toBe('−EUR 3.00–5.00');
    expect(formatDifference({ low: -2, high: 3 }, '$')).toBe('−$2.00 to +$3.00');
    expect(formatDifference({ low: 0, high: 0 })).toBe('0.00');
  });
});
