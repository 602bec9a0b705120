/**
 * Content of a write-up: Markdown text, annotated images placed in it by reference, an
 * optional wire run, an optional parts list and optional spec values.
 *
 * Values are stored in SI (mm, N·m, kPa) whatever the author typed them in. Lenient on
 * values so a half-filled draft always autosaves (a blank colour, an unknown wire size:
 * those become findings), strict on shape: unknown fields and oversized values are refused.
 */
import { z } from 'zod';
import { annotationsSchema } from './annotations';
import { MARKDOWN_BUDGET } from '../markdown/budget';

/** The body may be as long as the renderer accepts, and no longer. */
export const MAX_WRITEUP_BODY = MARKDOWN_BUDGET.maxLength;
export const MAX_WRITEUP_IMAGES = 20;
export const MAX_WIRE_RUN_WIRES = 100;
export const MAX_PART_ITEMS = 200;
export const MAX_PART_OPTIONS = 6;
export const MAX_SPECS = 50;
/** Longest added length a wire may have, mm (100 m: anything longer is a typo). */
export const MAX_ADDED_LENGTH_MM = 100_000;

/** How a lengthened wire is joined. `none`: the length comes from re-routing within the loom. */
export const WIRE_JOINS = ['none', 'crimped-splice', 'soldered-sealed-splice'] as const;
export type WireJoin = (typeof WIRE_JOINS)[number];

export const JOIN_LABELS: Record<WireJoin, string> = {
  none: 'No join (re-routed within the loom)',
  'crimped-splice': 'Crimped splice',
  'soldered-sealed-splice': 'Soldered and sealed splice',
};

/** What a spec value measures; each is stored in its SI unit. */
export const SPEC_QUANTITIES = ['torque', 'pressure', 'length'] as const;
export type SpecQuantity = (typeof SPEC_QUANTITIES)[number];
export const SPEC_SI_UNITS: Record<SpecQuantity, string> = {
  torque: 'N·m',
  pressure: 'kPa',
  length: 'mm',
};

const text = (max: number) =>
  z
    .string({ error: 'must be text' })
    .max(max, { error: `must be at most ${max} characters` })
    .default('');

const number = (what: string, min: number, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { error: `${what} must be a number` })
    .min(min, { error: `${what} must be at least ${min}` })
    .max(max, { error: `${what} must be at most ${max}` });

/** Public id of an upload (what its URL shows). */
export const uploadIdSchema = z
  .string({ error: 'must be the id of an uploaded image' })
  .regex(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/, {
    error: 'must be the id of an uploaded image',
  });

export const writeupImageSchema = z.strictObject({
  uploadId: uploadIdSchema,
  caption: text(300),
  annotations: annotationsSchema.default([]),
  /** Pixel size of the web copy, so pages can reserve the space before it loads. */
  width: z.number().int().min(1).max(20_000).optional(),
  height: z.number().int().min(1).max(20_000).optional(),
});

export const wireRunWireSchema = z.strictObject({
  /** IEC 60757 code as written ("GN/YE"); checked by the findings, not here. */
  color: text(24),
  /** "0.5 mm²" or "20 AWG"; checked by the findings. */
  size: text(24),
  role: text(80),
  /** Where the wire starts, and where it now ends. */
  from: text(120),
  to: text(120),
  addedLengthMm: number('The added length', 0, MAX_ADDED_LENGTH_MM).default(0),
  join: z.enum(WIRE_JOINS, { error: `must be one of ${WIRE_JOINS.join(', ')}` }).default('none'),
  /**
   * Splices in this wire when it is joined: 2 for an extension piece inserted between two
   * cut ends (the default), 1 when the added piece ends at a new terminal.
   */
  splices: z.union([z.literal(1), z.literal(2)]).optional(),
  /** Current the circuit carries, A; without it no voltage drop is computed. */
  currentA: number('The current', 0, 500).optional(),
  note: text(200).optional(),
});

export const wireRunSchema = z.strictObject({
  systemVoltage: number('The system voltage', 1, 60).optional(),
  wires: z
    .array(wireRunWireSchema)
    .max(MAX_WIRE_RUN_WIRES, { error: `may hold at most ${MAX_WIRE_RUN_WIRES} wires` })
    .default([]),
});

