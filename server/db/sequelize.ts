import fs from 'node:fs';
import path from 'node:path';
import { Sequelize, Transaction, type Options } from 'sequelize';
import type { Logger } from '../logger';

/**
 * PRAGMAs every SQLite connection gets. Sequelize opens a new connection for each
 * transaction and the ones set on the first connection do not carry over, so they are
 * applied in a connection hook.
 *
 * synchronous=NORMAL in WAL mode: a committed transaction survives a crash of the
 * process; after a power cut the last few commits may be rolled back, but the file
 * is never corrupted.
 */
export const CONNECTION_PRAGMAS = {
  journal_mode: 'WAL',
  busy_timeout: 5000,
  foreign_keys: 'ON',
  synchronous: 'NORMAL',
} as const;

interface RawSqliteConnection {
  exec(sql: string, cb: (err: Error | null) => void): void;
}

function applyPragmas(conn: RawSqliteConnection): Promise<void> {
  const sql = Object.entries(CONNECTION_PRAGMAS)
    .map(([k, v]) => `PRAGMA ${k}=${v};`)
    .join(' ');
  return new Promise((resolve, reject) => conn.exec(sql, (err) => (err ? reject(err) : resolve())));
}

export interface DatabaseOptions {
  file: string;
  url?: string;
  logger?: Logger;
}

/** Opens the database: the SQLite file by default, or DATABASE_URL when it is set. */
export function createSequelize({ file, url, logger }: DatabaseOptions): Sequelize {
  const logging = logger ? (sql: string) => logger.trace({ sql }, 'sql') : false;
  const common: Options = {
    logging,
    define: { underscored: true },
    retry: { max: 5, match: [/SQLITE_BUSY/] },
  };
  if (url) return new Sequelize(url, common);

  fs.mkdirSync(path.dirname(file), { recursive: true });
  const sequelize = new Sequelize({
    ...common,
    dialect: 'sqlite',
    storage: file,
    // Read-then-write transactions take the write lock up front; with DEFERRED most
    // concurrent ones fail with SQLITE_BUSY when they try to upgrade.
    transactionType: Transaction.TYPES.IMMEDIATE,
  });

  const manager = sequelize.connectionManager as unknown as {
    getConnection(options?: unknown): Promise<RawSqliteConnection>;
  };
  const original = manager.getConnection.bind(manager);
  const prepared = new WeakSet<object>();
  manager.getConnection = async (options?: unknown) => {
    const conn = await original(options);
    if (!prepared.has(conn)) {
      prepared.add(conn);
      await applyPragmas(conn);
    }
    return conn;
  };
  serializeTransactions(sequelize);
  return sequelize;
}

/**
 * Lets one transaction at a time into SQLite from this process. SQLite has one writer
 * anyway; without this, transactions waiting for the lock sleep inside sqlite3 on
 * libuv's few pool threads, the one holding the lock cannot run its next statement,
 * and all of them time out with SQLITE_BUSY.
 */
function serializeTransactions(sequelize: Sequelize) {
  let tail: Promise<void> = Promise.resolve();
  const acquire = () => {
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));
    const ready = tail;
    tail = tail.then(() => held);
    return ready.then(() => release);
  };
  const original = sequelize.transaction.bind(sequelize) as (
    ...args: unknown[]
  ) => Promise<unknown>;
  (sequelize as unknown as { transaction: (...args: unknown[]) => Promise<unknown> }).transaction =
    async (...args: unknown[]) => {
      const release = await acquire();
      const managed = typeof args[args.length - 1] === 'function';
      if (managed) {
        try {
          return await original(...args);
        } finally {
          release();
        }
      }
      try {
        const t = (await original(...args)) as Transaction;
        let released = false;
        const once = () => {
          if (!released) {
            released = true;
            release();
          }
        };
        const commit = t.commit.bind(t);
        const rollback = t.rollback.bind(t);
        t.commit = () => commit().finally(once);
        t.rollback = () => rollback().finally(once);
        return t;
      } catch (err) {
        release();
        throw err;
      }
    };
}

/** True for the errors SQLite gives when another connection holds the write lock. */
export function isBusyError(err: unknown): boolean {
  const e = err as {
    original?: { code?: string };
    parent?: { code?: string };
    code?: string;
    message?: string;
  };
  const code = e?.original?.code ?? e?.parent?.code ?? e?.code;
  return code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED' || /SQLITE_BUSY/.test(e?.message ?? '');
}
