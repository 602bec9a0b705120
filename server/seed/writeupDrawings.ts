/**
 * Simple drawings for the demo write-ups, made with jimp at seed time: a connector seen
 * from the wire side, a loom with splices, a bracket, a 10-cavity plug, an engine-bay
 * route. They stand in for photos; nothing here shows a real part.
 */
import { Jimp, loadFont, type JimpInstance } from 'jimp';
import { SANS_32_BLACK, SANS_32_WHITE } from 'jimp/fonts';
import {
  blend,
  fillCircle as fillCirclePx,
  fillRect as fillRectPx,
  hexToRgba,
  type Bitmap,
  type Rgba,
} from '../workers/draw';

/** The space the drawings (and the demo's annotation positions) are laid out in. */
export const DRAWING_WIDTH = 1200;
export const DRAWING_HEIGHT = 800;
/** Drawn at 80 %: 960 × 640 pixels keep the demo seed quick and are plenty for a web copy. */
const S = 0.8;

const fillCircle = (bm: Bitmap, x: number, y: number, r: number, col: Rgba) =>
  fillCirclePx(bm, x * S, y * S, r * S, col);
const fillRect = (bm: Bitmap, x: number, y: number, w: number, h: number, col: Rgba) =>
  fillRectPx(bm, x * S, y * S, w * S, h * S, col);

type Font = Awaited<ReturnType<typeof loadFont>>;
let fonts: Promise<{ dark: Font; light: Font }> | undefined;
const loadFonts = () =>
  (fonts ??= Promise.all([loadFont(SANS_32_BLACK), loadFont(SANS_32_WHITE)]).then(
    ([dark, light]) => ({
      dark,
      light,
    }),
  ));

const c = (hex: string, a = 1): Rgba => hexToRgba(hex, a);

/**
 * A thick line with round ends, filled span by span (the shared antialiased stroke looks
 * at every pixel of the line's bounding box, which is slow for long diagonals).
 */
function strokeLine(
  bm: Bitmap,
  ax0: number,
  ay0: number,
  bx0: number,
  by0: number,
  width: number,
  col: Rgba,
) {
  const [ax, ay, bx, by] = [ax0 * S, ay0 * S, bx0 * S, by0 * S];
  const h = (width * S) / 2;
  const len = Math.hypot(bx - ax, by - ay) || 1e-9;
  const nx = (-(by - ay) / len) * h;
  const ny = ((bx - ax) / len) * h;
  const quad: Array<[number, number]> = [
    [ax + nx, ay + ny],
    [bx + nx, by + ny],
    [bx - nx, by - ny],
    [ax - nx, ay - ny],
  ];
  const y0 = Math.max(0, Math.floor(Math.min(...quad.map((p) => p[1]))));
  const y1 = Math.min(bm.height - 1, Math.ceil(Math.max(...quad.map((p) => p[1]))));
  for (let y = y0; y <= y1; y++) {
    const yc = y + 0.5;
    let lo = Infinity;
    let hi = -Infinity;
    for (let i = 0; i < 4; i++) {
      const [x1, y1e] = quad[i];
      const [x2, y2e] = quad[(i + 1) % 4];
      if ((yc < y1e && yc < y2e) || (yc > y1e && yc > y2e) || y1e === y2e) continue;
      const x = x1 + ((yc - y1e) / (y2e - y1e)) * (x2 - x1);
      lo = Math.min(lo, x);
      hi = Math.max(hi, x);
    }
    if (lo > hi) continue;
    for (let x = Math.max(0, Math.round(lo)); x <= Math.min(bm.width - 1, Math.round(hi)); x++)
      blend(bm, x, y, col);
  }
  fillCirclePx(bm, ax, ay, h, col);
  fillCirclePx(bm, bx, by, h, col);
}

interface Canvas {
  img: JimpInstance;
  bm: Bitmap;
}

function canvas(top: string, bottom: string): Canvas {
  const img = new Jimp({
    width: Math.round(DRAWING_WIDTH * S),
    height: Math.round(DRAWING_HEIGHT * S),
    color: 0xffffffff,
  }) as JimpInstance;
  const bm = img.bitmap as Bitmap;
  const a = c(top);
  const b = c(bottom);
  for (let y = 0; y < bm.height; y++) {
    const t = y / (bm.height - 1);
    const row: Rgba = {
      r: Math.round(a.r + (b.r - a.r) * t),
      g: Math.round(a.g + (b.g - a.g) * t),
      b: Math.round(a.b + (b.b - a.b) * t),
      a: 1,
    };
    fillRectPx(bm, 0, y, bm.width, 1, row);
  }
  // A faint grid, like a cutting mat on the bench.
  for (let x = 0; x < bm.width; x += 40) fillRectPx(bm, x, 0, 1, bm.height, c('#000000', 0.05));
  for (let y = 0; y < bm.height; y += 40) fillRectPx(bm, 0, y, bm.width, 1, c('#000000', 0.05));
  return { img, bm };
}

