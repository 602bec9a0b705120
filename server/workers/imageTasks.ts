/**
 * The image work itself: decode, auto-orient, resize, re-encode, and draw annotations.
 * Only the image worker runs this (jimp blocks whatever thread it is on); the request
 * thread checks type and header dimensions before a task is ever sent here.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { Jimp, loadFont, measureText, measureTextHeight, type JimpInstance } from 'jimp';
import { SANS_16_WHITE, SANS_32_WHITE } from 'jimp/fonts';
import decodeWebp, { init as initWebpDecoder } from '@jsquash/webp/decode.js';
import {
  ANNOTATION_COLORS,
  markerNumbers,
  type Annotation,
  type AnnotationColor,
} from '../../shared/schemas/annotations';
import {
  MAX_IMAGE_PIXELS,
  MAX_IMAGE_SIDE,
  THUMB_MAX_SIDE,
  WEB_MAX_SIDE,
  type AcceptedImageType,
} from '../../shared/uploads';
import {
  fillCircle,
  fillRect,
  fillTriangle,
  hexToRgba,
  luminance,
  paintMask,
  strokeLine,
  type Bitmap,
  type Rgba,
} from './draw';

export type OutputType = 'image/jpeg' | 'image/png';

export interface EncodedImage {
  data: Uint8Array;
  width: number;
  height: number;
  contentType: OutputType;
}

export interface ProcessTask {
  op: 'process';
  data: Uint8Array;
  type: AcceptedImageType;
}

export interface FlattenTask {
  op: 'flatten';
  data: Uint8Array;
  contentType: OutputType;
  annotations: Annotation[];
}

export type ImageTask = ProcessTask | FlattenTask;

/** Expected failures come back as values; a thrown error means the worker itself broke. */
export type TaskFailure = { ok: false; reason: 'undecodable' | 'too-large'; message: string };
export type ProcessResult =
  | {
      ok: true;
      web: EncodedImage;
      thumb: EncodedImage;
      timings: { decodeMs: number; totalMs: number };
    }
  | TaskFailure;
export type FlattenResult = ({ ok: true } & EncodedImage) | TaskFailure;

export const JPEG_QUALITY = 85;
const THUMB_QUALITY = 80;

let webpReady: Promise<void> | undefined;

function ensureWebpDecoder(): Promise<void> {
  // The codec's own loader fetches its .wasm by URL, which Node cannot do for files;
  // compiling it from disk and handing the module over avoids that.
  webpReady ??= (async () => {
    const require = createRequire(import.meta.url);
    const dir = path.dirname(require.resolve('@jsquash/webp/package.json'));
    const wasm = new WebAssembly.Module(fs.readFileSync(path.join(dir, 'codec/dec/webp_dec.wasm')));
    await (initWebpDecoder as unknown as (m: WebAssembly.Module) => Promise<void>)(wasm);
  })();
  return webpReady;
}

/** A Jimp image holding only pixels: nothing of the decoded file's metadata survives. */
function cleanImage(width: number, height: number, data: Buffer): JimpInstance {
  return new Jimp({ width, height, data }) as JimpInstance;
}

async function decode(
  data: Uint8Array,
  type: AcceptedImageType,
): Promise<{ image: JimpInstance; hasAlpha: boolean } | TaskFailure> {
  try {
    if (type === 'image/webp') {
      await ensureWebpDecoder();
      const copy = new Uint8Array(data);
      const out = await decodeWebp(copy.buffer);
      const pixels = Buffer.from(out.data.buffer, out.data.byteOffset, out.data.byteLength);
      return { image: cleanImage(out.width, out.height, pixels), hasAlpha: anyTransparent(pixels) };
    }
    // jpeg-js has its own ceilings (512 MB by default, short of a 40 MP photo); the pixel
    // count was checked from the header already. Jimp.read would drop these options.
    const decoded = (await Jimp.fromBuffer(
      Buffer.from(data.buffer, data.byteOffset, data.byteLength),
      {
        'image/jpeg': { maxResolutionInMP: MAX_IMAGE_PIXELS / 1e6 + 1, maxMemoryUsageInMB: 1100 },
      },
    )) as JimpInstance;
    const { width, height, data: pixels } = decoded.bitmap;
    // Rebuilt from pixels: jimp keeps the decoder's EXIF block on its bitmap and the JPEG
    // encoder writes it back out, GPS position included.
    const image = cleanImage(width, height, pixels as Buffer);
    return { image, hasAlpha: type === 'image/png' };
  } catch (err) {
    return {
      ok: false,
      reason: 'undecodable',
      message: `The image could not be read (${String((err as Error)?.message ?? err).slice(0, 120)}); it may be damaged or cut short.`,
    };
  }
}

