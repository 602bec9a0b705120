import fs from 'node:fs';
import path from 'node:path';
import sqlite3 from 'sqlite3';

function open(file: string, mode = sqlite3.OPEN_READWRITE): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(db)));
  });
}
const run = (db: sqlite3.Database, sql: string, params: unknown[] = []) =>
  new Promise<void>((resolve, reject) =>
    db.run(sql, params, (err) => (err ? reject(err) : resolve())),
  );
const all = <T>(db: sqlite3.Database, sql: string) =>
  new Promise<T[]>((resolve, reject) =>
    db.all(sql, (err, rows) => (err ? reject(err) : resolve(rows as T[]))),
  );
const close = (db: sqlite3.Database) => new Promise<void>((resolve) => db.close(() => resolve()));

/** Runs PRAGMA integrity_check; resolves with 'ok' or the problems it lists. */
export async function integrityCheck(file: string): Promise<string> {
  const db = await open(file, sqlite3.OPEN_READONLY);
  try {
    const rows = await all<{ integrity_check: string }>(db, 'PRAGMA integrity_check');
    return rows.map((r) => r.integrity_check).join('; ');
  } finally {
    await close(db);
  }
}

/**
 * Writes a consistent copy of a live database with VACUUM INTO: it reads one snapshot
 * while the server goes on writing (WAL), then the copy is fsynced and renamed into place.
 */
export async function backupDatabase(source: string, target: string): Promise<void> {
  if (!fs.existsSync(source)) throw new Error(`There is no database at ${source}.`);
  fs.mkdirSync(path.dirname(path.resolve(target)), { recursive: true });
  const temp = `${target}.partial`;
  fs.rmSync(temp, { force: true });
  const db = await open(source);
  try {
    await run(db, 'PRAGMA busy_timeout=10000');
    await run(db, 'VACUUM INTO ?', [temp]);
  } finally {
    await close(db);
  }
  const fd = fs.openSync(temp, 'r');
  fs.fsyncSync(fd);
  fs.closeSync(fd);
  const check = await integrityCheck(temp);
  if (check !== 'ok') {
    fs.rmSync(temp, { force: true });
    throw new Error(`The backup failed its integrity check: ${check}`);
  }
  fs.renameSync(temp, target);
}

/**
 * Puts a backup in place of the database. The server must be stopped: an exclusive
 * lock is taken first and refused while another process has the database open.
 */
export async function restoreDatabase(backup: string, target: string): Promise<void> {
  if (!fs.existsSync(backup)) throw new Error(`There is no backup file at ${backup}.`);
  const check = await integrityCheck(backup);
  if (check !== 'ok') throw new Error(`The backup is damaged (${check}); nothing was restored.`);
  fs.mkdirSync(path.dirname(target), { recursive: true });
  if (fs.existsSync(target)) {
    const db = await open(target);
    try {
      await run(db, 'PRAGMA busy_timeout=0');
      await run(db, 'BEGIN EXCLUSIVE');
      await run(db, 'ROLLBACK');
    } catch {
      await close(db);
      throw new Error('The database is in use. Stop the server before restoring a backup.');
    }
    await close(db);
  }
  const temp = `${target}.restoring`;
  fs.copyFileSync(backup, temp);
  for (const suffix of ['-wal', '-shm']) fs.rmSync(target + suffix, { force: true });
  fs.renameSync(temp, target);
}
