/**
 * What a reader's browser downloads before the lookup page first renders: the entry
 * script of dist/index.html, the layout and the home page chunks the router loads for
 * "/", and every chunk those import statically (dynamic imports, such as the drawing,
 * the filter panel, the editor and the admin pages, load later and are not counted).
 * Sizes are gzip level 9 of the built files, as a server would send them.
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

/** The target from the design: at most this many gzipped bytes of JavaScript before first render. */
export const FIRST_LOAD_TARGET_BYTES = 200 * 1024;

export interface BundleFile {
  file: string;
  bytes: number;
  gzip: number;
}

export interface BundleReport {
  files: BundleFile[];
  totalGzip: number;
  totalBytes: number;
  css: BundleFile[];
  pass: boolean;
}

const STATIC_IMPORT =
  /(?:^|[;\s}])(?:import|export)\s*(?:[\w*{}\s,$]*?from\s*)?["'](\.\/[^"']+\.js)["']/g;

function sizeOf(file: string): BundleFile {
  const buf = fs.readFileSync(file);
  return {
    file: path.basename(file),
    bytes: buf.length,
    gzip: zlib.gzipSync(buf, { level: 9 }).length,
  };
}

/** The first-load JavaScript of the lookup route in `distDir` (default ./dist). */
export function firstLoadReport(
  distDir = path.resolve(import.meta.dirname, '..', '..', 'dist'),
): BundleReport {
  const html = fs.readFileSync(path.join(distDir, 'index.html'), 'utf8');
  const entry = /<script[^>]+type="module"[^>]+src="\/?([^"]+)"/.exec(html)?.[1];
  if (!entry) throw new Error('dist/index.html has no module script; run "npx vite build" first.');
  const assets = path.join(distDir, 'assets');
  const named = (prefix: string) =>
    fs
      .readdirSync(assets)
      .filter((f) => f.startsWith(`${prefix}-`) && f.endsWith('.js'))
      .map((f) => path.join(assets, f));
  const roots = [path.join(distDir, entry), ...named('MainLayout'), ...named('HomePage')];
  const seen = new Set<string>();
  const queue = [...roots];
  while (queue.length) {
    const file = queue.shift()!;
    if (seen.has(file) || !fs.existsSync(file)) continue;
    seen.add(file);
    const src = fs.readFileSync(file, 'utf8');
    for (const m of src.matchAll(STATIC_IMPORT)) queue.push(path.resolve(path.dirname(file), m[1]));
  }
  const files = [...seen].map(sizeOf).sort((a, b) => b.gzip - a.gzip);
  const css = [...html.matchAll(/<link[^>]+rel="stylesheet"[^>]+href="\/?([^"]+)"/g)].map((m) =>
    sizeOf(path.join(distDir, m[1])),
  );
  const totalGzip = files.reduce((s, f) => s + f.gzip, 0);
  return {
    files,
    totalGzip,
    totalBytes: files.reduce((s, f) => s + f.bytes, 0),
    css,
    pass: totalGzip <= FIRST_LOAD_TARGET_BYTES,
  };
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;

/** Prints the report: each file, the total against the target. */
export function printBundle(report: BundleReport, log: (line: string) => void) {
  log('lookup route, JavaScript before first render (gzip -9):');
  for (const f of report.files) log(`  ${kb(f.gzip).padStart(9)}  ${f.file}  (${kb(f.bytes)} raw)`);
  log(`  ${kb(report.totalGzip).padStart(9)}  total JavaScript (${kb(report.totalBytes)} raw)`);
  for (const f of report.css) log(`  ${kb(f.gzip).padStart(9)}  ${f.file} (CSS, not counted)`);
  log(
    `${report.pass ? 'PASS' : 'FAIL'}: ${kb(report.totalGzip)} of JavaScript (target ≤ ${kb(FIRST_LOAD_TARGET_BYTES)})`,
  );
}
