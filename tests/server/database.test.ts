import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { createTestEnv, type TestEnv } from '../helpers/context';
import { backupDatabase, integrityCheck, restoreDatabase } from '../../server/db/backup';
import { createSequelize } from '../../server/db/sequelize';

let env: TestEnv;
beforeAll(async () => {
  env = await createTestEnv();
});
afterAll(() => env.close());

async function pragma(name: string, transaction?: import('sequelize').Transaction) {
  const [row] = await env.ctx.sequelize.query<Record<string, unknown>>(`PRAGMA ${name}`, {
    type: QueryTypes.SELECT,
    transaction,
  });
  return Object.values(row)[0];
}

describe('SQLite connections', () => {
  it('run with WAL, a busy timeout, foreign keys and synchronous=NORMAL outside a transaction', async () => {
    expect(await pragma('journal_mode')).toBe('wal');
    expect(await pragma('busy_timeout')).toBe(5000);
    expect(await pragma('foreign_keys')).toBe(1);
    expect(await pragma('synchronous')).toBe(1);
  });

  it('run with the same PRAGMAs inside a transaction, on the connection Sequelize opens for it', async () => {
    await env.ctx.sequelize.transaction(async (t) => {
      expect(await pragma('busy_timeout', t)).toBe(5000);
      expect(await pragma('foreign_keys', t)).toBe(1);
      expect(await pragma('synchronous', t)).toBe(1);
      expect(await pragma('journal_mode', t)).toBe('wal');
    });
  });

  it('let concurrent read-then-write transactions all succeed (IMMEDIATE, not DEFERRED)', async () => {
    const { AuditEntry } = env.ctx.models;
    const before = await AuditEntry.count();
    const results = await Promise.allSettled(
      Array.from({ length: 10 }, (_, i) =>
        env.ctx.sequelize.transaction(async (transaction) => {
          const n = await AuditEntry.count({ transaction });
          await AuditEntry.create(
            {
              actorId: null,
              action: 'test.concurrent',
              targetType: 'test',
              targetId: String(i),
              details: { n },
            },
            { transaction },
          );
        }),
      ),
    );
    expect(results.filter((r) => r.status === 'rejected')).toEqual([]);
    expect(await AuditEntry.count()).toBe(before + 10);
  });
});

describe('backup and restore', () => {
  it('backs up under write load, restores into a fresh DATA_DIR, and keeps integrity and row counts', async () => {
    const { AuditEntry } = env.ctx.models;
    let writing = true;
    let written = 0;
    const load = (async () => {
      while (writing) {
        await AuditEntry.create({
          actorId: null,
          action: 'test.load',
          targetType: 'test',
          targetId: null,
          details: null,
        });
        written++;
      }
    })();
    await new Promise((r) => setTimeout(r, 100));
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-backup-'));
    const file = path.join(dir, 'copy.sqlite');
    await backupDatabase(env.ctx.config.databaseFile, file);
    await new Promise((r) => setTimeout(r, 50));
    writing = false;
    await load;
    expect(written).toBeGreaterThan(5);
    expect(await integrityCheck(file)).toBe('ok');

    const freshDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-restore-'));
    const target = path.join(freshDir, 'loomwright.sqlite');
    await restoreDatabase(file, target);
    expect(await integrityCheck(target)).toBe('ok');
    const restored = createSequelize({ file: target });
    const [row] = await restored.query<{ n: number }>('SELECT COUNT(*) AS n FROM audit_log', {
      type: QueryTypes.SELECT,
    });
    const [users] = await restored.query<{ n: number }>('SELECT COUNT(*) AS n FROM users', {
      type: QueryTypes.SELECT,
    });
    await restored.close();
    const liveCount = await AuditEntry.count();
    // The copy is one consistent snapshot taken during the load: more than before it, at most all.
    expect(row.n).toBeGreaterThan(0);
    expect(row.n).toBeLessThanOrEqual(liveCount);
    expect(users.n).toBe(await env.ctx.models.User.count());
  });

  it('refuses to restore over a database that is in use', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lw-backup-'));
    const file = path.join(dir, 'copy.sqlite');
    await backupDatabase(env.ctx.config.databaseFile, file);
    // Hold a write transaction open on the live database, as a running server may.
    const t = await env.ctx.sequelize.transaction();
    try {
      await env.ctx.models.AuditEntry.create(
        { actorId: null, action: 'test.hold', targetType: 'test', targetId: null, details: null },
        { transaction: t },
      );
      await expect(restoreDatabase(file, env.ctx.config.databaseFile)).rejects.toThrow(
        /Stop the server/,
      );
    } finally {
      await t.rollback();
    }
  });
});
