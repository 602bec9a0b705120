import crypto from 'node:crypto';
import fs from 'node:fs';
import fsp from 'node:fs/promises';
import path from 'node:path';
import type { BlobStorage } from './index';
import { isValidKey } from './keys';

function assertKey(key: string) {
  if (!isValidKey(key)) throw new Error(`Not a storage key: ${JSON.stringify(key).slice(0, 80)}`);
}

/** True when `child` is `parent` or inside it. */
function isInside(child: string, parent: string): boolean {
  const rel = path.relative(parent, child);
  return rel === '' || (!rel.startsWith('..') && !path.isAbsolute(rel));
}

/**
 * Blobs in a folder on local disk, two levels of sharding by the key's first characters.
 * Writes go to a temporary file in the same folder tree and are renamed into place, so a
 * reader never sees half a file and a crash leaves at most a stray temporary file, which
 * a later start removes.
 */
export class LocalDiskStorage implements BlobStorage {
  private readonly tmpDir: string;

  /** `forbidden` lists folders the store must not be inside (the served client). */
  constructor(
    readonly root: string,
    forbidden: string[] = [],
  ) {
    this.root = path.resolve(root);
    for (const dir of forbidden) {
      if (isInside(this.root, path.resolve(dir)))
        throw new Error(
          `The upload folder ${this.root} is inside ${dir}, which is served to browsers as it is. Set UPLOAD_DIR to a folder outside it.`,
        );
    }
    this.tmpDir = path.join(this.root, '.tmp');
    fs.mkdirSync(this.tmpDir, { recursive: true });
    // Another process (a script, a second server) may be writing here right now, so only
    // leftovers old enough to be from a crash are removed.
    const stale = Date.now() - 60 * 60 * 1000;
    for (const f of fs.readdirSync(this.tmpDir)) {
      const p = path.join(this.tmpDir, f);
      try {
        if (fs.statSync(p).mtimeMs < stale) fs.rmSync(p, { force: true });
      } catch {
        // gone already
      }
    }
  }

  /** The file that holds `key`. */
  pathOf(key: string): string {
    assertKey(key);
    return path.join(this.root, key.slice(0, 2), key.slice(2, 4), key);
  }

  async put(key: string, data: Buffer): Promise<{ created: boolean }> {
    const file = this.pathOf(key);
    if (await this.exists(key)) return { created: false };
    await fsp.mkdir(path.dirname(file), { recursive: true });
    const tmp = path.join(this.tmpDir, `${crypto.randomBytes(8).toString('hex')}-${key}`);
    try {
      const handle = await fsp.open(tmp, 'wx', 0o640);
      try {
        await handle.writeFile(data);
        await handle.sync();
      } finally {
        await handle.close();
      }
      await fsp.rename(tmp, file);
    } catch (err) {
      await fsp.rm(tmp, { force: true });
      throw err;
    }
    return { created: true };
  }

  async get(key: string) {
    const file = this.pathOf(key);
    try {
      const handle = await fsp.open(file, 'r');
      const { size } = await handle.stat();
      return { stream: handle.createReadStream(), size };
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
  }

  async getBuffer(key: string) {
    try {
      return await fsp.readFile(this.pathOf(key));
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
      throw err;
    }
  }

  async exists(key: string) {
    try {
      await fsp.access(this.pathOf(key));
      return true;
    } catch {
      return false;
    }
  }

  async delete(key: string) {
    await fsp.rm(this.pathOf(key), { force: true });
  }

  /** Every stored key and temporary file, for tests that check nothing was left behind. */
  async listAll(): Promise<string[]> {
    const out: string[] = [];
    const walk = async (dir: string) => {
      for (const e of await fsp.readdir(dir, { withFileTypes: true })) {
        const p = path.join(dir, e.name);
        if (e.isDirectory()) await walk(p);
        else out.push(path.relative(this.root, p));
      }
    };
    await walk(this.root);
    return out;
  }
}