function roundRect(bm: Bitmap, x: number, y: number, w: number, h: number, r: number, col: Rgba) {
  fillRect(bm, x + r, y, w - 2 * r, h, col);
  fillRect(bm, x, y + r, r, h - 2 * r, col);
  fillRect(bm, x + w - r, y + r, r, h - 2 * r, col);
  for (const [cx, cy] of [
    [x + r, y + r],
    [x + w - r, y + r],
    [x + r, y + h - r],
    [x + w - r, y + h - r],
  ])
    fillCircle(bm, cx, cy, r, col);
}

/** A wire as a thick line in its base colour with an optional tracer stripe down the middle. */
function wire(bm: Bitmap, pts: Array<[number, number]>, base: string, tracer?: string, width = 22) {
  for (let i = 1; i < pts.length; i++) {
    const [ax, ay] = pts[i - 1];
    const [bx, by] = pts[i];
    strokeLine(bm, ax, ay, bx, by, width + 4, c('#202020'));
    strokeLine(bm, ax, ay, bx, by, width, c(base));
    if (tracer) strokeLine(bm, ax, ay, bx, by, width / 3, c(tracer));
  }
}

function text(img: JimpInstance, font: Font, x: number, y: number, words: string) {
  img.print({ font, x: Math.round(x * S), y: Math.round(y * S), text: words });
}

// Fast settings: the upload service re-encodes the image anyway.
const encode = (img: JimpInstance) =>
  img.getBuffer('image/png', { deflateLevel: 1, filterType: 0 } as Record<string, number>);

/** A wire's insulation: base colour and tracer (if any), as drawn. */
export type WirePaint = [base: string, tracer?: string];

/** A small sealed plug seen from the wire side, one wire per cavity (2 to 4 cavities). */
export async function drawSmallPlug(wires: WirePaint[], caption: string): Promise<Buffer> {
  const { img, bm } = canvas('#e7e3da', '#cfc9bc');
  const f = await loadFonts();
  const n = wires.length;
  const pitch = 180;
  const width = pitch * n + 60;
  const left = (DRAWING_WIDTH - width) / 2;
  const xs = wires.map((_, i) => left + 30 + pitch / 2 + i * pitch);
  // Wires first, so the housing sits over their ends.
  xs.forEach((x, i) => {
    const spread = (i - (n - 1) / 2) * 60;
    wire(
      bm,
      [
        [x, 420],
        [x + spread * 0.6, 640],
        [x + spread * 2, 800],
      ],
      wires[i][0],
      wires[i][1],
    );
  });
  roundRect(bm, left, 250, width, 230, 40, c('#2b2d31'));
  roundRect(bm, left + 20, 270, width - 40, 190, 30, c('#3a3d42'));
  roundRect(bm, DRAWING_WIDTH / 2 - 80, 190, 160, 80, 18, c('#2b2d31'));
  fillRect(bm, DRAWING_WIDTH / 2 - 40, 210, 80, 24, c('#55595f'));
  xs.forEach((x, i) => {
    fillCircle(bm, x, 365, 58, c('#8c2f2f'));
    fillCircle(bm, x, 365, 40, c('#1d1e21'));
    fillCircle(bm, x, 365, 16, c('#b08d57'));
    text(img, f.light, x - 10, 284, String.fromCharCode(65 + i));
  });
  text(img, f.dark, 40, 40, 'WIRE SIDE');
  text(img, f.dark, 40, 730, caption);
  return encode(img);
}

/** A loom in corrugated conduit with its wires out of it and two splice sleeves on each. */
export async function drawLoomWithSplices(paints: WirePaint[], title: string): Promise<Buffer> {
  const { img, bm } = canvas('#dcdfe2', '#bfc4c9');
  const f = await loadFonts();
  // Conduit from the left, ridges across it.
  strokeLine(bm, 0, 520, 560, 380, 120, c('#1b1c1e'));
  for (let t = 0; t <= 1; t += 0.04) {
    const x = t * 560;
    const y = 520 - t * 140;
    strokeLine(bm, x - 14, y - 56, x + 14, y + 56, 6, c('#3b3d41'));
  }
  // Tape where the wires leave the conduit.
  strokeLine(bm, 540, 385, 620, 365, 110, c('#2a2a2a'));
  const wires = paints
    .slice(0, 4)
    .map(([base, tracer], i) => [base, tracer, 330 + i * 50] as const);
  for (const [base, tracer, y] of wires) {
    wire(
      bm,
      [
        [620, y - 20],
        [760, y - 60],
        [1200, y - 140],
      ],
      base,
      tracer,
      18,
    );
    // Two splice sleeves: the added piece is joined at both ends.
    for (const sx of [800, 1040]) {
      const sy = y - 60 - ((sx - 760) / 440) * 80;
      strokeLine(bm, sx - 45, sy + 8, sx + 45, sy - 8, 34, c('#111111'));
      strokeLine(bm, sx - 40, sy + 7, sx + 40, sy - 7, 26, c('#3d3f44'));
    }
  }
  text(img, f.dark, 40, 40, title);
  text(img, f.dark, 40, 730, 'Added length between the sleeves');
  return encode(img);
}