function anyTransparent(rgba: Buffer): boolean {
  for (let i = 3; i < rgba.length; i += 4) if (rgba[i] !== 255) return true;
  return false;
}

/**
 * Removes APPn (EXIF, XMP, ICC …) and comment segments from a JPEG, keeping JFIF.
 * The encoder writes none once the bitmap is clean; this keeps it so whatever changes.
 */
export function stripJpegMetadata(buf: Buffer): Buffer {
  if (buf[0] !== 0xff || buf[1] !== 0xd8) return buf;
  const parts: Buffer[] = [buf.subarray(0, 2)];
  let i = 2;
  while (i + 4 <= buf.length && buf[i] === 0xff) {
    const marker = buf[i + 1];
    if (marker === 0xda) break;
    const len = buf.readUInt16BE(i + 2);
    const isMeta = (marker >= 0xe1 && marker <= 0xef) || marker === 0xfe;
    if (!isMeta) parts.push(buf.subarray(i, i + 2 + len));
    i += 2 + len;
  }
  parts.push(buf.subarray(i));
  return Buffer.concat(parts);
}

async function encode(
  image: JimpInstance,
  type: OutputType,
  quality = JPEG_QUALITY,
): Promise<EncodedImage> {
  const buf =
    type === 'image/jpeg'
      ? stripJpegMetadata(await image.getBuffer('image/jpeg', { quality }))
      : await image.getBuffer('image/png');
  return { data: new Uint8Array(buf), width: image.width, height: image.height, contentType: type };
}

/**
 * Halves an image by averaging 2×2 blocks. Used before the final resize while the image
 * is more than twice the target: it is cheap, anti-aliases well, and keeps jimp's
 * resizer (which allocates float buffers the size of its input) working on less.
 */
function halve(image: JimpInstance): JimpInstance {
  const { width: w, height: h, data: src } = image.bitmap;
  const nw = w >> 1;
  const nh = h >> 1;
  const dst = Buffer.alloc(nw * nh * 4);
  for (let y = 0; y < nh; y++) {
    const r0 = 2 * y * w * 4;
    const r1 = r0 + w * 4;
    for (let x = 0; x < nw; x++) {
      const a = r0 + x * 8;
      const b = r1 + x * 8;
      const o = (y * nw + x) * 4;
      for (let c = 0; c < 4; c++)
        dst[o + c] = (src[a + c] + src[a + 4 + c] + src[b + c] + src[b + 4 + c] + 2) >> 2;
    }
  }
  return cleanImage(nw, nh, dst);
}

/** Scales down to at most `side` px on the long side, taking the image out of `box` so
 * the full-size pixels can be collected as soon as the first halving is done. */
function fit(box: { image?: JimpInstance }, side: number): JimpInstance {
  let img = box.image!;
  box.image = undefined;
  while (Math.max(img.width, img.height) >= side * 2) img = halve(img);
  if (Math.max(img.width, img.height) > side) img.scaleToFit({ w: side, h: side });
  return img;
}

