/**
 * The write-up's own Markdown syntax, as markdown-it plugins for `createMarkdownRenderer`:
 *
 * - caution blocks: a line `:::caution fuel` (or `:::caution fuel Relieve the rail first`
 *   for a title of one's own), the text, and a closing `:::`. The kind is one of
 *   general, battery, fuel, airbag (alias srs), high-current, heat; left out, it is general.
 * - images by reference: `![caption](image:2)` is the write-up's second image with its
 *   markings. On a line of its own it becomes a figure; inside a sentence, a reference to
 *   it. `[see the photo](image:2)` links to the figure.
 * - sheet links: `[[sheet:slug]]` or `[[sheet:slug|words]]` links a connector or adapter
 *   sheet; on a line of its own it becomes a card.
 *
 * The HTML they emit uses only tags and attributes the sanitiser keeps; the client
 * replaces the marked elements with its components (see the class names below).
 */
import { markdownElementsProblem, markdownSourceProblem } from '../markdown/budget';
import MarkdownIt, {
  type StateBlock,
  type StateCore,
  type StateInline,
  type Token,
} from 'markdown-it';

/** The caution kinds a block may name; the same as the client's CautionBlock. */
export const WRITEUP_CAUTION_KINDS = [
  'general',
  'battery',
  'fuel',
  'airbag',
  'high-current',
  'heat',
] as const;
export type WriteupCautionKind = (typeof WRITEUP_CAUTION_KINDS)[number];

const KIND_ALIASES: Record<string, WriteupCautionKind> = {
  srs: 'airbag',
  high_current: 'high-current',
  highcurrent: 'high-current',
  current: 'high-current',
  exhaust: 'heat',
};

/** Class names the client looks for. */
export const MD_CLASSES = {
  caution: 'lw-md-caution',
  cautionTitle: 'lw-md-caution__title',
  figure: 'lw-md-figure',
  imageRef: 'lw-md-imgref',
  sheet: 'lw-md-sheet',
  sheetCard: 'lw-md-sheet--card',
  sheets: 'lw-md-sheets',
} as const;

export const IMAGE_REF = /^image:([1-9]\d{0,2})$/i;
/** Slugs as the server makes them (lower-case letters, digits, hyphens), or a numeric id. */
export const SHEET_SLUG = /^[a-z0-9](?:[a-z0-9-]{0,98}[a-z0-9])?$/;

/** Reads a caution kind from the word after `caution`, or undefined when it is not one. */
export function cautionKindOf(word: string): WriteupCautionKind | undefined {
  const w = word.trim().toLowerCase();
  if ((WRITEUP_CAUTION_KINDS as readonly string[]).includes(w)) return w as WriteupCautionKind;
  return KIND_ALIASES[w];
}

/** The kind and title of a `:::caution …` opening line's rest, or null when it is not one. */
export function parseCautionInfo(info: string): { kind: WriteupCautionKind; title: string } | null {
  const m = /^caution(?:\s+(.*))?$/i.exec(info.trim());
  if (!m) return null;
  const rest = (m[1] ?? '').trim();
  const [first = '', ...more] = rest.split(/\s+/);
  const kind = first ? cautionKindOf(first) : undefined;
  if (kind) return { kind, title: more.join(' ').slice(0, 160) };
  return { kind: 'general', title: rest.slice(0, 160) };
}

const COLON = 0x3a;

