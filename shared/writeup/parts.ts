/**
 * Totals of a write-up's parts list: each build option's cost as a range (the sum of the
 * low estimates to the sum of the high ones) and the difference between options. Prices
 * are the author's own estimates.
 */
import type { PartItem, PartsList } from '../schemas/writeup';

export interface PriceRange {
  low: number;
  high: number;
}

export interface OptionTotal extends PriceRange {
  id: string;
  name: string;
  /** Parts (rows) in this option. */
  parts: number;
}

export interface OptionDifference extends PriceRange {
  /** `to` costs `low`..`high` more than `from` (negative: less). */
  from: string;
  to: string;
  /** Parts only in `to`, and only in `from`: what the difference is made of. */
  added: string[];
  dropped: string[];
}

export interface PartsTotals {
  /** One per option; a list without options has one, "All parts". */
  options: OptionTotal[];
  /** Every pair of options, in order: B against A, C against A, C against B. */
  differences: OptionDifference[];
  /** Parts that no option includes (left out of every total). */
  unassigned: number[];
}

/** Id of the single option of a list that has none. */
export const ALL_PARTS = '__all';

const round2 = (v: number) => Math.round(v * 100) / 100;

/** One row's cost range: quantity times its unit price, low and high in order. */
export function itemRange(item: Pick<PartItem, 'quantity' | 'priceLow' | 'priceHigh'>): PriceRange {
  const q = Number.isFinite(item.quantity) ? Math.max(0, item.quantity) : 0;
  const a = Number.isFinite(item.priceLow) ? item.priceLow : 0;
  // An empty high price means the price is known exactly.
  const b = Number.isFinite(item.priceHigh) && item.priceHigh > 0 ? item.priceHigh : a;
  const [lo, hi] = a <= b ? [a, b] : [b, a];
  return { low: round2(q * lo), high: round2(q * hi) };
}

/**
 * Each option's total (low–high) and every pairwise difference. A difference is taken
 * at the low ends and at the high ends (so parts two options share cancel out), and
 * lists the parts that make it.
 */
export function partsTotals(parts: PartsList | null | undefined): PartsTotals {
  const items = parts?.items ?? [];
  const options = parts?.options?.length
    ? parts.options.map((o) => ({ id: o.id, name: o.name.trim() || o.id }))
    : [{ id: ALL_PARTS, name: 'All parts' }];
  const known = new Set(options.map((o) => o.id));
  const inOption = (item: PartItem, id: string) =>
    id === ALL_PARTS || (item.options ?? []).includes(id);

  const totals: OptionTotal[] = options.map((o) => {
    let low = 0;
    let high = 0;
    let count = 0;
    for (const item of items) {
      if (!inOption(item, o.id)) continue;
      const r = itemRange(item);
      low += r.low;
      high += r.high;
      count++;
    }
    return { ...o, low: round2(low), high: round2(high), parts: count };
  });

  const differences: OptionDifference[] = [];
  for (let i = 0; i < totals.length; i++) {
    for (let j = i + 1; j < totals.length; j++) {
      const a = totals[i];
      const b = totals[j];
      const name = (item: PartItem, k: number) => item.name.trim() || `part ${k + 1}`;
      differences.push({
        from: a.id,
        to: b.id,
        low: round2(b.low - a.low),
        high: round2(b.high - a.high),
        added: items.flatMap((it, k) =>
          inOption(it, b.id) && !inOption(it, a.id) ? [name(it, k)] : [],
        ),
        dropped: items.flatMap((it, k) =>
          inOption(it, a.id) && !inOption(it, b.id) ? [name(it, k)] : [],
        ),
      });
    }
  }

  const unassigned = known.has(ALL_PARTS)
    ? []
    : items.flatMap((it, k) => ((it.options ?? []).some((id) => known.has(id)) ? [] : [k]));
  return { options: totals, differences, unassigned };
}

/**
 * A price for display with the list's currency: "EUR 12.50" for a code, "$12.50" for a
 * sign, "12.50" without one. Whole amounts keep their cents so columns line up.
 */
export function formatPrice(value: number, currency?: string): string {
  const n = Math.abs(value).toFixed(2);
  const sign = value < 0 ? '−' : '';
  const c = (currency ?? '').trim();
  if (!c) return `${sign}${n}`;
  return /^[A-Za-z]{2,4}$/.test(c) ? `${sign}${c.toUpperCase()} ${n}` : `${sign}${c}${n}`;
}

/** A range for display: "EUR 12.00–15.50", or one price when low and high agree. */
export function formatRange(r: PriceRange, currency?: string): string {
  if (r.low === r.high) return formatPrice(r.low, currency);
  return `${formatPrice(r.low, currency)}–${formatPrice(r.high, currency).replace(/^[A-Z]{2,4} /, '')}`;
}

/**
 * A difference between two options for display: "+EUR 12.00–15.50" when both ends rise,
 * "−EUR 3.00–5.00" when both fall, "−EUR 2.00 to +EUR 3.00" when it depends on the prices.
 */
export function formatDifference(r: PriceRange, currency?: string): string {
  const plus = (v: number) => (v > 0 ? '+' : '') + formatPrice(v, currency);
  if (r.low === r.high) return r.low === 0 ? formatPrice(0, currency) : plus(r.low);
  if (r.low >= 0 && r.high >= 0) {
    const [a, b] = r.low <= r.high ? [r.low, r.high] : [r.high, r.low];
    return `+${formatRange({ low: a, high: b }, currency)}`;
  }
  if (r.low <= 0 && r.high <= 0) {
    const [a, b] = -r.low <= -r.high ? [-r.low, -r.high] : [-r.high, -r.low];
    return `−${formatRange({ low: a, high: b }, currency)}`;
  }
  const [a, b] = r.low <= r.high ? [r.low, r.high] : [r.high, r.low];
  return `${plus(a)} to ${plus(b)}`;
}
