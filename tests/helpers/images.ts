/**
 * Image files for upload tests, made in the test itself: photos from jimp, an EXIF
 * block with a GPS position built byte by byte, PNG headers that lie about their size.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import zlib from 'node:zlib';
import { Jimp } from 'jimp';

/** A deterministic pseudo-random generator, so fixtures are the same on every run. */
function rng(seed: number) {
  let s = seed >>> 0 || 1;
  return () => {
    s = (Math.imul(s, 1103515245) + 12345) >>> 0;
    return s >>> 16;
  };
}

/** A photo-like image: colour gradients with grain, so it compresses like a photo. */
export function photoBitmap(width: number, height: number, seed = 1) {
  const img = new Jimp({ width, height, color: 0xffffffff });
  const d = img.bitmap.data;
  const next = rng(seed);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      const n = next() & 31;
      d[i] = ((x * 255) / width + n + seed * 40) & 255;
      d[i + 1] = ((y * 255) / height + n) & 255;
      d[i + 2] = (((x + y) >> 4) + n + seed * 70) & 255;
      d[i + 3] = 255;
    }
  }
  return img;
}

export async function jpeg(width: number, height: number, seed = 1, quality = 85): Promise<Buffer> {
  return photoBitmap(width, height, seed).getBuffer('image/jpeg', { quality });
}

export async function png(width: number, height: number, seed = 1): Promise<Buffer> {
  return photoBitmap(width, height, seed).getBuffer('image/png');
}

function u16(n: number) {
  const b = Buffer.alloc(2);
  b.writeUInt16BE(n);
  return b;
}
function u32(n: number) {
  const b = Buffer.alloc(4);
  b.writeUInt32BE(n);
  return b;
}

/**
 * A big-endian TIFF/EXIF block: IFD0 with Orientation and a GPS IFD pointer; the GPS
 * IFD holds latitude 47° 22' 30" N and longitude 8° 32' 24" E.
 */
export function exifWithGps(orientation = 1): Buffer {
  const entry = (tag: number, type: number, count: number, value: Buffer) =>
    Buffer.concat([
      u16(tag),
      u16(type),
      u32(count),
      Buffer.concat([value, Buffer.alloc(4)]).subarray(0, 4),
    ]);
  const SHORT = 3;
  const LONG = 4;
  const ASCII = 2;
  const RATIONAL = 5;
  // Layout: header 8, IFD0 at 8 (2 entries: 2 + 24 + 4 = 30) → GPS IFD at 38
  // (4 entries: 2 + 48 + 4 = 54) → rationals at 92 (lat 24 bytes) and 116 (lon 24 bytes).
  const gpsIfd = 38;
  const latAt = 92;
  const lonAt = 116;
  const ifd0 = Buffer.concat([
    u16(2),
    entry(0x0112, SHORT, 1, u16(orientation)),
    entry(0x8825, LONG, 1, u32(gpsIfd)),
    u32(0),
  ]);
  const gps = Buffer.concat([
    u16(4),
    entry(0x0001, ASCII, 2, Buffer.from('N\0')),
    entry(0x0002, RATIONAL, 3, u32(latAt)),
    entry(0x0003, ASCII, 2, Buffer.from('E\0')),
    entry(0x0004, RATIONAL, 3, u32(lonAt)),
    u32(0),
  ]);
  const rational = (...pairs: number[]) => Buffer.concat(pairs.map(u32));
  const tiff = Buffer.concat([
    Buffer.from('MM'),
    u16(42),
    u32(8),
    ifd0,
    gps,
    rational(47, 1, 22, 1, 30, 1),
    rational(8, 1, 32, 1, 24, 1),
  ]);
  if (tiff.length !== lonAt + 24) throw new Error(`EXIF layout is off: ${tiff.length}`);
  return Buffer.concat([Buffer.from('Exif\0\0'), tiff]);
}

/** Inserts a JPEG segment (APPn, COM …) right after the SOI marker. */
export function withSegment(jpegBytes: Buffer, marker: number, payload: Buffer): Buffer {
  return Buffer.concat([
    jpegBytes.subarray(0, 2),
    Buffer.from([0xff, marker]),
    u16(payload.length + 2),
    payload,
    jpegBytes.subarray(2),
  ]);
}

/** Segment markers of a JPEG up to the start of scan, e.g. [0xe0, 0xdb, 0xc0 …]. */
export function jpegMarkers(buf: Buffer): number[] {
  const out: number[] = [];
  let i = 2;
  while (i + 4 <= buf.length && buf[i] === 0xff) {
    const m = buf[i + 1];
    out.push(m);
    if (m === 0xda) break;
    i += 2 + buf.readUInt16BE(i + 2);
  }
  return out;
}

function chunk(type: string, data: Buffer) {
  const t = Buffer.from(type, 'latin1');
  return Buffer.concat([u32(data.length), t, data, u32(zlib.crc32(Buffer.concat([t, data])))]);
}

/** A valid-looking PNG whose header claims `width` × `height`, with a few bytes of data. */
export function pngClaiming(width: number, height: number): Buffer {
  const ihdr = Buffer.concat([u32(width), u32(height), Buffer.from([8, 6, 0, 0, 0])]);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', zlib.deflateSync(Buffer.alloc(1024))),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

let webpEncoder: Promise<(rgba: Uint8Array, w: number, h: number) => Promise<Buffer>> | undefined;

/** Encodes a WebP with the same codec package the server decodes with. */
export async function webp(width: number, height: number, seed = 1): Promise<Buffer> {
  webpEncoder ??= (async () => {
    const require = createRequire(import.meta.url);
    const dir = path.dirname(require.resolve('@jsquash/webp/package.json'));
    const mod = await import('@jsquash/webp/encode.js');
    const wasm = new WebAssembly.Module(
      fs.readFileSync(path.join(dir, 'codec/enc/webp_enc_simd.wasm')),
    );
    await (mod.init as unknown as (m: WebAssembly.Module) => Promise<unknown>)(wasm);
    return async (rgba, w, h) =>
      Buffer.from(
        await mod.default(
          {
            data: new Uint8ClampedArray(rgba),
            width: w,
            height: h,
            colorSpace: 'srgb',
          } as ImageData,
          {
            quality: 80,
          },
        ),
      );
  })();
  const img = photoBitmap(width, height, seed);
  return (await webpEncoder)(img.bitmap.data, width, height);
}

/** Large photo-like JPEGs, made in parallel threads (about 6 s of one core each at 12 MP). */
export async function largeJpegs(count: number, width: number, height: number): Promise<Buffer[]> {
  const { Worker } = await import('node:worker_threads');
  const one = (seed: number) =>
    new Promise<Buffer>((resolve, reject) => {
      const w = new Worker(new URL('./photo.worker.mjs', import.meta.url), {
        workerData: { width, height, seed, quality: 85 },
      });
      w.once('message', (m: Uint8Array) => resolve(Buffer.from(m)));
      w.once('error', reject);
    });
  return Promise.all(Array.from({ length: count }, (_, i) => one(i + 1)));
}