function cautionBlock(state: StateBlock, startLine: number, endLine: number, silent: boolean) {
  let pos = state.bMarks[startLine] + state.tShift[startLine];
  const max = state.eMarks[startLine];
  if (state.sCount[startLine] - state.blkIndent >= 4) return false;
  if (state.src.charCodeAt(pos) !== COLON) return false;
  const start = pos;
  pos = state.skipChars(pos, COLON);
  const markerLen = pos - start;
  if (markerLen < 3) return false;
  const parsed = parseCautionInfo(state.src.slice(pos, max));
  if (!parsed) return false;
  if (silent) return true;

  let nextLine = startLine;
  let closed = false;
  for (;;) {
    nextLine++;
    if (nextLine >= endLine) break;
    const p = state.bMarks[nextLine] + state.tShift[nextLine];
    const m = state.eMarks[nextLine];
    if (p < m && state.sCount[nextLine] < state.blkIndent) break;
    if (state.src.charCodeAt(p) !== COLON) continue;
    if (state.sCount[nextLine] - state.blkIndent >= 4) continue;
    const after = state.skipChars(p, COLON);
    if (after - p < markerLen) continue;
    if (state.skipSpaces(after) < m) continue;
    closed = true;
    break;
  }

  const oldParent = state.parentType;
  const oldLineMax = state.lineMax;
  state.parentType = 'container' as typeof state.parentType;
  state.lineMax = nextLine;

  const open = state.push('wu_caution_open', 'aside', 1);
  open.block = true;
  open.markup = ':'.repeat(markerLen);
  open.info = parsed.kind;
  open.meta = parsed;
  open.map = [startLine, nextLine];

  state.md.block.tokenize(state, startLine + 1, nextLine);

  const close = state.push('wu_caution_close', 'aside', -1);
  close.block = true;
  close.markup = open.markup;

  state.parentType = oldParent;
  state.lineMax = oldLineMax;
  state.line = nextLine + (closed ? 1 : 0);
  return true;
}

function sheetLink(state: StateInline, silent: boolean) {
  const src = state.src;
  const pos = state.pos;
  if (src.charCodeAt(pos) !== 0x5b || src.charCodeAt(pos + 1) !== 0x5b) return false;
  const end = src.indexOf(']]', pos + 2);
  if (end < 0 || end - pos > 300) return false;
  const inner = src.slice(pos + 2, end);
  const m = /^sheet:([^|\]\s]+)(?:\|([^\]]*))?$/i.exec(inner.trim());
  if (!m) return false;
  const slug = m[1].toLowerCase();
  if (!SHEET_SLUG.test(slug)) return false;
  if (!silent) {
    const token = state.push('wu_sheet', 'a', 0);
    token.meta = { slug, label: (m[2] ?? '').trim().slice(0, 120) };
    token.content = inner;
  }
  state.pos = end + 2;
  return true;
}

const plainText = (kids: Token[]): string =>
  kids
    .map((k) =>
      k.children
        ? plainText(k.children)
        : k.type === 'text' || k.type === 'code_inline'
          ? k.content
          : '',
    )
    .join('');

const isBlank = (t: Token) => (t.type === 'text' && !t.content.trim()) || t.type === 'softbreak';
const imageNumber = (t: Token) => {
  if (t.type !== 'image') return null;
  const m = IMAGE_REF.exec(t.attrGet('src') ?? '');
  return m ? Number(m[1]) : null;
};

/** Paragraphs of nothing but image references become figures; of nothing but sheet links, cards. */
function blockPlacements(state: StateCore) {
  const tokens = state.tokens;
  const out: Token[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i];
    const inline = tokens[i + 1];
    const close = tokens[i + 2];
    if (
      t.type === 'paragraph_open' &&
      inline?.type === 'inline' &&
      close?.type === 'paragraph_close'
    ) {
      const kids = (inline.children ?? []).filter((k) => !isBlank(k));
      if (kids.length && kids.every((k) => imageNumber(k) !== null)) {
        for (const k of kids) {
          const fig = new state.Token('wu_figure', 'figure', 0);
          fig.block = true;
          fig.map = t.map;
          fig.meta = { n: imageNumber(k), caption: plainText(k.children ?? []) };
          out.push(fig);
        }
        i += 2;
        continue;
      }
      if (kids.length && kids.every((k) => k.type === 'wu_sheet')) {
        const open = new state.Token('wu_sheets_open', 'div', 1);
        open.block = true;
        open.map = t.map;
        out.push(open);
        for (const k of kids) {
          k.meta = { ...k.meta, card: true };
          const holder = new state.Token('inline', '', 0);
          holder.children = [k];
          holder.content = k.content;
          holder.map = t.map;
          out.push(holder);
        }
        const end = new state.Token('wu_sheets_close', 'div', -1);
        end.block = true;
        out.push(end);
        i += 2;
        continue;
      }
    }
    out.push(t);
  }
  state.tokens = out;
}