/** Decodes, auto-orients (JPEG EXIF orientation) and makes the web copy and the thumbnail. */
export async function processImage(task: ProcessTask): Promise<ProcessResult> {
  const t0 = performance.now();
  const decoded = await decode(task.data, task.type);
  if ('ok' in decoded) return decoded;
  const decodeMs = performance.now() - t0;
  const { width, height } = decoded.image;
  if (width * height > MAX_IMAGE_PIXELS || Math.max(width, height) > MAX_IMAGE_SIDE)
    return {
      ok: false,
      reason: 'too-large',
      message: 'The image has more pixels than its header said.',
    };
  const out: OutputType =
    task.type === 'image/jpeg' || (task.type === 'image/webp' && !decoded.hasAlpha)
      ? 'image/jpeg'
      : 'image/png';
  const web = fit(decoded as { image?: JimpInstance }, WEB_MAX_SIDE);
  const webEncoded = await encode(web, out);
  // A small image is its own thumbnail; encoding it again would only cost time.
  const thumbEncoded =
    Math.max(web.width, web.height) <= THUMB_MAX_SIDE
      ? webEncoded
      : await encode(fit({ image: web }, THUMB_MAX_SIDE), out, THUMB_QUALITY);
  return {
    ok: true,
    web: webEncoded,
    thumb: thumbEncoded,
    timings: { decodeMs: Math.round(decodeMs), totalMs: Math.round(performance.now() - t0) },
  };
}

type Font = Awaited<ReturnType<typeof loadFont>>;
const fonts = new Map<string, Promise<Font>>();
function font(file: string): Promise<Font> {
  let f = fonts.get(file);
  if (!f) fonts.set(file, (f = loadFont(file)));
  return f;
}

const HALO_DARK: Rgba = { r: 0, g: 0, b: 0, a: 0.55 };
const HALO_LIGHT: Rgba = { r: 255, g: 255, b: 255, a: 0.6 };

function colorOf(name: AnnotationColor): Rgba {
  return hexToRgba(ANNOTATION_COLORS[name].hex);
}

function haloFor(c: Rgba): Rgba {
  return luminance(c) < 0.35 ? HALO_LIGHT : HALO_DARK;
}

interface Scale {
  stroke: number;
  radius: number;
  font: Font;
  pad: number;
  /** Height of one line of text. */
  line: number;
}

/** Prints `text` in colour `c` at (x, y), on a backdrop so it reads over any photo. */
function drawText(
  bm: Bitmap,
  s: Scale,
  raw: string,
  x: number,
  y: number,
  c: Rgba,
  maxWidth: number,
) {
  // The bitmap font has Latin glyphs only; anything else shows as "?" rather than vanishing.
  const plain = raw
    .replace(/\s+/g, ' ')
    .replace(/[\u2012-\u2015]/g, '-')
    .replace(/[\u2018\u2019]/g, "'")
    .replace(/[\u201c\u201d]/g, '"')
    .replace(/\u2026/g, '...');
  const text = [...plain].map((ch) => (s.font.chars[ch] ? ch : '?')).join('');
  const tw = Math.min(maxWidth, measureText(s.font, text));
  // One line of slack: the printer wraps a little earlier than the measurement says.
  const w = Math.ceil(Math.min(maxWidth, tw + s.line));
  const h = measureTextHeight(s.font, text, w) + 2;
  const layer = new Jimp({
    width: Math.max(1, Math.ceil(w)),
    height: Math.max(1, Math.ceil(h)),
    color: 0x00000000,
  });
  layer.print({ font: s.font, x: 0, y: 0, text, maxWidth: w });
  const left = Math.max(0, Math.min(bm.width - w - s.pad, x));
  const top = Math.max(0, Math.min(bm.height - h - s.pad, y));
  fillRect(bm, left - s.pad, top - s.pad / 2, tw + 2 * s.pad, h + s.pad, { ...haloFor(c), a: 0.7 });
  paintMask(bm, layer.bitmap, left, top, c);
}

function drawArrow(bm: Bitmap, s: Scale, ax: number, ay: number, bx: number, by: number, c: Rgba) {
  const len = Math.hypot(bx - ax, by - ay) || 1;
  const head = Math.min(len * 0.6, s.stroke * 4.5);
  const ux = (bx - ax) / len;
  const uy = (by - ay) / len;
  const baseX = bx - ux * head;
  const baseY = by - uy * head;
  const half = head * 0.6;
  const tri: [number, number][] = [
    [bx, by],
    [baseX - uy * half, baseY + ux * half],
    [baseX + uy * half, baseY - ux * half],
  ];
  const halo = haloFor(c);
  strokeLine(bm, ax, ay, baseX, baseY, s.stroke + 3, halo);
  strokeLine(bm, ax, ay, baseX, baseY, s.stroke, c);
  fillTriangle(bm, tri, c);
}

