// Makes one large photo-like JPEG in a thread of its own, so a test can make two at once.
// Plain JavaScript: the thread needs no TypeScript loader. Mirrors photoBitmap() in images.ts.
import { parentPort, workerData } from 'node:worker_threads';
import { Jimp } from 'jimp';

const { width, height, seed, quality } = workerData;
const img = new Jimp({ width, height, color: 0xffffffff });
const d = img.bitmap.data;
let s = seed >>> 0 || 1;
for (let y = 0; y < height; y++) {
  for (let x = 0; x < width; x++) {
    s = (Math.imul(s, 1103515245) + 12345) >>> 0;
    const n = (s >>> 16) & 31;
    const i = (y * width + x) * 4;
    d[i] = ((x * 255) / width + n + seed * 40) & 255;
    d[i + 1] = ((y * 255) / height + n) & 255;
    d[i + 2] = (((x + y) >> 4) + n + seed * 70) & 255;
    d[i + 3] = 255;
  }
}
const out = await img.getBuffer('image/jpeg', { quality });
parentPort.postMessage(new Uint8Array(out));
