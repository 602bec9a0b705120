/**
 * How much Markdown one render may be asked to do. Rendering time grows with the length of
 * the text, with runs of link brackets and emphasis marks (markdown-it rescans them), and
 * with the number of HTML elements produced (the sanitiser walks every one). Text past
 * any of these limits is refused with a sentence instead of rendered slowly.
 *
 * The limits sit above what a long, heavily formatted write-up needs: 100 000 characters
 * of steps with a bold word, a link, inline code and a two-item list every 85 characters
 * (about 6 000 lines, 1 200 links, 4 700 marks, 10 600 pieces) fit.
 * `npm run bench -- --only markdown` prints what rendering costs at the limits.
 */
import type { Token } from 'markdown-it';

export interface MarkdownBudget {
  /** Characters of source. */
  maxLength: number;
  /** Lines of source: each may start a block (a paragraph, a list item, a code block). */
  maxLines: number;
  /** `[` and `<` characters: every link, image, sheet reference and autolink opens with one. */
  maxBrackets: number;
  /** `*`, `_` and `~` characters: emphasis, strong and strikethrough marks. */
  maxDelimiters: number;
  /** HTML elements and attributes the text would become (paragraphs, list items, links…). */
  maxElements: number;
}

/** Write-ups and anything rendered on the page. */
export const MARKDOWN_BUDGET: MarkdownBudget = {
  maxLength: 100_000,
  maxLines: 8_000,
  maxBrackets: 2_000,
  maxDelimiters: 10_000,
  maxElements: 15_000,
};

/** Replies, which the server renders and sanitises once when they are posted (`MAX_REPLY` is its length). */
export const REPLY_MARKDOWN_BUDGET: MarkdownBudget = {
  maxLength: 10_000,
  maxLines: 1_500,
  maxBrackets: 400,
  maxDelimiters: 2_000,
  maxElements: 2_000,
};

const fmt = (n: number) => n.toLocaleString('en-GB');

/**
 * What is wrong with the source before it is parsed: a sentence, or null when it is within
 * the budget's length and character counts. One linear pass, no parsing.
 */
export function markdownSourceProblem(
  source: string,
  budget: MarkdownBudget = MARKDOWN_BUDGET,
): string | null {
  if (source.length > budget.maxLength)
    return `The text is too long to show: keep it under ${fmt(budget.maxLength)} characters.`;
  let lines = 1;
  let brackets = 0;
  let delimiters = 0;
  for (let i = 0; i < source.length; i++) {
    const c = source.charCodeAt(i);
    if (c === 0x0a) lines++;
    else if (c === 0x5b || c === 0x3c) brackets++;
    else if (c === 0x2a || c === 0x5f || c === 0x7e) delimiters++;
  }
  if (lines > budget.maxLines)
    return `The text has ${fmt(lines)} lines; at most ${fmt(budget.maxLines)} can be shown. Join short lines into paragraphs, or split the text.`;
  if (brackets > budget.maxBrackets)
    return `The text has ${fmt(brackets)} "[" and "<" characters; at most ${fmt(budget.maxBrackets)} can be shown (each link, image and sheet reference uses one). Remove some links or brackets.`;
  if (delimiters > budget.maxDelimiters)
    return `The text has ${fmt(delimiters)} "*", "_" and "~" marks; at most ${fmt(budget.maxDelimiters)} can be shown. Use less bold and italic, or put long runs of these characters in a code block.`;
  return null;
}

/**
 * What parsed tokens cost the sanitiser: one for every element they become (an opening or
 * standalone tag) and one for each of its attributes. Links get the `rel` the renderer adds;
 * code blocks are a `pre` around a `code`.
 */
export function countElements(tokens: Token[]): number {
  let n = 0;
  for (const t of tokens) {
    // A soft line break is a newline in the output, not an element.
    if (t.nesting >= 0 && t.tag && !t.hidden && t.type !== 'softbreak') {
      n += 1 + (t.attrs?.length ?? 0);
      if (t.type === 'link_open' || t.type === 'fence' || t.type === 'code_block') n++;
    }
    if (t.children) n += countElements(t.children);
  }
  return n;
}

/** The sentence for text that parses into more elements than the budget allows, or null. */
export function markdownElementsProblem(
  tokens: Token[],
  budget: MarkdownBudget = MARKDOWN_BUDGET,
): string | null {
  const n = countElements(tokens);
  if (n <= budget.maxElements) return null;
  return `The text has too much formatting to show (${fmt(n)} pieces: paragraphs, list items, links and their addresses; at most ${fmt(budget.maxElements)}). Split it, or use fewer separate lines and links.`;
}
