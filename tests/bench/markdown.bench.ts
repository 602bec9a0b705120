/**
 * What rendering hostile Markdown costs at the budget's limits (`shared/markdown/budget.ts`),
 * on every path that renders it:
 *
 * - on the server: a reply (markdown-it + DOMPurify on jsdom, once when posted) and a
 *   write-up's outline and search text (markdown-it's parse alone);
 * - in the reader's browser (Debian's Chromium): a write-up page, markdown-it with the
 *   write-up syntax + the browser's DOMPurify, the way the page renders it.
 *
 * Each figure is the best of three runs. The target: every path renders hostile text within
 * 100 ms or refuses it (a refusal costs a scan of the text), and ordinary heavily formatted
 * text at the limits is never refused; its time is printed beside.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { build } from 'vite';
import { serverMarkdown } from '../../server/markdown';
import { MARKDOWN_BUDGET, REPLY_MARKDOWN_BUDGET } from '../../shared/markdown/budget';
import { bodyPlainText, outlineBody } from '../../shared/writeup/markdown';
import { FORMATTED_PROSE, SLOW_MARKDOWN_FAMILIES, repeatTo } from '../helpers/slowMarkdown';
import { CHROMIUM, launchBrowser } from '../helpers/browser';

export const MARKDOWN_TARGET_MS = 100;

interface Timing {
  ms: number;
  refused: boolean;
}

function best(run: () => unknown): Timing {
  let ms = Infinity;
  let refused = false;
  for (let i = 0; i < 3; i++) {
    const t = performance.now();
    try {
      run();
    } catch {
      refused = true;
    }
    ms = Math.min(ms, performance.now() - t);
  }
  return { ms, refused };
}

const ROOT = path.resolve(import.meta.dirname, '..', '..');

/** The client's renderer (shared code + the browser's DOMPurify) as one script for a blank page. */
async function browserRendererScript(): Promise<string> {
  const out = await build({
    root: ROOT,
    configFile: false,
    logLevel: 'silent',
    build: {
      write: false,
      minify: true,
      lib: {
        entry: path.join(import.meta.dirname, 'markdownPage.entry.ts'),
        formats: ['iife'],
        name: 'lwMarkdownBench',
        fileName: 'bench',
      },
    },
  });
  const outputs = (Array.isArray(out) ? out : [out]) as Array<{
    output: Array<{ type: string; code?: string }>;
  }>;
  const chunk = outputs[0].output.find((o) => o.type === 'chunk');
  if (!chunk?.code) throw new Error('the renderer did not build');
  return chunk.code;
}

const fmt = (t: Timing | undefined) =>
  t ? `${t.refused ? 'refused ' : ''}${t.ms.toFixed(1)}`.padStart(13) : '—'.padStart(13);

/** Prints one row per family and says whether every path stayed within the target. */
export async function runMarkdownBench(log: (line: string) => void): Promise<{ pass: boolean }> {
  const reply = serverMarkdown({ budget: REPLY_MARKDOWN_BUDGET });
  const families = { ...SLOW_MARKDOWN_FAMILIES, 'formatted prose (must pass)': FORMATTED_PROSE };

  let page: { evaluate: (fn: (src: string) => Timing, arg: string) => Promise<Timing> } | null =
    null;
  let closeBrowser: (() => Promise<void>) | null = null;
  if (fs.existsSync(CHROMIUM)) {
    const browser = await launchBrowser();
    closeBrowser = () => browser.close();
    const p = await browser.newPage();
    await p.setContent('<!doctype html><title>bench</title><body></body>');
    await p.addScriptTag({ content: await browserRendererScript() });
    page = {
      evaluate: (fn, arg) => p.evaluate(fn, arg),
    };
  } else {
    log(`(no Chromium at ${CHROMIUM}: the browser column is left out)`);
  }

  log(
    `limits: write-up ${MARKDOWN_BUDGET.maxLength} characters, reply ${REPLY_MARKDOWN_BUDGET.maxLength}; ms, best of 3`,
  );
  log(
    `${'family'.padEnd(30)}${'reply'.padStart(13)}${'outline'.padStart(13)}${'search text'.padStart(13)}${'page (browser)'.padStart(15)}`,
  );
  let worst = 0;
  let proseMs = 0;
  let proseRefused = false;
  for (const [name, unit] of Object.entries(families)) {
    const text = repeatTo(unit, MARKDOWN_BUDGET.maxLength);
    const short = repeatTo(unit, REPLY_MARKDOWN_BUDGET.maxLength);
    const r = best(() => reply.render(short));
    const o = best(() => {
      if (outlineBody(text).problem) throw new RangeError('refused');
    });
    const s = best(() => bodyPlainText(text));
    const b = page
      ? await page.evaluate(
          (src) => (window as unknown as { lwTime: (s: string) => Timing }).lwTime(src),
          text,
        )
      : undefined;
    if (unit === FORMATTED_PROSE) {
      proseMs = Math.max(r.ms, o.ms, s.ms, b?.ms ?? 0);
      proseRefused = r.refused || o.refused || !!b?.refused;
    } else worst = Math.max(worst, r.ms, o.ms, s.ms, b?.ms ?? 0);
    log(`${name.padEnd(30)}${fmt(r)}${fmt(o)}${fmt(s)}${fmt(b).padStart(15)}`);
  }
  await closeBrowser?.();
  const pass = worst <= MARKDOWN_TARGET_MS && !proseRefused;
  log(
    `slowest hostile family: ${worst.toFixed(1)} ms (target ${MARKDOWN_TARGET_MS} ms); ordinary formatted prose at the limits ${proseRefused ? 'was REFUSED' : `renders, slowest path ${proseMs.toFixed(1)} ms (its cost is its size)`} → ${pass ? 'PASS' : 'FAIL'}`,
  );
  log(
    `load average while measuring: ${os
      .loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')} on ${os.cpus().length} cores`,
  );
  return { pass };
}
