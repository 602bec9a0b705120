import { fork, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { TEST_PASSWORD } from './context';

const root = path.resolve(import.meta.dirname, '..', '..');

export interface RunningServer {
  url: string;
  port: number;
  dataDir: string;
  child: ChildProcess;
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/**
 * Starts the real server (server/index.ts) as a child process on a free port with its
 * own DATA_DIR and mail fake, and resolves when it is listening.
 */
export async function startServer(
  opts: { env?: Record<string, string>; dataDir?: string; seedDemo?: boolean } = {},
): Promise<RunningServer> {
  return launch(opts, 'inherit');
}

/** A server whose stdout and stderr are kept (see {@link startServerWithOutput}). */
export interface RunningServerWithOutput extends RunningServer {
  /** Everything the server wrote to stdout and stderr so far. */
  output(): string;
}

/**
 * {@link startServer}, but the child's stdout and stderr are collected instead of shown,
 * for tests that read what the server logged (set LOG_LEVEL in `env` to see more).
 */
export async function startServerWithOutput(
  opts: { env?: Record<string, string>; dataDir?: string; seedDemo?: boolean } = {},
): Promise<RunningServerWithOutput> {
  let text = '';
  try {
    const server = await launch(opts, 'pipe', (chunk) => (text += chunk));
    return { ...server, output: () => text };
  } catch (err) {
    throw new Error(`${(err as Error).message}; its output:\n${text.slice(-4000)}`, { cause: err });
  }
}

async function launch(
  opts: { env?: Record<string, string>; dataDir?: string; seedDemo?: boolean },
  stdio: 'inherit' | 'pipe',
  onOutput?: (chunk: string) => void,
): Promise<RunningServer> {
  const dataDir = opts.dataDir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'lw-srv-'));
  const child = fork(path.join(root, 'server', 'index.ts'), [], {
    cwd: root,
    execArgv: ['--import', 'tsx'],
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: '0',
      HOST: '127.0.0.1',
      DATA_DIR: dataDir,
      DEV_SMTP_PORT: '0',
      DEMO_PASSWORD: TEST_PASSWORD,
      SEED_DEMO: opts.seedDemo === false ? 'false' : 'true',
      LOG_LEVEL: process.env.LOG_LEVEL ?? 'error',
      PASSWORD_HASH_N: '1024',
      ...opts.env,
    },
    stdio: ['ignore', stdio, stdio, 'ipc'],
  });
  for (const stream of [child.stdout, child.stderr]) {
    stream?.setEncoding('utf8');
    stream?.on('data', (chunk: string) => onOutput?.(chunk));
  }
  const port = await new Promise<number>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error('server did not start within 60 s')), 60_000);
    child.on('message', (m: { ready?: boolean; port?: number }) => {
      if (m?.ready && m.port) {
        clearTimeout(timer);
        resolve(m.port);
      }
    });
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited with code ${code} before it was ready`));
    });
  });
  const url = `http://127.0.0.1:${port}`;
  return {
    url,
    port,
    dataDir,
    child,
    stop(signal: NodeJS.Signals = 'SIGTERM') {
      return new Promise<void>((resolve) => {
        if (child.exitCode !== null || child.signalCode) return resolve();
        child.once('exit', () => resolve());
        child.kill(signal);
      });
    },
  };
}