function drawBox(bm: Bitmap, s: Scale, x0: number, y0: number, x1: number, y1: number, c: Rgba) {
  const [l, r] = x0 < x1 ? [x0, x1] : [x1, x0];
  const [t, b] = y0 < y1 ? [y0, y1] : [y1, y0];
  fillRect(bm, l, t, r - l, b - t, { ...c, a: 0.16 });
  const halo = haloFor(c);
  const edges: [number, number, number, number][] = [
    [l, t, r, t],
    [r, t, r, b],
    [r, b, l, b],
    [l, b, l, t],
  ];
  for (const [a, bb, cc, d] of edges) strokeLine(bm, a, bb, cc, d, s.stroke + 3, halo);
  for (const [a, bb, cc, d] of edges) strokeLine(bm, a, bb, cc, d, s.stroke, c);
}

async function drawMarker(bm: Bitmap, s: Scale, x: number, y: number, n: number, c: Rgba) {
  fillCircle(bm, x, y, s.radius + 2, haloFor(c));
  fillCircle(bm, x, y, s.radius, c);
  const label = String(n);
  const w = measureText(s.font, label);
  const h = measureTextHeight(s.font, label, w + 10);
  const layer = new Jimp({ width: Math.ceil(w) + 2, height: Math.ceil(h), color: 0x00000000 });
  layer.print({ font: s.font, x: 0, y: 0, text: label });
  const ink: Rgba =
    luminance(c) > 0.55 ? { r: 17, g: 17, b: 17, a: 1 } : { r: 255, g: 255, b: 255, a: 1 };
  paintMask(bm, layer.bitmap, x - w / 2, y - h / 2, ink);
}

/** Draws annotations (positions relative 0..1) over a web copy, for a download. */
export async function flattenImage(task: FlattenTask): Promise<FlattenResult> {
  const decoded = await decode(task.data, task.contentType);
  if ('ok' in decoded) return decoded;
  const { image } = decoded;
  const bm = image.bitmap as Bitmap;
  const long = Math.max(bm.width, bm.height);
  const f = await font(long >= 900 ? SANS_32_WHITE : SANS_16_WHITE);
  const s: Scale = {
    stroke: Math.max(2, Math.round(long / 320)),
    radius: Math.max(9, Math.round(long / 55)),
    font: f,
    pad: long >= 900 ? 6 : 3,
    line: measureTextHeight(f, 'Ag', 1000),
  };
  const numbers = markerNumbers(task.annotations);
  const X = (v: number) => v * bm.width;
  const Y = (v: number) => v * bm.height;
  const textWidth = Math.max(60, bm.width * 0.45);
  for (const a of task.annotations) {
    const c = colorOf(a.color);
    switch (a.type) {
      case 'box':
        drawBox(bm, s, X(a.x), Y(a.y), X(a.x2), Y(a.y2), c);
        if (a.text)
          drawText(
            bm,
            s,
            a.text,
            Math.min(X(a.x), X(a.x2)),
            Math.min(Y(a.y), Y(a.y2)) - s.line - s.pad,
            c,
            textWidth,
          );
        break;
      case 'arrow':
        drawArrow(bm, s, X(a.x), Y(a.y), X(a.x2), Y(a.y2), c);
        if (a.text) drawText(bm, s, a.text, X(a.x), Y(a.y), c, textWidth);
        break;
      case 'label':
        drawText(bm, s, a.text, X(a.x), Y(a.y), c, textWidth);
        break;
      case 'marker':
        await drawMarker(bm, s, X(a.x), Y(a.y), numbers.get(a.id) ?? 0, c);
        break;
    }
  }
  const out = await encode(image, task.contentType, 90);
  return { ok: true, ...out };
}
