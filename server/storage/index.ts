import type { Readable } from 'node:stream';

/**
 * Where re-encoded images live. Keys are content addresses (`<sha256>-<variant>.<ext>`),
 * so a write of the same bytes is idempotent. The local-disk store is the default;
 * an S3-compatible bucket can implement the same interface.
 */
export interface BlobStorage {
  /** Stores `data` under `key`; resolves `created: false` when it was already there. */
  put(key: string, data: Buffer, contentType: string): Promise<{ created: boolean }>;
  /** The stored bytes as a stream, or null when there is nothing under `key`. */
  get(key: string): Promise<{ stream: Readable; size: number } | null>;
  /** The stored bytes, or null when there is nothing under `key`. */
  getBuffer(key: string): Promise<Buffer | null>;
  exists(key: string): Promise<boolean>;
  /** Removes `key`; no error when it is not there. */
  delete(key: string): Promise<void>;
}

export { isValidKey } from './keys';
export { LocalDiskStorage } from './localDisk';
