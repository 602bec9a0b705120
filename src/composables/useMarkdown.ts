import DOMPurify from 'dompurify';
import { createMarkdownRenderer, type RenderOptions } from '@shared/markdown/render';

/** A Markdown renderer that sanitises with the browser's DOMPurify, the same rules as the server. */
export function useMarkdown(opts: RenderOptions = {}) {
  return createMarkdownRenderer(DOMPurify, opts);
}
