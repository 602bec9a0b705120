import './threadpool';
import http from 'node:http';
import net from 'node:net';
import { ConfigError, loadConfig } from './config';
import { createContext } from './bootstrap';
import { createApp } from './app';

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms).unref());

/** How long a shutdown waits for requests in flight before closing their connections. */
const DRAIN_MS = 10_000;

/**
 * Keeps count of the requests being handled. A request counts until its handler ends
 * the response, even when the client has gone away meanwhile (its handler may still be
 * using the database). While closing, answers carry `Connection: close` so keep-alive
 * connections end with them.
 */
function trackRequests() {
  const inFlight = new Set<http.ServerResponse>();
  let closing = false;
  let waiters: Array<() => void> = [];

  const finished = (res: http.ServerResponse) => {
    if (!inFlight.delete(res)) return;
    if (closing && !inFlight.size) for (const w of waiters.splice(0)) w();
  };

  return {
    track(res: http.ServerResponse) {
      inFlight.add(res);
      if (closing) res.setHeader('Connection', 'close');
      const end = res.end;
      res.end = function (this: http.ServerResponse, ...args: unknown[]) {
        finished(res);
        return (end as (...a: unknown[]) => http.ServerResponse).apply(this, args);
      } as typeof res.end;
      res.once('finish', () => finished(res));
    },
    count: () => inFlight.size,
    startClosing() {
      closing = true;
      for (const res of inFlight) if (!res.headersSent) res.setHeader('Connection', 'close');
    },
    /** Resolves with how many requests are left: 0 once all are done, or more after `ms`. */
    settled(ms: number): Promise<number> {
      if (!inFlight.size) return Promise.resolve(0);
      return new Promise((resolve) => {
        const timer = setTimeout(() => {
          waiters = waiters.filter((w) => w !== done);
          resolve(inFlight.size);
        }, ms);
        const done = () => {
          clearTimeout(timer);
          resolve(0);
        };
        waiters.push(done);
      });
    },
  };
}

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
  const drain = trackRequests();
  const server = http.createServer((req, res) => {
    drain.track(res);
    app(req, res);
  });
  server.keepAliveTimeout = 65_000;

  await new Promise<void>((resolve) => server.listen(config.port, config.host, resolve));
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.port;
  // With PORT=0 the port is known only now; e-mail links must carry it.
  if (!process.env.PUBLIC_URL) {
    const host = ['0.0.0.0', '::'].includes(config.host) ? 'localhost' : config.host;
    ctx.config.publicUrl = `http://${host}:${port}`;
  }
  ctx.logger.info(
    { port, dataDir: config.dataDir },
    `Loomwright is listening on http://localhost:${port}`,
  );
  if (ctx.fakeSmtp)
    ctx.logger.info(
      { smtp: ctx.fakeSmtp.url },
      `The local mail fake catches every e-mail: open http://localhost:${port}/dev/mail`,
    );
  if (process.send) process.send({ ready: true, port });

  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) {
      ctx.logger.warn({ signal }, 'a second signal: stopping now');
      process.exit(1);
    }
    closing = true;
    ctx.logger.info({ signal, inFlight: drain.count() }, 'shutting down');
    // Whatever happens below, the process does not outlive the drain by much.
    const force = setTimeout(() => {
      ctx.logger.error('shutdown did not finish in time; exiting');
      process.exit(1);
    }, DRAIN_MS + 10_000);
    force.unref();

    const deadline = Date.now() + DRAIN_MS;
    // No new connections. Not http's server.close(): since Node 19 it also drops every
    // connection without a request in progress at once, and that includes connections
    // whose request has arrived but not been read yet. Those are answered too.
    const closed = new Promise<void>((resolve) =>
      net.Server.prototype.close.call(server, () => resolve()),
    );
    drain.startClosing();
    const left = await drain.settled(DRAIN_MS);
    // Now only keep-alive connections waiting for a next request are left, and those
    // whose last answer is still being written: they end on their own.
    server.closeIdleConnections();
    const ended = await Promise.race([
      closed.then(() => true),
      sleep(Math.max(0, deadline - Date.now())).then(() => false),
    ]);
    if (left || !ended) {
      ctx.logger.warn(
        { requests: left },
        `requests or connections still open after ${DRAIN_MS / 1000} s; closing them`,
      );
      server.closeAllConnections();
      await closed;
    }
    try {
      // Outbox worker, digest job, image workers, session pruning, mail, then the database.
      await ctx.close();
    } catch (err) {
      ctx.logger.error({ err }, 'shutdown failed');
      process.exit(1);
    }
    ctx.logger.info('stopped');
    process.exit(0);
  };
  process.on('SIGINT', () => void shutdown('SIGINT'));
  process.on('SIGTERM', () => void shutdown('SIGTERM'));
}

main().catch((err) => {
  console.error('Loomwright could not start:', err instanceof Error ? err.message : err);
  process.exit(1);
});
