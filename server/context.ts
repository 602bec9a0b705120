import type { Sequelize } from 'sequelize';
import type { Transporter } from 'nodemailer';
import type { Config } from './config';
import type { Logger } from './logger';
import type { Models } from './models';
import type { OutboxWorker } from './services/outbox';
import type { SequelizeSessionStore } from './auth/sessionStore';
import type { FakeSmtp } from './mail/fakeSmtp';
import type { LoginThrottle } from './auth/throttle';
import type { ImagePool } from './workers/imagePool';
import type { BlobStorage } from './storage';

/** Everything a request handler or service may need, built once at start. */
export interface AppContext {
  config: Config;
  logger: Logger;
  sequelize: Sequelize;
  models: Models;
  transport: Transporter;
  outbox: OutboxWorker;
  sessionStore: SequelizeSessionStore;
  throttle: LoginThrottle;
  /** Present outside production: the local SMTP fake that captures mail. */
  fakeSmtp?: FakeSmtp;
  /** Worker threads that decode and draw images, off the request thread. */
  images: ImagePool;
  /** Where uploaded images are kept: local disk under UPLOAD_DIR by default. */
  storage: BlobStorage;
  /** Hooks later features add (workers, pools) that must stop with the app. */
  onClose: Array<() => Promise<void> | void>;
  close(): Promise<void>;
}
