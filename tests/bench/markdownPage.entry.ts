/** The client's write-up renderer for a blank page in the Markdown bench: `window.lwTime(src)`. */
import DOMPurify from 'dompurify';
import { createMarkdownRenderer } from '../../shared/markdown/render';
import { writeupMarkdown } from '../../shared/writeup/markdown';

const renderer = createMarkdownRenderer(DOMPurify, { plugins: [writeupMarkdown] });

(window as unknown as { lwTime: unknown }).lwTime = (src: string) => {
  let ms = Infinity;
  let refused = false;
  for (let i = 0; i < 3; i++) {
    const t = performance.now();
    try {
      const box = document.createElement('div');
      box.innerHTML = renderer.render(src);
    } catch {
      refused = true;
    }
    ms = Math.min(ms, performance.now() - t);
  }
  return { ms, refused };
};
