/**
 * Drawing annotations over an image as SVG, in the image's own pixel space, with the
 * same proportions as the flattened download (stroke long/320, marker radius long/55)
 * but never smaller on screen than a finger can hit.
 */
import {
  ANNOTATION_COLORS,
  markerNumbers,
  type Annotation,
  type AnnotationColor,
} from '@shared/schemas/annotations';

export interface DrawScale {
  stroke: number;
  radius: number;
  font: number;
  halo: number;
}

/**
 * Sizes in image pixels for an image `width`×`height` drawn `shownWidth` CSS pixels wide.
 * `minRadiusPx` is the smallest marker radius on screen (larger in the annotator).
 */
export function drawScale(
  width: number,
  height: number,
  shownWidth: number,
  minRadiusPx = 9,
): DrawScale {
  const long = Math.max(width, height, 1);
  const px = shownWidth > 0 ? width / shownWidth : 1;
  const radius = Math.max(long / 55, minRadiusPx * px);
  const stroke = Math.max(long / 320, 2 * px, radius / 6);
  return { radius, stroke, font: radius * 1.15, halo: stroke * 0.9 };
}

export function colorHex(name: AnnotationColor | string): string {
  return ANNOTATION_COLORS[name as AnnotationColor]?.hex ?? ANNOTATION_COLORS.copper.hex;
}

function luminance(hex: string): number {
  const n = Number.parseInt(hex.slice(1), 16);
  return (0.2126 * ((n >> 16) & 255) + 0.7152 * ((n >> 8) & 255) + 0.0722 * (n & 255)) / 255;
}

/** The outline drawn under a shape so it reads over any photo: light under dark colours. */
export function haloFor(hex: string): string {
  return luminance(hex) < 0.35 ? 'rgba(255,255,255,0.75)' : 'rgba(0,0,0,0.6)';
}

/** Ink for a marker's number: dark on light colours, white on dark ones. */
export function inkFor(hex: string): string {
  return luminance(hex) > 0.55 ? '#111111' : '#ffffff';
}

/** The arrow's shaft end and head triangle for a tail (ax, ay) and head (bx, by). */
export function arrowShape(ax: number, ay: number, bx: number, by: number, stroke: number) {
  const len = Math.hypot(bx - ax, by - ay) || 1;
  const head = Math.min(len * 0.6, stroke * 4.5);
  const ux = (bx - ax) / len;
  const uy = (by - ay) / len;
  const baseX = bx - ux * head;
  const baseY = by - uy * head;
  const half = head * 0.6;
  const points = [
    [bx, by],
    [baseX - uy * half, baseY + ux * half],
    [baseX + uy * half, baseY - ux * half],
  ]
    .map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`)
    .join(' ');
  return { baseX, baseY, points };
}

/** One line of the legend under an image. */
export interface LegendItem {
  id: string;
  type: Annotation['type'];
  /** The marker's number; undefined for other shapes. */
  number?: number;
  text: string;
  color: string;
  colorName: string;
}

const TYPE_WORDS: Record<Annotation['type'], string> = {
  marker: 'Marker',
  arrow: 'Arrow',
  label: 'Label',
  box: 'Highlight',
};

/** The legend: every marker with its number, and every other shape that carries words. */
export function legendItems(list: readonly Annotation[]): LegendItem[] {
  const numbers = markerNumbers(list);
  const out: LegendItem[] = [];
  for (const a of list) {
    const text = ('text' in a && a.text ? a.text : '').trim();
    if (a.type !== 'marker' && !text) continue;
    out.push({
      id: a.id,
      type: a.type,
      number: a.type === 'marker' ? numbers.get(a.id) : undefined,
      text: text || (a.type === 'marker' ? '' : TYPE_WORDS[a.type]),
      color: colorHex(a.color),
      colorName: ANNOTATION_COLORS[a.color]?.label ?? a.color,
    });
  }
  return out;
}

/** Words for a shape's type, for buttons and screen readers. */
export function typeWords(type: Annotation['type']): string {
  return TYPE_WORDS[type];
}

export const clamp01 = (v: number) => (v < 0 ? 0 : v > 1 ? 1 : Number.isFinite(v) ? v : 0);

let counter = 0;
/** A fresh annotation id (letters and digits only, as the schema asks). */
export function newAnnotationId(): string {
  counter = (counter + 1) % 1296;
  return `a${Date.now().toString(36)}${counter.toString(36)}`;
}

/** Moves a shape by (dx, dy) in fractions of the image, keeping every point inside it. */
export function moveAnnotation(a: Annotation, dx: number, dy: number): Annotation {
  if (a.type === 'arrow' || a.type === 'box') {
    const minX = Math.min(a.x, a.x2);
    const maxX = Math.max(a.x, a.x2);
    const minY = Math.min(a.y, a.y2);
    const maxY = Math.max(a.y, a.y2);
    const cdx = Math.min(Math.max(dx, -minX), 1 - maxX);
    const cdy = Math.min(Math.max(dy, -minY), 1 - maxY);
    return { ...a, x: a.x + cdx, y: a.y + cdy, x2: a.x2 + cdx, y2: a.y2 + cdy };
  }
  return { ...a, x: clamp01(a.x + dx), y: clamp01(a.y + dy) };
}
