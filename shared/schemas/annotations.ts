/**
 * Annotations drawn over an uploaded image, stored with a document revision. Positions
 * are fractions (0..1) of the image's width and height, so they fit every copy of it:
 * the web copy, the thumbnail and the flattened download.
 */
import { z } from 'zod';

/** Our palette: names and the colours every renderer (SVG on screen, jimp download) uses. */
export const ANNOTATION_COLORS = {
  copper: { label: 'Copper', hex: '#c8702a' },
  'signal-yellow': { label: 'Signal yellow', hex: '#f5c400' },
  'coolant-cyan': { label: 'Coolant cyan', hex: '#19b8d2' },
  'fuse-magenta': { label: 'Fuse magenta', hex: '#d42a8c' },
  'earth-green': { label: 'Earth green', hex: '#2f9e44' },
  'chalk-white': { label: 'Chalk white', hex: '#ffffff' },
  'insulation-black': { label: 'Insulation black', hex: '#111111' },
} as const;
export type AnnotationColor = keyof typeof ANNOTATION_COLORS;
export const ANNOTATION_COLOR_NAMES = Object.keys(ANNOTATION_COLORS) as [
  AnnotationColor,
  ...AnnotationColor[],
];
export const DEFAULT_ANNOTATION_COLOR: AnnotationColor = 'signal-yellow';

export const MAX_ANNOTATIONS = 100;
export const MAX_ANNOTATION_TEXT = 200;

const coord = z
  .number()
  .min(0, { error: 'must be between 0 and 1' })
  .max(1, { error: 'must be between 0 and 1' });
const id = z
  .string()
  .min(1)
  .max(40)
  .regex(/^[A-Za-z0-9_-]+$/, { error: 'may hold only letters, digits, "-" and "_"' });
const text = z
  .string()
  .trim()
  .max(MAX_ANNOTATION_TEXT, { error: `must be at most ${MAX_ANNOTATION_TEXT} characters` });
const color = z.enum(ANNOTATION_COLOR_NAMES, {
  error: `must be one of ${ANNOTATION_COLOR_NAMES.join(', ')}`,
});

/** A numbered dot; `number` defaults to its place among the markers (1, 2, 3 …). */
export const markerSchema = z.strictObject({
  id,
  type: z.literal('marker'),
  x: coord,
  y: coord,
  number: z.number().int().min(1).max(999).optional(),
  text: text.optional(),
  color,
});

/** An arrow from its tail (x, y) to its head (x2, y2). */
export const arrowSchema = z.strictObject({
  id,
  type: z.literal('arrow'),
  x: coord,
  y: coord,
  x2: coord,
  y2: coord,
  text: text.optional(),
  color,
});

/** A text label whose top-left corner is at (x, y). */
export const labelSchema = z.strictObject({
  id,
  type: z.literal('label'),
  x: coord,
  y: coord,
  text: text.min(1, { error: 'must not be empty' }),
  color,
});

/** A highlight box between two opposite corners (x, y) and (x2, y2), in any order. */
export const boxSchema = z.strictObject({
  id,
  type: z.literal('box'),
  x: coord,
  y: coord,
  x2: coord,
  y2: coord,
  text: text.optional(),
  color,
});

export const annotationSchema = z.discriminatedUnion(
  'type',
  [markerSchema, arrowSchema, labelSchema, boxSchema],
  {
    error: 'must be a marker, arrow, label or box',
  },
);

/** The annotations of one image: at most 100, ids unique. */
export const annotationsSchema = z
  .array(annotationSchema)
  .max(MAX_ANNOTATIONS, { error: `may hold at most ${MAX_ANNOTATIONS} annotations per image` })
  .superRefine((list, ctx) => {
    const seen = new Set<string>();
    list.forEach((a, i) => {
      if (seen.has(a.id))
        ctx.addIssue({ code: 'custom', path: [i, 'id'], message: `repeats the id "${a.id}"` });
      seen.add(a.id);
    });
  });

/** Body of `POST /api/uploads/:id/flatten`. */
export const flattenBodySchema = z.strictObject({ annotations: annotationsSchema });

export type Annotation = z.infer<typeof annotationSchema>;
export type MarkerAnnotation = z.infer<typeof markerSchema>;
export type Annotations = z.infer<typeof annotationsSchema>;

/**
 * The number each marker shows: its own `number`, or else its place among the markers.
 * Every renderer uses this, so the screen, the legend and the download agree.
 */
export function markerNumbers(list: readonly Annotation[]): Map<string, number> {
  const out = new Map<string, number>();
  let n = 0;
  for (const a of list) {
    if (a.type !== 'marker') continue;
    n++;
    out.set(a.id, a.number ?? n);
  }
  return out;
}
