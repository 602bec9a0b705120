/**
 * Content of a connector sheet: one connector's pinout.
 *
 * Lenient on values so a half-filled sheet always autosaves (blank cells, no layout yet,
 * a pin row whose cavity is not on the housing: those become findings, not refusals),
 * strict on shape: unknown fields, wrong types and oversized values are refused.
 */
import { z } from 'zod';

/** Most cavities a connector sheet may have. */
export const MAX_CONNECTOR_CAVITIES = 400;
/** Largest number of rows or columns of a cavity grid. */
export const MAX_LAYOUT_SIDE = 60;

/** Circuit roles offered in the editor; any other text is accepted too. */
export const PIN_ROLES = [
  '5 V reference',
  'signal',
  'low reference',
  'switched ignition feed',
  'battery feed',
  'ground',
  'motor +',
  'motor −',
  'serial data high',
  'serial data low',
  'shield',
  'unused',
] as const;

export const HOUSINGS = ['pin', 'socket'] as const;
export const VIEWS = ['mating-face', 'wire-side'] as const;
export const LABEL_SCHEMES = ['numeric', 'alpha', 'custom'] as const;

export type Housing = (typeof HOUSINGS)[number];
export type ConnectorView = (typeof VIEWS)[number];
export type LabelScheme = (typeof LABEL_SCHEMES)[number];

const text = (max: number) => z.string().max(max, { error: `must be at most ${max} characters` });

/** An enum a form may also leave blank ("" or null) while it is being filled in. */
function draftEnum<T extends readonly [string, ...string[]]>(values: T) {
  const words = values.map((v) => `"${v}"`).join(' or ');
  return z
    .union([z.enum(values), z.literal('')], {
      error: `must be ${words} (or left blank in a draft)`,
    })
    .nullish();
}

const cavityLabel = text(16);

const gridSide = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .int({ error: `${what} must be a whole number` })
    .min(1, { error: `${what} must be at least 1` })
    .max(MAX_LAYOUT_SIDE, { error: `${what} can be at most ${MAX_LAYOUT_SIDE}` })
    .nullish();

const position = z.strictObject({
  label: cavityLabel,
  row: z
    .number()
    .int()
    .min(0)
    .max(MAX_LAYOUT_SIDE - 1),
  col: z
    .number()
    .int()
    .min(0)
    .max(MAX_LAYOUT_SIDE - 1),
});

/**
 * The cavity grid. Without `positions` the labels fill the grid row by row, left to
 * right; with it each listed label sits at its own 0-based (row, col), for housings
 * whose cavities are not a full grid. Drawn as seen from `view`.
 */
export const connectorLayoutSchema = z.strictObject({
  rows: gridSide('rows'),
  cols: gridSide('cols'),
  positions: z.array(position).max(MAX_CONNECTOR_CAVITIES).optional(),
});

/** One cavity's row of the pin table; every cell may still be blank in a draft. */
export const pinRowSchema = z.strictObject({
  cavity: cavityLabel,
  role: text(80).optional(),
  color: text(24).optional(),
  size: text(24).optional(),
  circuit: text(32).optional(),
  note: text(500).optional(),
});

export const wireSizeRangeSchema = z.strictObject({
  min: text(24).optional(),
  max: text(24).optional(),
});

export const connectorContentSchema = z.strictObject({
  /** Cavity labels in order; when empty or absent, `cavityCount` stands in. */
  cavities: z
    .array(cavityLabel)
    .max(MAX_CONNECTOR_CAVITIES, { error: `can list at most ${MAX_CONNECTOR_CAVITIES} cavities` })
    .optional(),
  cavityCount: z
    .number({ error: 'must be a number' })
    .int({ error: 'must be a whole number' })
    .min(0, { error: 'cannot be negative' })
    .max(MAX_CONNECTOR_CAVITIES, { error: `can be at most ${MAX_CONNECTOR_CAVITIES}` })
    .nullish(),
  /** How labels are generated from `cavityCount`: 1..n, A..n (no I, O, Q), or typed by hand. */
  labels: draftEnum(LABEL_SCHEMES),
  layout: connectorLayoutSchema.nullish(),
  housing: draftEnum(HOUSINGS),
  view: draftEnum(VIEWS),
  sealed: z.boolean({ error: 'must be true or false' }).nullish(),
  component: text(120).optional(),
  tags: z.array(text(60)).max(30, { error: 'can have at most 30 tags' }).optional(),
  /** Free text: "0.64 mm", "1.5 mm blade". */
  terminalSize: text(60).optional(),
  wireSize: wireSizeRangeSchema.nullish(),
  pins: z
    .array(pinRowSchema)
    .max(MAX_CONNECTOR_CAVITIES, { error: `can have at most ${MAX_CONNECTOR_CAVITIES} rows` })
    .optional(),
  summary: text(500).optional(),
  notes: text(20_000).optional(),
});

export type ConnectorLayout = z.infer<typeof connectorLayoutSchema>;
export type PinRow = z.infer<typeof pinRowSchema>;
export type ConnectorContent = z.infer<typeof connectorContentSchema>;

/** A blank sheet for the editor's "new connector" form. */
export function emptyConnectorContent(): ConnectorContent {
  return {
    cavityCount: 0,
    labels: 'numeric',
    layout: { rows: 1, cols: 1 },
    housing: '',
    view: '',
    sealed: false,
    component: '',
    tags: [],
    terminalSize: '',
    wireSize: { min: '', max: '' },
    pins: [],
    summary: '',
    notes: '',
  };
}