/** Links to `image:N` go to the figure on the page. */
function imageLinks(state: StateCore) {
  for (const t of state.tokens) {
    if (t.type !== 'inline') continue;
    for (const k of t.children ?? []) {
      if (k.type !== 'link_open') continue;
      const m = IMAGE_REF.exec(k.attrGet('href') ?? '');
      if (m) k.attrSet('href', `#wu-image-${m[1]}`);
    }
  }
}

/**
 * The markdown-it plugin of write-ups: caution blocks, image references, sheet links.
 * Pass it in `plugins` to `createMarkdownRenderer` (client and server alike).
 */
export function writeupMarkdown(md: MarkdownIt): void {
  const esc = md.utils.escapeHtml;
  const validate = md.validateLink.bind(md);
  md.validateLink = (url: string) => IMAGE_REF.test(url.trim()) || validate(url);

  md.block.ruler.before('fence', 'wu_caution', cautionBlock, {
    alt: ['paragraph', 'reference', 'blockquote', 'list'],
  });
  md.inline.ruler.before('link', 'wu_sheet', sheetLink);
  md.core.ruler.push('wu_placements', (state) => {
    blockPlacements(state);
    imageLinks(state);
  });

  const r = md.renderer.rules;
  r.wu_caution_open = (tokens, idx) => {
    const { kind, title } = tokens[idx].meta as { kind: WriteupCautionKind; title: string };
    const label = title ? `Caution: ${title}` : `Caution (${kind})`;
    return (
      `<aside class="${MD_CLASSES.caution} ${MD_CLASSES.caution}--${kind}" role="note" data-kind="${kind}" aria-label="${esc(label)}">\n` +
      `<p class="${MD_CLASSES.cautionTitle}">${esc(label)}</p>\n`
    );
  };
  r.wu_caution_close = () => '</aside>\n';
  r.wu_figure = (tokens, idx) => {
    const { n, caption } = tokens[idx].meta as { n: number; caption: string };
    return `<figure class="${MD_CLASSES.figure}" data-ref="image:${n}"><figcaption>${esc(caption)}</figcaption></figure>\n`;
  };
  r.wu_sheets_open = () => `<div class="${MD_CLASSES.sheets}">\n`;
  r.wu_sheets_close = () => '</div>\n';
  r.wu_sheet = (tokens, idx) => {
    const { slug, label, card } = tokens[idx].meta as {
      slug: string;
      label: string;
      card?: boolean;
    };
    const cls = card ? `${MD_CLASSES.sheet} ${MD_CLASSES.sheetCard}` : MD_CLASSES.sheet;
    return `<a class="${cls}" href="/documents/${slug}" data-ref="sheet:${slug}">${esc(label || slug)}</a>`;
  };
  const defaultImage = r.image!;
  r.image = (tokens, idx, options, env, self) => {
    const n = imageNumber(tokens[idx]);
    if (n === null) return defaultImage(tokens, idx, options, env, self);
    const alt = self.renderInlineAsText(tokens[idx].children ?? [], options, env);
    return `<span class="${MD_CLASSES.imageRef}" data-ref="image:${n}">${esc(alt || `image ${n}`)}</span>`;
  };
}

/** What a write-up's text refers to and says, from one parse: for the checks and search. */
export interface BodyOutline {
  cautions: Array<{ kind: WriteupCautionKind; title: string; line: number }>;
  images: Array<{ n: number; line: number; placed: boolean }>;
  sheets: Array<{ slug: string; line: number }>;
  /** Prose outside caution blocks and code, with its first line (1-based). */
  text: Array<{ text: string; line: number }>;
  /** Why the body cannot be shown (past the Markdown budget), or null; nothing else is read then. */
  problem: string | null;
}

let parser: MarkdownIt | undefined;

function outlineParser() {
  const md = new MarkdownIt({ html: false, linkify: false });
  writeupMarkdown(md);
  return md;
}

