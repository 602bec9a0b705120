import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import type { Config } from './config';
import type { AppContext } from './context';
import { createLogger } from './logger';
import { createSequelize } from './db/sequelize';
import { migrate } from './db/migrate';
import { initModels } from './models';
import { SequelizeSessionStore } from './auth/sessionStore';
import { LoginThrottle } from './auth/throttle';
import { startFakeSmtp, type FakeSmtp } from './mail/fakeSmtp';
import { createTransport } from './mail/transport';
import { OutboxWorker } from './services/outbox';
import { startDigestJob } from './services/digest';
import { seedDemo } from './seed/demo';
import { LocalDiskStorage } from './storage';
import { ImagePool } from './workers/imagePool';

/** Folders served to browsers as they are: uploads must never be kept inside them. */
const SERVED_DIRS = ['dist', 'public'].map((d) => path.resolve(import.meta.dirname, '..', d));

/** Reads the development session secret from DATA_DIR, creating it on first start. */
function developmentSecret(dataDir: string): string {
  const file = path.join(dataDir, 'session-secret');
  fs.mkdirSync(dataDir, { recursive: true });
  if (!fs.existsSync(file))
    fs.writeFileSync(file, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

async function startFake(port: number, logger: AppContext['logger']): Promise<FakeSmtp> {
  try {
    return await startFakeSmtp(port);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw err;
    logger.warn({ port }, 'the local mail fake port is taken; using a free one');
    return startFakeSmtp(0);
  }
}

/**
 * Opens and migrates the database, starts the mail path and, outside production on a
 * fresh database, seeds the demo. Everything the app needs, ready to serve.
 */
export async function createContext(config: Config): Promise<AppContext> {
  const logger = createLogger(config.logLevel);
  fs.mkdirSync(config.dataDir, { recursive: true });
  fs.mkdirSync(config.uploadDir, { recursive: true });
  const sequelize = createSequelize({ file: config.databaseFile, url: config.databaseUrl, logger });
  await sequelize.authenticate();
  await migrate(sequelize, logger);
  const models = initModels(sequelize);

  const sessionSecret = config.sessionSecret ?? developmentSecret(config.dataDir);
  const resolved: Config = { ...config, sessionSecret };

  let fakeSmtp: FakeSmtp | undefined;
  if (!config.isProduction && !config.smtpUrl)
    fakeSmtp = await startFake(config.devSmtpPort, logger);
  const transport = createTransport(config.smtpUrl ?? fakeSmtp!.url);
  const outbox = new OutboxWorker({
    transport,
    from: config.mailFrom,
    logger,
    pollMs: config.outbox.pollMs,
    maxAttempts: config.outbox.maxAttempts,
    baseBackoffMs: config.outbox.baseBackoffMs,
  });
  const sessionStore = new SequelizeSessionStore({
    model: models.Session,
    absoluteMs: config.session.absoluteMs,
    idleMs: config.session.idleMs,
  });

  const storage = new LocalDiskStorage(config.uploadDir, SERVED_DIRS);
  const images = new ImagePool();

  const ctx: AppContext = {
    config: resolved,
    logger,
    sequelize,
    models,
    transport,
    outbox,
    sessionStore,
    throttle: new LoginThrottle(config.throttle),
    fakeSmtp,
    images,
    storage,
    onClose: [() => images.close()],
    async close() {
      for (const hook of ctx.onClose.reverse()) await hook();
      await outbox.stop();
      sessionStore.close();
      transport.close();
      await fakeSmtp?.close();
      await sequelize.close();
    },
  };

  if (resolved.seedDemo && (await models.User.count()) === 0) {
    await seedDemo(ctx);
    logger.info('seeded the demo data');
  }
  await outbox.start();
  ctx.onClose.push(startDigestJob(ctx));
  return ctx;
}
