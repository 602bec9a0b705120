import { execSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '..', '..');

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs);
  }
  return newest;
}

/** Builds the client once before the browser tests when it is missing or older than its sources. */
export default function setup() {
  if (process.env.LW_SKIP_BUILD) return;
  const index = path.join(root, 'dist', 'index.html');
  const built = fs.existsSync(index) ? fs.statSync(index).mtimeMs : 0;
  const sources = Math.max(
    newestMtime(path.join(root, 'src')),
    newestMtime(path.join(root, 'shared')),
    fs.statSync(path.join(root, 'index.html')).mtimeMs,
  );
  if (built < sources) execSync('npx vite build --logLevel warn', { cwd: root, stdio: 'inherit' });
}
