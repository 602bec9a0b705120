import MarkdownIt from 'markdown-it';
import {
  MARKDOWN_BUDGET,
  markdownElementsProblem,
  markdownSourceProblem,
  type MarkdownBudget,
} from './budget';

/** The part of DOMPurify this module uses; the browser's and the server's (jsdom) both fit. */
export interface Purifier {
  sanitize(dirty: string, config: Record<string, unknown>): unknown;
}

/** Tags a rendered document may contain; everything else is removed. */
export const ALLOWED_TAGS = [
  'p',
  'br',
  'hr',
  'h1',
  'h2',
  'h3',
  'h4',
  'h5',
  'h6',
  'blockquote',
  'pre',
  'code',
  'em',
  'strong',
  's',
  'del',
  'ul',
  'ol',
  'li',
  'a',
  'img',
  'table',
  'thead',
  'tbody',
  'tr',
  'th',
  'td',
  'div',
  'span',
  'aside',
  'figure',
  'figcaption',
];
export const ALLOWED_ATTR = [
  'href',
  'src',
  'alt',
  'title',
  'class',
  'rel',
  'start',
  'colspan',
  'rowspan',
  'role',
  'data-kind',
  'data-ref',
  'aria-label',
];

/** http(s) links, and links to this site's own pages (a path, not `//host`). */
export const SAFE_URL = /^(?:https?:\/\/|\/(?!\/)|#)/i;

export interface RenderOptions {
  /** Adds syntax of a document kind (caution blocks, image references, sheet cards). */
  plugins?: Array<(md: MarkdownIt) => void>;
  /** How much one render may do (`./budget.ts`); text past it is refused. */
  budget?: MarkdownBudget;
}

/**
 * Builds a Markdown renderer whose output is always passed through DOMPurify last.
 * Raw HTML and linkify are off; only http(s) links and the site's own paths survive.
 */
export function createMarkdownRenderer(purifier: Purifier, opts: RenderOptions = {}) {
  const md = new MarkdownIt({ html: false, linkify: false, typographer: false, breaks: false });
  md.validateLink = (url: string) => SAFE_URL.test(url.trim());
  const defaultLinkOpen =
    md.renderer.rules.link_open ??
    ((tokens, idx, options, _env, self) => self.renderToken(tokens, idx, options));
  md.renderer.rules.link_open = (tokens, idx, options, env, self) => {
    const href = tokens[idx].attrGet('href') ?? '';
    if (/^https?:\/\//i.test(href)) tokens[idx].attrSet('rel', 'nofollow noopener noreferrer');
    return defaultLinkOpen(tokens, idx, options, env, self);
  };
  for (const plugin of opts.plugins ?? []) plugin(md);
  const budget = opts.budget ?? MARKDOWN_BUDGET;

  const config = {
    ALLOWED_TAGS,
    ALLOWED_ATTR,
    ALLOWED_URI_REGEXP: SAFE_URL,
    // DOMPurify tests every attribute's value against the URI pattern unless it is listed here.
    ADD_URI_SAFE_ATTR: [
      'rel',
      'role',
      'data-kind',
      'data-ref',
      'aria-label',
      'start',
      'colspan',
      'rowspan',
    ],
    ALLOW_DATA_ATTR: false,
    ALLOW_ARIA_ATTR: false,
    FORBID_TAGS: ['style', 'svg', 'math', 'form', 'input', 'iframe', 'object', 'embed'],
    RETURN_TRUSTED_TYPE: false,
  };

  return {
    md,
    /**
     * Renders Markdown to sanitised HTML. Throws a RangeError, whose message says what to
     * change, for text past the budget (too long, too many brackets, marks or elements).
     */
    render(source: string, env: Record<string, unknown> = {}): string {
      const problem = markdownSourceProblem(source, budget);
      if (problem) throw new RangeError(problem);
      const tokens = md.parse(source, env);
      const tooMany = markdownElementsProblem(tokens, budget);
      if (tooMany) throw new RangeError(tooMany);
      return String(purifier.sanitize(md.renderer.render(tokens, md.options, env), config));
    },
  };
}

export type MarkdownRenderer = ReturnType<typeof createMarkdownRenderer>;
