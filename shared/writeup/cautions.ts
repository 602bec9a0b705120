/**
 * The caution check of a write-up: when the text mentions fuel, airbag (SRS) circuits,
 * battery feeds or high current, a caution block of that kind must be in it. Mentions
 * inside caution blocks do not count (a fuel caution that says "disconnect the battery"
 * does not ask for a battery caution too). The author sees the findings while typing;
 * the moderator sees the same ones on the review page.
 */
import type { WireRun } from '../schemas/writeup';
import { outlineBody, type BodyOutline, type WriteupCautionKind } from './markdown';

/** The kinds the check asks for; the others (general, heat) are the author's choice. */
export type CheckedCautionKind = 'fuel' | 'airbag' | 'battery' | 'high-current';

/** A circuit carrying this much current or more counts as high current (our threshold). */
export const HIGH_CURRENT_A = 15;

const PATTERNS: Record<Exclude<CheckedCautionKind, 'high-current'>, RegExp> = {
  fuel: /\b(?:fuel|petrol|gasoline|diesel|injectors?)\b/i,
  airbag:
    /\b(?:air ?bags?|srs|supplemental restraints?|(?:seat ?belt )?pretensioners?|clock ?springs?)\b/i,
  battery:
    /(?:\bbattery[ -](?:feeds?|supply|positive|cables?|leads?|terminals?|posts?)|\bB\+|\bpermanent(?:ly)? (?:live|feeds?)|\bunswitched (?:feeds?|supply)|\bconstant (?:feeds?|power)|\bunfused\b)/i,
};
const HIGH_CURRENT_WORDS =
  /(?:\bhigh[ -]current\b|\bstarter (?:motors?|cables?|feeds?)|\balternator (?:output|cables?|feeds?)|\bglow ?plugs?\b|\bmaxi[ -]?fuses?\b|\bmega[ -]?fuses?\b|\bfusible links?\b)/i;
// A current in amperes: "20 A", "40A", "15 amps" (case matters: "20 a" is not a current).
const HIGH_CURRENT_AMPS = /\b(\d{1,4}(?:[.,]\d+)?) ?(?:A|amps?|amperes?)\b/g;

const KIND_WORDS: Record<CheckedCautionKind, string> = {
  fuel: 'the fuel system',
  airbag: 'airbag (SRS) circuits',
  battery: 'a battery feed',
  'high-current': 'high current',
};

export const CHECKED_CAUTION_KINDS: readonly CheckedCautionKind[] = [
  'fuel',
  'airbag',
  'battery',
  'high-current',
];

/** Where the text first mentions something that needs a caution. */
export interface CautionMention {
  kind: CheckedCautionKind;
  /** The words that matched, as written. */
  match: string;
  /** 1-based line of the body, or 0 for the wire run. */
  line: number;
  where: 'body' | 'wireRun';
}

/** One finding of the caution check. */
export interface CautionFinding {
  code: 'CAUTION_MISSING';
  severity: 'warning';
  kind: CheckedCautionKind;
  field: 'body';
  line: number;
  message: string;
}

function firstMatch(kind: CheckedCautionKind, text: string): string | null {
  if (kind !== 'high-current') return PATTERNS[kind].exec(text)?.[0] ?? null;
  const words = HIGH_CURRENT_WORDS.exec(text);
  if (words) return words[0];
  for (const m of text.matchAll(HIGH_CURRENT_AMPS))
    if (Number(m[1].replace(',', '.')) >= HIGH_CURRENT_A) return m[0];
  return null;
}

/**
 * What the write-up mentions that needs a caution: the first mention of each kind in the
 * prose (outside caution blocks), then the wire run's roles and currents.
 */
export function cautionMentions(
  content: { body?: string; wireRun?: WireRun | null },
  outline: BodyOutline = outlineBody(content.body ?? ''),
): CautionMention[] {
  const found = new Map<CheckedCautionKind, CautionMention>();
  for (const { text, line } of outline.text) {
    for (const kind of CHECKED_CAUTION_KINDS) {
      if (found.has(kind)) continue;
      const match = firstMatch(kind, text);
      if (match) found.set(kind, { kind, match, line, where: 'body' });
    }
  }
  for (const wire of content.wireRun?.wires ?? []) {
    const words = `${wire.role} ${wire.from} ${wire.to} ${wire.note ?? ''}`;
    for (const kind of CHECKED_CAUTION_KINDS) {
      if (found.has(kind)) continue;
      const match = firstMatch(kind, words);
      if (match) found.set(kind, { kind, match, line: 0, where: 'wireRun' });
    }
    if (!found.has('high-current') && (wire.currentA ?? 0) >= HIGH_CURRENT_A)
      found.set('high-current', {
        kind: 'high-current',
        match: `${wire.currentA} A`,
        line: 0,
        where: 'wireRun',
      });
  }
  return CHECKED_CAUTION_KINDS.filter((k) => found.has(k)).map((k) => found.get(k)!);
}

/** The caution kinds of the blocks the text has. */
export function cautionBlocksPresent(outline: BodyOutline): Set<WriteupCautionKind> {
  return new Set(outline.cautions.map((c) => c.kind));
}

/**
 * The caution check: one warning for each kind the write-up mentions without a caution
 * block of that kind. The message says what was found, where, and what to add.
 */
export function cautionFindings(
  content: { body?: string; wireRun?: WireRun | null },
  outline: BodyOutline = outlineBody(content.body ?? ''),
): CautionFinding[] {
  const present = cautionBlocksPresent(outline);
  return cautionMentions(content, outline)
    .filter((m) => !present.has(m.kind))
    .map((m) => ({
      code: 'CAUTION_MISSING',
      severity: 'warning',
      kind: m.kind,
      field: 'body',
      line: m.line,
      message:
        `${m.where === 'body' ? `Line ${m.line} of the text` : 'The wire run'} mentions ${KIND_WORDS[m.kind]} ` +
        `("${m.match}") but the write-up has no ${m.kind} caution block. ` +
        `Add one: a line ":::caution ${m.kind}", what to watch out for, and a closing ":::".`,
    }));
}