/** An L-shaped bracket with two bolt holes, a cable tie and the plug clipped on. */
export async function drawBracket(): Promise<Buffer> {
  const { img, bm } = canvas('#e9e6e0', '#d3cec4');
  const f = await loadFonts();
  // Bracket plate and its bent flange.
  roundRect(bm, 220, 180, 520, 300, 24, c('#9aa0a6'));
  roundRect(bm, 220, 460, 520, 120, 16, c('#7d838a'));
  for (const x of [330, 630]) {
    fillCircle(bm, x, 520, 30, c('#2b2d31'));
    fillCircle(bm, x, 520, 20, c('#c9ccd0'));
    for (let k = 0; k < 6; k++) {
      const a = (Math.PI / 3) * k;
      strokeLine(bm, x, 520, x + Math.cos(a) * 18, 520 + Math.sin(a) * 18, 3, c('#6b7076'));
    }
  }
  // The plug on its clip.
  roundRect(bm, 360, 240, 260, 150, 26, c('#2b2d31'));
  fillRect(bm, 380, 390, 220, 30, c('#45484d'));
  wire(
    bm,
    [
      [430, 260],
      [420, 120],
      [380, 0],
    ],
    '#2e9b45',
    '#f7d31e',
    16,
  );
  wire(
    bm,
    [
      [490, 260],
      [490, 120],
      [500, 0],
    ],
    '#7a4b2a',
    '#f8f8f4',
    16,
  );
  wire(
    bm,
    [
      [550, 260],
      [570, 120],
      [620, 0],
    ],
    '#2463c9',
    undefined,
    16,
  );
  // Cable tie round the wires.
  strokeLine(bm, 390, 140, 610, 140, 14, c('#111111'));
  fillRect(bm, 605, 128, 34, 26, c('#111111'));
  // Heat shield on the right: a ribbed plate.
  fillRect(bm, 880, 0, 320, 800, c('#c8c2b5'));
  for (let x = 900; x < 1200; x += 36) fillRect(bm, x, 0, 12, 800, c('#b3ac9e'));
  text(img, f.dark, 900, 40, 'heat shield');
  text(img, f.dark, 40, 730, 'Bracket on the thermostat housing');
  return encode(img);
}

/** A 10-cavity plug, two rows of five, seen from the mating face. */
export async function drawTenCavityPlug(): Promise<Buffer> {
  const { img, bm } = canvas('#e5e2da', '#cbc5b8');
  const f = await loadFonts();
  roundRect(bm, 200, 200, 800, 360, 40, c('#2b2d31'));
  roundRect(bm, 230, 230, 740, 300, 30, c('#43464c'));
  roundRect(bm, 520, 140, 160, 80, 20, c('#2b2d31'));
  for (let row = 0; row < 2; row++) {
    for (let col = 0; col < 5; col++) {
      const x = 320 + col * 140;
      const y = 320 + row * 130;
      fillRect(bm, x - 36, y - 30, 72, 60, c('#17181a'));
      fillRect(bm, x - 14, y - 8, 28, 16, c('#b08d57'));
      text(img, f.light, x - 12, y + 28, String(row * 5 + col + 1));
    }
  }
  text(img, f.dark, 40, 40, 'MATING FACE');
  text(img, f.dark, 40, 730, '10-cavity pump module plug');
  return encode(img);
}

/** Above an engine bay: the exhaust manifold, the fan motor and the new route of the feed. */
export async function drawFanRoute(): Promise<Buffer> {
  const { img, bm } = canvas('#d8d9d6', '#babcb8');
  const f = await loadFonts();
  // Exhaust manifold: four runners into a collector.
  for (let k = 0; k < 4; k++) strokeLine(bm, 180 + k * 110, 120, 420, 420, 50, c('#8a5a3c'));
  strokeLine(bm, 420, 420, 420, 800, 90, c('#7a4a30'));
  // Radiator core and the fan.
  fillRect(bm, 760, 80, 400, 640, c('#5d6166'));
  for (let y = 100; y < 700; y += 16) fillRect(bm, 770, y, 380, 6, c('#4b4f54'));
  fillCircle(bm, 960, 400, 190, c('#2b2d31'));
  for (let k = 0; k < 7; k++) {
    const a = ((Math.PI * 2) / 7) * k;
    strokeLine(bm, 960, 400, 960 + Math.cos(a) * 170, 400 + Math.sin(a) * 170, 40, c('#44484d'));
  }
  fillCircle(bm, 960, 400, 50, c('#1b1c1e'));
  // Old route past the manifold (dashed), new route along the top rail.
  for (let x = 520; x < 760; x += 40) strokeLine(bm, x, 470, x + 22, 470, 12, c('#d62828', 0.7));
  wire(
    bm,
    [
      [40, 60],
      [600, 60],
      [700, 120],
      [880, 240],
    ],
    '#d62828',
    undefined,
    20,
  );
  wire(
    bm,
    [
      [40, 90],
      [590, 90],
      [690, 150],
      [860, 270],
    ],
    '#1b1b1b',
    undefined,
    20,
  );
  for (const x of [200, 380, 560]) fillRect(bm, x - 10, 48, 20, 56, c('#111111'));
  text(img, f.dark, 40, 730, 'Fan feed: old route (dashed) and new route');
  return encode(img);
}
