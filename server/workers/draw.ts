/**
 * Small raster drawing on an RGBA bitmap, for flattening annotations onto a photo.
 * Runs in the image worker; no jimp here so it stays testable on its own.
 */

export interface Bitmap {
  data: Buffer | Uint8Array;
  width: number;
  height: number;
}

export interface Rgba {
  r: number;
  g: number;
  b: number;
  /** 0..1 */
  a: number;
}

/** Parses "#rrggbb" into a colour with the given opacity. */
export function hexToRgba(hex: string, a = 1): Rgba {
  const n = Number.parseInt(hex.replace('#', ''), 16);
  return { r: (n >> 16) & 255, g: (n >> 8) & 255, b: n & 255, a };
}

/** Relative luminance 0..1, to pick black or white text over a colour. */
export function luminance(c: Rgba): number {
  return (0.2126 * c.r + 0.7152 * c.g + 0.0722 * c.b) / 255;
}

/** Blends one pixel over the bitmap with `coverage` (0..1) times the colour's opacity. */
export function blend(bm: Bitmap, x: number, y: number, c: Rgba, coverage = 1) {
  if (x < 0 || y < 0 || x >= bm.width || y >= bm.height) return;
  const a = c.a * coverage;
  if (a <= 0) return;
  const i = (y * bm.width + x) * 4;
  const d = bm.data;
  d[i] = Math.round(c.r * a + d[i] * (1 - a));
  d[i + 1] = Math.round(c.g * a + d[i + 1] * (1 - a));
  d[i + 2] = Math.round(c.b * a + d[i + 2] * (1 - a));
  d[i + 3] = Math.round(255 * a + d[i + 3] * (1 - a));
}

const clamp01 = (v: number) => (v < 0 ? 0 : v > 1 ? 1 : v);

/** A filled disc with a soft one-pixel edge. */
export function fillCircle(bm: Bitmap, cx: number, cy: number, radius: number, c: Rgba) {
  const x0 = Math.floor(cx - radius - 1);
  const x1 = Math.ceil(cx + radius + 1);
  const y0 = Math.floor(cy - radius - 1);
  const y1 = Math.ceil(cy + radius + 1);
  for (let y = Math.max(0, y0); y <= Math.min(bm.height - 1, y1); y++) {
    for (let x = Math.max(0, x0); x <= Math.min(bm.width - 1, x1); x++) {
      const d = Math.hypot(x + 0.5 - cx, y + 0.5 - cy);
      blend(bm, x, y, c, clamp01(radius - d + 0.5));
    }
  }
}

/** A straight line of the given width with round ends. */
export function strokeLine(
  bm: Bitmap,
  ax: number,
  ay: number,
  bx: number,
  by: number,
  width: number,
  c: Rgba,
) {
  const h = width / 2;
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy || 1e-9;
  const x0 = Math.max(0, Math.floor(Math.min(ax, bx) - h - 1));
  const x1 = Math.min(bm.width - 1, Math.ceil(Math.max(ax, bx) + h + 1));
  const y0 = Math.max(0, Math.floor(Math.min(ay, by) - h - 1));
  const y1 = Math.min(bm.height - 1, Math.ceil(Math.max(ay, by) + h + 1));
  for (let y = y0; y <= y1; y++) {
    for (let x = x0; x <= x1; x++) {
      const px = x + 0.5;
      const py = y + 0.5;
      const t = clamp01(((px - ax) * dx + (py - ay) * dy) / len2);
      const d = Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
      blend(bm, x, y, c, clamp01(h - d + 0.5));
    }
  }
}

/** A filled triangle (used for arrow heads). */
export function fillTriangle(bm: Bitmap, pts: [number, number][], c: Rgba) {
  const [[ax, ay], [bx, by], [cx, cy]] = pts;
  const edge = (x0: number, y0: number, x1: number, y1: number, x: number, y: number) =>
    (x1 - x0) * (y - y0) - (y1 - y0) * (x - x0);
  const area = edge(ax, ay, bx, by, cx, cy);
  if (area === 0) return;
  const x0 = Math.max(0, Math.floor(Math.min(ax, bx, cx)));
  const x1 = Math.min(bm.width - 1, Math.ceil(Math.max(ax, bx, cx)));
  const y0 = Math.max(0, Math.floor(Math.min(ay, by, cy)));
  const y1 = Math.min(bm.height - 1, Math.ceil(Math.max(ay, by, cy)));
  for (let y = y0; y <= y1; y++) {
    for (let x = x0; x <= x1; x++) {
      const px = x + 0.5;
      const py = y + 0.5;
      const w0 = edge(bx, by, cx, cy, px, py) / area;
      const w1 = edge(cx, cy, ax, ay, px, py) / area;
      const w2 = edge(ax, ay, bx, by, px, py) / area;
      if (w0 >= 0 && w1 >= 0 && w2 >= 0) blend(bm, x, y, c);
    }
  }
}

/** A filled axis-aligned rectangle. */
export function fillRect(bm: Bitmap, x: number, y: number, w: number, h: number, c: Rgba) {
  const x0 = Math.max(0, Math.round(x));
  const y0 = Math.max(0, Math.round(y));
  const x1 = Math.min(bm.width, Math.round(x + w));
  const y1 = Math.min(bm.height, Math.round(y + h));
  for (let yy = y0; yy < y1; yy++) for (let xx = x0; xx < x1; xx++) blend(bm, xx, yy, c);
}

/**
 * Paints `c` through a mask: every pixel of `mask` (an RGBA layer, e.g. printed white
 * text) lends its alpha to the colour. Used to draw text in any palette colour.
 */
export function paintMask(bm: Bitmap, mask: Bitmap, left: number, top: number, c: Rgba) {
  for (let y = 0; y < mask.height; y++) {
    for (let x = 0; x < mask.width; x++) {
      const a = mask.data[(y * mask.width + x) * 4 + 3];
      if (a) blend(bm, Math.round(left) + x, Math.round(top) + y, c, a / 255);
    }
  }
}
