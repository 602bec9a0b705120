/**
 * Markdown that is slow to render when nothing stops it: long runs of the characters
 * markdown-it rescans (brackets, emphasis marks, backticks, entities), deep nesting, the
 * write-up syntax repeated, and text that becomes very many elements. Each family is a
 * unit repeated to the length under test. The last one is ordinary, heavily formatted
 * text, which the budget must always let through.
 */
export const SLOW_MARKDOWN_FAMILIES: Record<string, string> = {
  asterisks: '*',
  underscores: '_',
  backticks: '`',
  tildes: '~',
  'open brackets': '[',
  'image openers': '![',
  'bracket-paren': '](',
  'empty links': '[]',
  'unclosed links': '[a](',
  'link definitions': '[a]: b\n',
  'nested emphasis': '*a **a ',
  'intraword underscores': 'a_ ',
  strikethrough: '~~a',
  'angle brackets': '<',
  autolinks: '<http://a>',
  'html comments': '<!--',
  entities: '&amp;',
  'numeric entity openers': '&#',
  backslashes: '\\',
  'quote nesting': '>',
  'list nesting': '- ',
  'heading marks': '#',
  'code fences': '```\n',
  'table rows': '|x|y|\n',
  'one-word paragraphs': 'w\n\n',
  'at signs': '@',
  'url-like text': 'http://a.',
  'address-like text': 'a@b.',
  'caution blocks': ':::caution fuel\n',
  'sheet references': '[[sheet:',
  'image references': '![a](image:1)',
};

/** Ordinary text at its most formatted: bold, a link, inline code and a short list every 85 characters. */
export const FORMATTED_PROSE =
  'Cut the **grey** wire at [cavity 3](/documents/x) and `crimp` it.\n\n- one\n- two\n\n';

/** `unit` repeated to at most `length` characters. */
export function repeatTo(unit: string, length: number): string {
  return unit.repeat(Math.floor(length / unit.length));
}
