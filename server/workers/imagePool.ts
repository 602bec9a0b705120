import { createRequire } from 'node:module';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import type { AcceptedImageType } from '../../shared/uploads';
import type { Annotation } from '../../shared/schemas/annotations';
import type { FlattenResult, ImageTask, OutputType, ProcessResult } from './imageTasks';

export interface ImagePoolOptions {
  /** Worker threads; each decodes one image at a time. */
  threads?: number;
  /** Tasks waiting for a thread before new ones are refused as busy. */
  maxQueue?: number;
  /**
   * A task running longer than this plus `taskTimeoutMsPerMegapixel` per megapixel is
   * stopped (its thread is replaced). Generous: a 12 MP photo takes about 5 s of an idle
   * core, several times that on a busy machine; the point is to end a decoder stuck on
   * hostile input, not to race a slow one.
   */
  taskTimeoutMs?: number;
  taskTimeoutMsPerMegapixel?: number;
  /**
   * V8 heap per worker. The JPEG decoder keeps one small typed array per 8×8 block on
   * it: about 280 MB for a 40-megapixel photo.
   */
  maxOldGenerationSizeMb?: number;
  /**
   * Pixels being decoded at once, across all threads. Decoding costs about 30 bytes per
   * pixel (most of it outside the V8 heap, where resourceLimits cannot see it), so this
   * is what bounds the memory: 48 MP ≈ 1.5 GB at the very worst.
   */
  pixelBudget?: number;
  /** Idle threads exit after this long, returning their memory; the next task starts one. */
  idleTimeoutMs?: number;
}

export type ImagePoolFailure = 'busy' | 'timeout' | 'crashed' | 'closed';

/** Why a task did not finish: the pool was full, the task too slow, or its worker died. */
export class ImagePoolError extends Error {
  constructor(
    readonly kind: ImagePoolFailure,
    message: string,
  ) {
    super(message);
    this.name = 'ImagePoolError';
  }
}

const WORKER_FILE = new URL('./image.worker.ts', import.meta.url);

/**
 * Workers inherit the parent's execArgv, which carries the TypeScript loader when the
 * server runs under `node --import tsx`. Test runners load TypeScript their own way, so
 * the loader is added explicitly when it is missing.
 */
function workerExecArgv(): string[] | undefined {
  if (!WORKER_FILE.pathname.endsWith('.ts')) return undefined;
  if (process.execArgv.some((a) => a.includes('tsx'))) return undefined;
  const require = createRequire(import.meta.url);
  const loader = path.join(path.dirname(require.resolve('tsx/package.json')), 'dist', 'loader.mjs');
  return [...process.execArgv, '--import', pathToFileURL(loader).href];
}

/**
 * A small pool of worker threads for jimp, so decoding never blocks the request thread.
 * Threads start on first use; `close()` stops them.
 */
export class ImagePool {
  /** Tasks handed to a worker since start (tests use it to prove a refusal never decoded). */
  tasksStarted = 0;
  private pool?: Piscina;
  private closed = false;
  private readonly opts: Required<ImagePoolOptions>;
  private pixelsInFlight = 0;
  private running = 0;
  private readonly waiting: Array<{ cost: number; start: () => void }> = [];

  constructor(opts: ImagePoolOptions = {}) {
    this.opts = {
      threads: opts.threads ?? 2,
      maxQueue: opts.maxQueue ?? 64,
      taskTimeoutMs: opts.taskTimeoutMs ?? 60_000,
      taskTimeoutMsPerMegapixel: opts.taskTimeoutMsPerMegapixel ?? 4_000,
      maxOldGenerationSizeMb: opts.maxOldGenerationSizeMb ?? 512,
      pixelBudget: opts.pixelBudget ?? 48_000_000,
      idleTimeoutMs: opts.idleTimeoutMs ?? 30_000,
    };
  }

  private fits(cost: number) {
    return this.running < this.opts.threads && this.pixelsInFlight + cost <= this.opts.pixelBudget;
  }

