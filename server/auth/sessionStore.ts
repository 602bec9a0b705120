import session from 'express-session';
import { Op } from 'sequelize';
import type { Session } from '../models';

type SessionData = session.SessionData & { createdAt?: number };
type Callback<T = unknown> = (err?: unknown, value?: T) => void;

export interface StoreOptions {
  model: typeof Session;
  /** Sessions older than this are refused however active they are. */
  absoluteMs: number;
  /** Used when a session has no cookie expiry of its own. */
  idleMs: number;
  cleanupMs?: number;
}

/**
 * express-session store on the Sequelize `sessions` table. Unlike a store that relies
 * on a periodic cleanup, it checks the idle and absolute expiry on every read, so a
 * replayed expired session id is refused at once.
 */
export class SequelizeSessionStore extends session.Store {
  private timer?: NodeJS.Timeout;

  constructor(private readonly opts: StoreOptions) {
    super();
    this.timer = setInterval(() => void this.prune(), opts.cleanupMs ?? 15 * 60 * 1000);
    this.timer.unref();
  }

  private expiryOf(sess: SessionData): Date {
    const cookieExpiry = sess.cookie?.expires ? new Date(sess.cookie.expires) : null;
    const idle = cookieExpiry ?? new Date(Date.now() + this.opts.idleMs);
    const created = sess.createdAt ?? Date.now();
    const absolute = new Date(created + this.opts.absoluteMs);
    return idle < absolute ? idle : absolute;
  }

  override get(sid: string, cb: Callback<SessionData | null>) {
    this.opts.model
      .findByPk(sid)
      .then(async (row) => {
        if (!row) return cb(null, null);
        const data = JSON.parse(row.data) as SessionData;
        const tooOld =
          data.createdAt !== undefined && Date.now() - data.createdAt > this.opts.absoluteMs;
        if (row.expires.getTime() <= Date.now() || tooOld) {
          await row.destroy();
          return cb(null, null);
        }
        cb(null, data);
      })
      .catch((err) => cb(err));
  }

  override set(sid: string, sess: SessionData, cb?: Callback) {
    const data = { ...sess, createdAt: sess.createdAt ?? Date.now() };
    (sess as SessionData).createdAt = data.createdAt;
    const userId = (sess as { passport?: { user?: { id?: number } } }).passport?.user?.id ?? null;
    this.opts.model
      .upsert({ sid, data: JSON.stringify(data), expires: this.expiryOf(data), userId })
      .then(() => cb?.())
      .catch((err) => cb?.(err));
  }

  override touch(sid: string, sess: SessionData, cb?: Callback) {
    this.opts.model
      .update({ expires: this.expiryOf(sess) }, { where: { sid } })
      .then(() => cb?.())
      .catch((err) => cb?.(err));
  }

  override destroy(sid: string, cb?: Callback) {
    this.opts.model
      .destroy({ where: { sid } })
      .then(() => cb?.())
      .catch((err) => cb?.(err));
  }

  /** Ends every session of one user, e.g. after a password or role change. */
  async destroyForUser(userId: number, exceptSid?: string): Promise<number> {
    const where = exceptSid ? { userId, sid: { [Op.ne]: exceptSid } } : { userId };
    return this.opts.model.destroy({ where });
  }

  async prune(): Promise<number> {
    try {
      return await this.opts.model.destroy({ where: { expires: { [Op.lte]: new Date() } } });
    } catch {
      return 0;
    }
  }

  close() {
    if (this.timer) clearInterval(this.timer);
  }
}
