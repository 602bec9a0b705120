/**
 * Cavity label schemes and label comparison.
 */

/**
 * Letters left out of lettered cavity sequences by default: I, O and Q look like 1, 0
 * and O on a moulded housing (common practice; housings differ, so it is a parameter).
 */
export const DEFAULT_LETTER_SKIP: readonly string[] = Object.freeze(['I', 'O', 'Q']);

/** Largest number of labels a scheme will generate; guards against runaway counts. */
export const MAX_CAVITIES = 10_000;

/** How an end's cavities are named. */
export type CavityScheme =
  | { kind: 'numeric'; count: number; start?: number }
  | { kind: 'letters'; count: number; skip?: readonly string[] }
  | { kind: 'custom'; labels: readonly string[] };

/** The form labels are compared in: trimmed and case-folded ("  a " equals "A"). */
export function normalizeCavityLabel(label: string | number): string {
  return String(label).trim().toLowerCase();
}

/** True when two labels name the same cavity. */
export function sameCavity(a: string | number, b: string | number): boolean {
  return normalizeCavityLabel(a) === normalizeCavityLabel(b);
}

function clampCount(count: number): number {
  if (!Number.isFinite(count) || count <= 0) return 0;
  return Math.min(MAX_CAVITIES, Math.floor(count));
}

/** "1".."n" (or from `start`). */
export function numericLabels(count: number, start = 1): string[] {
  const n = clampCount(count);
  const out = new Array<string>(n);
  for (let i = 0; i < n; i++) out[i] = String(start + i);
  return out;
}

/**
 * "A", "B", … skipping the letters in `skip`; past the last letter it continues with
 * two letters ("AA", "AB", …) drawn from the same alphabet, as large housings do.
 */
export function letterLabels(
  count: number,
  skip: readonly string[] = DEFAULT_LETTER_SKIP,
): string[] {
  const skipped = new Set(skip.map((s) => s.trim().toUpperCase()));
  const alphabet = [...'ABCDEFGHIJKLMNOPQRSTUVWXYZ'].filter((c) => !skipped.has(c));
  const n = clampCount(count);
  if (alphabet.length === 0) return [];
  const out: string[] = [];
  for (let i = 0; out.length < n; i++) {
    // Bijective base-k numbering: A..Z, AA..ZZ, AAA.. with k letters.
    let k = i + 1;
    let label = '';
    while (k > 0) {
      k -= 1;
      label = alphabet[k % alphabet.length] + label;
      k = Math.floor(k / alphabet.length);
    }
    out.push(label);
  }
  return out;
}

/**
 * Cleans a hand-written list: trims each label, drops blanks and drops repeats
 * (compared case-insensitively, first spelling kept).
 */
export function customLabels(labels: readonly (string | number)[]): string[] {
  const seen = new Set<string>();
  const out: string[] = [];
  for (const raw of labels) {
    const label = String(raw).trim();
    const key = label.toLowerCase();
    if (!label || seen.has(key)) continue;
    seen.add(key);
    out.push(label);
  }
  return out;
}

/** The labels a scheme produces. */
export function buildCavityLabels(scheme: CavityScheme): string[] {
  switch (scheme.kind) {
    case 'numeric':
      return numericLabels(scheme.count, scheme.start);
    case 'letters':
      return letterLabels(scheme.count, scheme.skip);
    case 'custom':
      return customLabels(scheme.labels);
  }
}

/**
 * An end's labels: its `cavities` list when it names at least one cavity (cleaned as
 * in {@link customLabels}), otherwise "1".."cavityCount", otherwise none. An empty list
 * beside a count is taken as a form not yet filled in, so the count still applies.
 */
export function endCavityLabels(end: {
  cavities?: readonly (string | number)[] | null;
  cavityCount?: number | null;
}): string[] {
  if (Array.isArray(end.cavities)) {
    const listed = customLabels(end.cavities);
    if (listed.length > 0) return listed;
  }
  if (typeof end.cavityCount === 'number') return numericLabels(end.cavityCount);
  return [];
}

/** Index from normalised label to the label as the end spells it. */
export function cavityIndex(labels: readonly string[]): Map<string, string> {
  const map = new Map<string, string>();
  for (const label of labels) {
    const key = normalizeCavityLabel(label);
    if (!map.has(key)) map.set(key, label);
  }
  return map;
}
