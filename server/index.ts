import './threadpool';
import http from 'node:http';
import { ConfigError, loadConfig } from './config';
import { createContext } from './bootstrap';
import { createApp } from './app';

async function main() {
  let config;
  try {
    config = loadConfig();
  } catch (err) {
    if (err instanceof ConfigError) {
      console.error(err.message);
      process.exit(1);
    }
    throw err;
  }
  const ctx = await createContext(config);
  const app = createApp(ctx);
  const server = http.createServer(app);
  server.keepAliveTimeout = 65_000;

  await new Promise<void>((resolve) => server.listen(config.port, config.host, resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  // With PORT=0 the port is known only now; e-mail links must carry it.
  if (!process.env.PUBLIC_URL) {
    const host = ['0.0.0.0', '::'].includes(config.host) ? 'localhost' : config.host;
    ctx.config.publicUrl = `http://${host}:${port}`;
  }
  ctx.logger.info({ port, dataDir: config.dataDir }, `Loomwright is listening on http://localhost:${port}`);
  if (ctx.fakeSmtp)
    ctx.logger.info(
      { smtp: ctx.fakeSmtp.url },
      `The local mail fake catches every e-mail: open http://localhost:${port}/dev/mail`,
    );
  if (process.send) process.send({ ready: true, port });

  let closing = false;
  const shutdown = (signal: string) => {
    if (closing) return;
    closing = true;
    ctx.logger.info({ signal }, 'shutting down');
    const force = setTimeout(() => process.exit(1), 10_000);
    force.unref();
    server.close(() => {
      void ctx.close().then(() => process.exit(0));
    });
    server.closeIdleConnections();
  };
  process.on('SIGINT', () => shutdown('SIGINT'));
  process.on('SIGTERM', () => shutdown('SIGTERM'));
}

main().catch((err) => {
  console.error('Loomwright could not start:', err instanceof Error ? err.message : err);
  process.exit(1);
});
