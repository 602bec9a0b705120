import { JSDOM } from 'jsdom';
import createDOMPurify from 'dompurify';
import { createMarkdownRenderer, type RenderOptions } from '../shared/markdown/render';

let purifier: ReturnType<typeof createDOMPurify> | undefined;

/** The server's DOMPurify, on one jsdom window made the first time it is needed. */
export function serverPurifier() {
  purifier ??= createDOMPurify(new JSDOM('').window as unknown as Window & typeof globalThis);
  return purifier;
}

/** A Markdown renderer that sanitises with the server's DOMPurify. */
export function serverMarkdown(opts: RenderOptions = {}) {
  return createMarkdownRenderer(serverPurifier(), opts);
}