const optionId = z
  .string({ error: 'must be an option id' })
  .min(1)
  .max(24)
  .regex(/^[A-Za-z0-9_-]+$/, { error: 'may hold only letters, digits, "-" and "_"' });

export const partOptionSchema = z.strictObject({ id: optionId, name: text(60) });

export const partItemSchema = z.strictObject({
  name: text(120),
  quantity: number('The quantity', 0, 10_000).default(1),
  /** Price of one, the author's own estimate: a range from low to high. */
  priceLow: number('The low price', 0, 1_000_000).default(0),
  priceHigh: number('The high price', 0, 1_000_000).default(0),
  /** Ids of the build options that include this part. */
  options: z.array(optionId).max(MAX_PART_OPTIONS).default([]),
  note: text(200).optional(),
});

export const partsListSchema = z
  .strictObject({
    options: z
      .array(partOptionSchema)
      .max(MAX_PART_OPTIONS, { error: `may hold at most ${MAX_PART_OPTIONS} options` })
      .default([]),
    items: z
      .array(partItemSchema)
      .max(MAX_PART_ITEMS, { error: `may hold at most ${MAX_PART_ITEMS} parts` })
      .default([]),
    /** A currency code or sign shown beside prices ("EUR", "$"). */
    currency: text(8).optional(),
  })
  .superRefine((parts, ctx) => {
    const seen = new Set<string>();
    parts.options.forEach((o, i) => {
      if (seen.has(o.id))
        ctx.addIssue({ code: 'custom', path: ['options', i, 'id'], message: `repeats "${o.id}"` });
      seen.add(o.id);
    });
  });

export const specValueSchema = z.strictObject({
  label: text(120),
  quantity: z.enum(SPEC_QUANTITIES, { error: `must be one of ${SPEC_QUANTITIES.join(', ')}` }),
  /** In the quantity's SI unit: N·m, kPa or mm. */
  value: number('The value', 0, 1_000_000),
  note: text(200).optional(),
});

export const writeupContentSchema = z.strictObject({
  body: z
    .string({ error: 'must be text' })
    .max(MAX_WRITEUP_BODY, { error: `must be at most ${MAX_WRITEUP_BODY} characters` })
    .default(''),
  summary: z.string().max(500, { error: 'must be at most 500 characters' }).optional(),
  images: z
    .array(writeupImageSchema)
    .max(MAX_WRITEUP_IMAGES, { error: `may hold at most ${MAX_WRITEUP_IMAGES} images` })
    .default([]),
  wireRun: wireRunSchema.optional(),
  parts: partsListSchema.optional(),
  specs: z
    .array(specValueSchema)
    .max(MAX_SPECS, { error: `may hold at most ${MAX_SPECS} values` })
    .optional(),
});

export type WriteupContent = z.infer<typeof writeupContentSchema>;
export type WriteupImage = z.infer<typeof writeupImageSchema>;
export type WireRun = z.infer<typeof wireRunSchema>;
export type WireRunWire = z.infer<typeof wireRunWireSchema>;
export type PartsList = z.infer<typeof partsListSchema>;
export type PartItem = z.infer<typeof partItemSchema>;
export type PartOption = z.infer<typeof partOptionSchema>;
export type SpecValue = z.infer<typeof specValueSchema>;

/** A blank write-up, as the editor starts one. */
export function emptyWriteupContent(): WriteupContent {
  return { body: '', summary: '', images: [] };
}

/** A blank wire of a wire run. */
export function emptyWire(): WireRunWire {
  return {
    color: '',
    size: '',
    role: '',
    from: '',
    to: '',
    addedLengthMm: 0,
    join: 'crimped-splice',
  };
}

const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);
const pageNumber = (what: string, max: number) =>
  z.preprocess(
    blankToUndefined,
    z.coerce
      .number({ error: `${what} must be a number` })
      .int({ error: `${what} must be a whole number` })
      .min(0, { error: `${what} must be 0 or more` })
      .max(max, { error: `${what} must be at most ${max}` })
      .optional(),
  );

/** `GET /api/writeups?limit=&offset=`. */
export const writeupListQuerySchema = z.object({
  limit: pageNumber('limit', 100),
  offset: pageNumber('offset', 100_000),
});
