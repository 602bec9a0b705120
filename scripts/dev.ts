// Runs the API server (restarting on change) and the Vite dev server side by side.
import { spawn } from 'node:child_process';

const children = [
  spawn('node', ['--watch', '--import', 'tsx', 'server/index.ts'], {
    stdio: 'inherit',
    env: process.env,
  }),
  spawn('npx', ['vite'], { stdio: 'inherit', env: process.env }),
];

const stop = () => {
  for (const c of children) c.kill('SIGTERM');
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const c of children) c.on('exit', (code) => code && stop());