/** Parses a write-up's Markdown and lists its caution blocks, image references, sheet links and prose. */
export function outlineBody(body: string): BodyOutline {
  parser ??= outlineParser();
  const out: BodyOutline = { cautions: [], images: [], sheets: [], text: [], problem: null };
  out.problem = markdownSourceProblem(body);
  if (out.problem) return out;
  const tokens = parser.parse(body, {});
  out.problem = markdownElementsProblem(tokens);
  if (out.problem) return out;
  let depth = 0;
  let line = 1;
  for (const t of tokens) {
    if (t.map) line = t.map[0] + 1;
    if (t.type === 'wu_caution_open') {
      depth++;
      const { kind, title } = t.meta as { kind: WriteupCautionKind; title: string };
      out.cautions.push({ kind, title, line });
      continue;
    }
    if (t.type === 'wu_caution_close') {
      depth--;
      continue;
    }
    if (t.type === 'wu_figure') {
      out.images.push({ n: (t.meta as { n: number }).n, line, placed: true });
      continue;
    }
    if (t.type !== 'inline') continue;
    const words: string[] = [];
    for (const k of t.children ?? []) {
      const n = imageNumber(k);
      if (n !== null) out.images.push({ n, line, placed: false });
      else if (k.type === 'wu_sheet')
        out.sheets.push({ slug: (k.meta as { slug: string }).slug, line });
      else if (k.type === 'link_open') {
        const m = /^#wu-image-(\d+)$/.exec(k.attrGet('href') ?? '');
        if (m) out.images.push({ n: Number(m[1]), line, placed: false });
      } else if (k.type === 'text' || k.type === 'code_inline') words.push(k.content);
      else if (k.type === 'softbreak' || k.type === 'hardbreak') words.push('\n');
    }
    if (depth === 0 && words.length) out.text.push({ text: words.join(''), line });
  }
  return out;
}

/**
 * The words of a write-up's body without markup, as a reader sees them: caution labels,
 * figure captions, image and sheet link words, code. Read from the parse alone (no HTML,
 * no DOM), so it costs one linear pass however much formatting the text holds.
 */
export function bodyPlainText(body: string): string {
  if (markdownSourceProblem(body)) return '';
  parser ??= outlineParser();
  const words: string[] = [];
  const inline = (kids: Token[]) => {
    for (const k of kids) {
      if (k.type === 'text' || k.type === 'code_inline') words.push(k.content);
      else if (k.type === 'softbreak' || k.type === 'hardbreak') words.push(' ');
      else if (k.type === 'image') {
        const n = imageNumber(k);
        const alt = plainText(k.children ?? []);
        words.push(n !== null && !alt ? `image ${n}` : alt);
      } else if (k.type === 'wu_sheet') {
        const { slug, label } = k.meta as { slug: string; label: string };
        words.push(label || slug);
      }
    }
  };
  for (const t of parser.parse(body, {})) {
    if (t.type === 'inline') inline(t.children ?? []);
    else if (t.type === 'fence' || t.type === 'code_block') words.push(t.content);
    else if (t.type === 'wu_caution_open') {
      const { kind, title } = t.meta as { kind: WriteupCautionKind; title: string };
      words.push(title ? `Caution: ${title}` : `Caution (${kind})`);
    } else if (t.type === 'wu_figure') words.push((t.meta as { caption: string }).caption);
    words.push(' ');
  }
  return words.join('').replace(/\s+/g, ' ').trim();
}

/**
 * Rewrites `image:N` references after images were removed or reordered: `map` gives each
 * old number its new one, or null for a removed image (its reference then names no image
 * and the checks say so).
 */
export function renumberImageRefs(body: string, map: (n: number) => number | null): string {
  return body.replace(
    /(\]\()image:([1-9]\d{0,2})(\s*\))/gi,
    (all, open: string, n: string, close: string) => {
      const next = map(Number(n));
      return next === null ? `${open}image:0${close}` : `${open}image:${next}${close}`;
    },
  );
}
