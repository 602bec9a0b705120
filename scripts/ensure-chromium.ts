// Browser tests drive Debian's Chromium; install it when we can, or say what to install.
import { execSync } from 'node:child_process';
import fs from 'node:fs';

const chromium = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

if (!fs.existsSync(chromium)) {
  if (process.getuid?.() === 0) {
    console.log(
      'Chromium is missing; installing Debian\u2019s chromium package for the browser tests...',
    );
    execSync(
      'apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium',
      {
        stdio: 'inherit',
      },
    );
  } else {
    console.error(
      `The browser tests need Chromium at ${chromium}: install Debian's "chromium" package (sudo apt-get install chromium) or set CHROMIUM_PATH.`,
    );
    process.exit(1);
  }
}