  /**
   * Waits until a thread is free and `cost` pixels fit in the budget; first come, first
   * served. Waiting here rather than in piscina's queue keeps the task timeout about
   * run time only.
   */
  private async admit(cost: number): Promise<void> {
    if (this.waiting.length === 0 && this.fits(cost)) {
      this.pixelsInFlight += cost;
      this.running++;
      return;
    }
    if (this.waiting.length >= this.opts.maxQueue)
      throw new ImagePoolError('busy', 'Too many images are being processed right now.');
    await new Promise<void>((start) => this.waiting.push({ cost, start }));
  }

  private done(cost: number) {
    this.pixelsInFlight -= cost;
    this.running--;
    while (this.waiting.length && this.fits(this.waiting[0].cost)) {
      const next = this.waiting.shift()!;
      this.pixelsInFlight += next.cost;
      this.running++;
      next.start();
    }
  }

  private piscina(): Piscina {
    if (this.closed) throw new ImagePoolError('closed', 'The image workers are shutting down.');
    this.pool ??= new Piscina({
      filename: WORKER_FILE.href,
      minThreads: 0,
      maxThreads: this.opts.threads,
      maxQueue: this.opts.maxQueue,
      concurrentTasksPerWorker: 1,
      idleTimeout: this.opts.idleTimeoutMs,
      execArgv: workerExecArgv(),
      resourceLimits: {
        maxOldGenerationSizeMb: this.opts.maxOldGenerationSizeMb,
        maxYoungGenerationSizeMb: 64,
        codeRangeSizeMb: 64,
        stackSizeMb: 4,
      },
    });
    return this.pool;
  }

  private async run<T>(task: ImageTask, pixels: number): Promise<T> {
    const pool = this.piscina();
    const cost = Math.min(Math.max(1, pixels), this.opts.pixelBudget);
    await this.admit(cost);
    if (this.closed) {
      this.done(cost);
      throw new ImagePoolError('closed', 'The image workers are shutting down.');
    }
    this.tasksStarted++;
    try {
      const timeout = this.opts.taskTimeoutMs + (this.opts.taskTimeoutMsPerMegapixel * cost) / 1e6;
      return (await pool.run(task, { signal: AbortSignal.timeout(Math.round(timeout)) })) as T;
    } catch (err) {
      const e = err as { name?: string; code?: string; message?: string };
      if (e?.name === 'AbortError' || e?.name === 'TimeoutError')
        throw new ImagePoolError('timeout', 'The image took too long to process.');
      if (/queue is at limit/i.test(e?.message ?? ''))
        throw new ImagePoolError('busy', 'Too many images are being processed right now.');
      if (this.closed) throw new ImagePoolError('closed', 'The image workers are shutting down.');
      throw new ImagePoolError(
        'crashed',
        `The image worker stopped: ${e?.code ?? e?.message ?? 'unknown reason'}.`,
      );
    } finally {
      this.done(cost);
    }
  }

  /**
   * Decodes an image of a checked type and makes its web copy and thumbnail. `pixels`
   * is the count its header gave, and what it is charged against the budget.
   */
  process(data: Uint8Array, type: AcceptedImageType, pixels: number): Promise<ProcessResult> {
    return this.run<ProcessResult>({ op: 'process', data, type }, pixels);
  }

  /** Draws annotations over a stored web copy of `pixels` pixels. */
  flatten(
    data: Uint8Array,
    contentType: OutputType,
    annotations: Annotation[],
    pixels: number,
  ): Promise<FlattenResult> {
    return this.run<FlattenResult>({ op: 'flatten', data, contentType, annotations }, pixels);
  }

  /** Threads, queue and counters, for tests and diagnostics. */
  stats() {
    return {
      threads: this.pool?.threads.length ?? 0,
      queued: (this.pool?.queueSize ?? 0) + this.waiting.length,
      pixelsInFlight: this.pixelsInFlight,
      completed: this.pool?.completed ?? 0,
      started: this.tasksStarted,
    };
  }

  /** Stops the threads; running tasks are abandoned. */
  async close() {
    this.closed = true;
    for (const w of this.waiting.splice(0)) {
      this.running++;
      w.start();
    }
    const pool = this.pool;
    this.pool = undefined;
    await pool?.destroy();
  }
}
