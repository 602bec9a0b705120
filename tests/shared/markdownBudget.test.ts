import { describe, expect, it } from 'vitest';
import { serverMarkdown } from '../../server/markdown';
import {
  MARKDOWN_BUDGET,
  REPLY_MARKDOWN_BUDGET,
  countElements,
  markdownSourceProblem,
} from '../../shared/markdown/budget';
import { bodyPlainText, outlineBody, writeupMarkdown } from '../../shared/writeup/markdown';
import { FORMATTED_PROSE, SLOW_MARKDOWN_FAMILIES, repeatTo } from '../helpers/slowMarkdown';

const page = serverMarkdown({ plugins: [writeupMarkdown] });
const reply = serverMarkdown({ budget: REPLY_MARKDOWN_BUDGET });

/**
 * A bound for catching a blow-up (quadratic work at 100 000 characters takes many seconds),
 * not a speed target: `npm run bench -- --only markdown` prints the real figures beside the
 * 100 ms target, on a machine quiet enough to mean something.
 */
const BLOW_UP_MS = 1_500;

function timed(run: () => unknown): { ms: number; error?: Error } {
  const t = performance.now();
  try {
    run();
    return { ms: performance.now() - t };
  } catch (error) {
    return { ms: performance.now() - t, error: error as Error };
  }
}

describe('the Markdown budget', () => {
  it('lets long, heavily formatted text through, for a write-up and for a reply', () => {
    const writeup = repeatTo(FORMATTED_PROSE, MARKDOWN_BUDGET.maxLength);
    expect(markdownSourceProblem(writeup)).toBeNull();
    expect(outlineBody(writeup).problem).toBeNull();
    expect(page.render(writeup)).toContain('<strong>grey</strong>');
    const r = repeatTo(FORMATTED_PROSE, REPLY_MARKDOWN_BUDGET.maxLength);
    expect(reply.render(r)).toContain('<code>crimp</code>');
  });

  it('counts elements, their attributes and the rel the renderer adds to links', () => {
    const tokens = page.md.parse('A [link](/x) and *b*.\n\n```\ncode\n```', {});
    // p; a + href + rel; em; pre + code (the fence's own info attribute is empty)
    expect(countElements(tokens)).toBe(1 + 3 + 1 + 2);
  });

  it.each([
    ['too long', 'a'.repeat(100_001), /under 100,000 characters/],
    ['too many lines', 'w\n'.repeat(8_001), /8,002 lines; at most 8,000/],
    ['too many brackets', '['.repeat(2_001), /2,001 "\[" and "<" characters/],
    ['too many marks', '*'.repeat(10_001), /10,001 "\*", "_" and "~" marks/],
  ])('refuses text with %s before parsing it, saying what to change', (_what, source, sentence) => {
    const problem = markdownSourceProblem(source);
    expect(problem).toMatch(sentence);
    expect(() => page.render(source)).toThrow(RangeError);
    expect(outlineBody(source).problem).toBe(problem);
    expect(bodyPlainText(source)).toBe('');
  });

  it('refuses text that would become too many elements, after parsing it', () => {
    const links = repeatTo('[a](/x) ', 60_000); // 7 500 links → 30 000 pieces; brackets 7 500 …
    expect(markdownSourceProblem(links)).toMatch(/"\[" and "<"/);
    // 7 999 list items of inline code, under the line limit: ul + 7 999 × (li + code) pieces
    const items = '- `a`\n'.repeat(7_999);
    expect(markdownSourceProblem(items)).toBeNull();
    expect(() => page.render(items)).toThrow(/too much formatting to show \(15,999 pieces/);
    expect(outlineBody(items).problem).toMatch(/too much formatting/);
  });

  describe.each(Object.entries(SLOW_MARKDOWN_FAMILIES))('"%s" at the limits', (_name, unit) => {
    it('is refused with a sentence or rendered, and never blows up', () => {
      const text = repeatTo(unit, MARKDOWN_BUDGET.maxLength);
      const short = repeatTo(unit, REPLY_MARKDOWN_BUDGET.maxLength);
      const paths: Array<[string, () => unknown]> = [
        ['the write-up outline', () => outlineBody(text)],
        ['the write-up text for search', () => bodyPlainText(text)],
        ['a reply', () => reply.render(short)],
      ];
      for (const [what, run] of paths) {
        const r = timed(run);
        expect(r.ms, `${what} took ${r.ms.toFixed(0)} ms`).toBeLessThan(BLOW_UP_MS);
        if (r.error) {
          expect(r.error, what).toBeInstanceOf(RangeError);
          expect(r.error.message, what).toMatch(/^The text .+\.$/);
        }
      }
      const shown = timed(() => page.render(text));
      if (shown.error) expect(shown.error).toBeInstanceOf(RangeError);
      else expect(outlineBody(text).problem).toBeNull();
    });
  });
});
