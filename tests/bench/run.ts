/**
 * `npm run bench`: runs each named part of the benchmarks and prints its figures.
 *
 *   npm run bench                  every part
 *   npm run bench -- --only check  one part (repeat --only, or give a comma list, for several)
 *   npm run bench -- --list        the names of the parts
 *
 * A part is a name and a function that prints its own figures and says whether it met
 * its target. Add parts (search, HTTP) to PARTS.
 */
import { execSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { runCheckBench } from './check.bench';
import { runSearchBench } from './search.bench';
import { runMarkdownBench } from './markdown.bench';
import { firstLoadReport, printBundle } from './bundle';

export interface BenchPart {
  name: string;
  description: string;
  run(log: (line: string) => void): Promise<{ pass: boolean }> | { pass: boolean };
}

export const PARTS: BenchPart[] = [
  {
    name: 'check',
    description: 'the pin-to-pin check on 10, 100, 1 000 and 10 000 circuits',
    run: (log) => runCheckBench({ log }),
  },
  {
    name: 'search',
    description:
      'search and a connector sheet at 32 connections over 10 000 sheets, beside a bare baseline',
    run: (log) => runSearchBench(log),
  },
  {
    name: 'markdown',
    description:
      'hostile Markdown at the budget limits: a reply, a write-up outline and search text, a page in Chromium',
    run: (log) => runMarkdownBench(log),
  },
  {
    name: 'bundle',
    description: "the lookup route's JavaScript before first render, from the production build",
    run(log) {
      const root = path.resolve(import.meta.dirname, '..', '..');
      if (!fs.existsSync(path.join(root, 'dist', 'index.html'))) {
        log('no dist/ yet: building the client (npx vite build)');
        execSync('npx vite build --logLevel warn', { cwd: root, stdio: 'inherit' });
      }
      const report = firstLoadReport(path.join(root, 'dist'));
      printBundle(report, log);
      return { pass: report.pass };
    },
  },
];

function parseArgs(argv: string[]): { only: string[]; list: boolean } {
  const only: string[] = [];
  let list = false;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--list') list = true;
    else if (arg === '--only') only.push(...(argv[++i] ?? '').split(','));
    else if (arg.startsWith('--only=')) only.push(...arg.slice('--only='.length).split(','));
  }
  return { only: only.map((s) => s.trim()).filter(Boolean), list };
}

async function main() {
  const { only, list } = parseArgs(process.argv.slice(2));
  if (list) {
    for (const p of PARTS) console.log(`${p.name.padEnd(10)} ${p.description}`);
    return;
  }
  const unknown = only.filter((name) => !PARTS.some((p) => p.name === name));
  if (unknown.length) {
    console.error(
      `No benchmark part named ${unknown.join(', ')}. Parts: ${PARTS.map((p) => p.name).join(', ')}.`,
    );
    process.exitCode = 2;
    return;
  }
  const chosen = only.length ? PARTS.filter((p) => only.includes(p.name)) : PARTS;
  const results: Array<{ name: string; pass: boolean }> = [];
  for (const part of chosen) {
    console.log(`\n== ${part.name}: ${part.description}`);
    const { pass } = await part.run((line) => console.log(line));
    results.push({ name: part.name, pass });
  }
  console.log('\n== summary');
  for (const r of results) console.log(`${r.pass ? 'PASS' : 'FAIL'}  ${r.name}`);
  if (results.some((r) => !r.pass)) process.exitCode = 1;
}

await main();
