/**
 * Shape of a pin-to-pin check request and of its report.
 *
 * The schema only decides whether a body can be read at all. Anything the check itself
 * can describe as a finding (a missing end, no circuits, an unknown cavity, an unreadable
 * size, an unknown colour, blank cells) passes the schema and becomes a finding; only
 * values of the wrong JSON type, or numbers that mean nothing (negative lengths, a
 * fractional cavity count), are refused.
 */
import { z } from 'zod';
import { MAX_CAVITIES } from '../wire/cavities';

const cavityLabelSchema = z.union([z.string(), z.number()], {
  error: 'a cavity label must be text or a number',
});

/** A side of a circuit: a list of labels; a single label is read as a list of one. */
const cavityListSchema = z
  .union([z.array(cavityLabelSchema), cavityLabelSchema], {
    error: 'must be a list of cavity labels (text or numbers)',
  })
  .nullish();

const optionalText = (what: string) => z.string({ error: `${what} must be text` }).nullish();

const sizeTextSchema = z
  .union([z.string(), z.number()], { error: 'a wire size must be text such as "18 AWG"' })
  .nullish();

export const wireSizeRangeSchema = z.object(
  { min: sizeTextSchema, max: sizeTextSchema },
  {
    error:
      'wireSize must be an object with min and/or max, such as {"min": "22 AWG", "max": "18 AWG"}',
  },
);

export const cavityViewSchema = z.enum(['mating-face', 'wire-side'], {
  error: 'view must be "mating-face" or "wire-side"',
});

export const adapterEndSchema = z.object(
  {
    label: optionalText('label'),
    connectorId: z
      .union([z.string(), z.number()], { error: 'connectorId must be text or a number' })
      .nullish(),
    cavities: z
      .array(cavityLabelSchema, { error: 'cavities must be a list of cavity labels' })
      .nullish(),
    cavityCount: z
      .number({ error: 'cavityCount must be a number' })
      .int({ error: 'cavityCount must be a whole number' })
      .min(0, { error: 'cavityCount cannot be negative' })
      .max(MAX_CAVITIES, { error: `cavityCount can be at most ${MAX_CAVITIES}` })
      .nullish(),
    sealed: z.boolean({ error: 'sealed must be true or false' }).nullish(),
    roles: z
      .record(z.string(), z.string({ error: 'a cavity role must be text' }).nullish(), {
        error: 'roles must be an object mapping cavity labels to roles',
      })
      .nullish(),
    wireSize: wireSizeRangeSchema.nullish(),
    view: cavityViewSchema.nullish(),
    layout: z
      .object(
        {
          rows: z.number().int().positive({ error: 'layout.rows must be a whole number above 0' }),
          cols: z.number().int().positive({ error: 'layout.cols must be a whole number above 0' }),
        },
        { error: 'layout must be an object with rows and cols' },
      )
      .nullish(),
  },
  { error: 'an end must be an object' },
);

const nonNegative = (what: string) =>
  z
    .number({ error: `${what} must be a number` })
    .min(0, { error: `${what} cannot be negative` })
    .nullish();

export const circuitInputSchema = z.object(
  {
    id: z.union([z.string(), z.number()], { error: 'id must be text or a number' }).nullish(),
    a: cavityListSchema,
    b: cavityListSchema,
    role: optionalText('role'),
    size: sizeTextSchema,
    color: optionalText('color'),
    termination: optionalText('termination'),
    lengthMm: nonNegative('lengthMm'),
    currentA: nonNegative('currentA'),
    note: optionalText('note'),
  },
  { error: 'each circuit must be an object' },
);

export const adapterCheckInputSchema = z.object(
  {
    systemVoltage: z
      .number({ error: 'systemVoltage must be a number' })
      .positive({ error: 'systemVoltage must be above 0' })
      .nullish(),
    ends: z
      .object(
        { A: adapterEndSchema.nullish(), B: adapterEndSchema.nullish() },
        { error: 'ends must be an object with A and B' },
      )
      .nullish(),
    circuits: z.array(circuitInputSchema, { error: 'circuits must be a list' }).nullish(),
  },
  { error: 'the body must be a JSON object with ends and circuits' },
);

export type AdapterInput = z.infer<typeof adapterCheckInputSchema>;
export type AdapterEnd = z.infer<typeof adapterEndSchema>;
export type CircuitInput = z.infer<typeof circuitInputSchema>;
export type WireSizeRange = z.infer<typeof wireSizeRangeSchema>;
export type CavityView = z.infer<typeof cavityViewSchema>;

export const findingCodes = [
  'END_MISSING',
  'CAVITY_UNKNOWN',
  'CAVITY_REUSED',
  'OPEN_END',
  'EMPTY_CIRCUIT',
  'COUNT_MISMATCH',
  'SIZE_UNREADABLE',
  'CAVITY_UNUSED',
  'ROLE_MISMATCH',
  'SIZE_OUT_OF_RANGE',
  'VOLTAGE_DROP_HIGH',
  'COLOR_UNKNOWN',
  'DUPLICATE_CIRCUIT',
  'TERMINATED',
  // Only from the in-process call: the server answers 400 instead of reporting these.
  'INPUT_INVALID',
  'CHECK_FAILED',
] as const;

export const findingSchema = z.object({
  code: z.enum(findingCodes),
  severity: z.enum(['error', 'warning']).optional(),
  circuit: z.number().int().min(0).optional(),
  end: z.enum(['A', 'B']).optional(),
  cavity: z.string().optional(),
  field: z.string().optional(),
  message: z.string(),
});

const endSummarySchema = z.object({
  cavities: z.number().int().min(0),
  used: z.number().int().min(0),
  unused: z.array(z.string()),
  plugsNeeded: z.number().int().min(0),
});

export const checkReportSchema = z.object({
  ok: z.boolean(),
  errors: z.array(findingSchema),
  warnings: z.array(findingSchema),
  summary: z.object({
    circuits: z.number().int().min(0),
    splices: z.number().int().min(0),
    ends: z.object({ A: endSummarySchema, B: endSummarySchema }),
    landed: z.object({ A: z.number().int().min(0), B: z.number().int().min(0) }),
  }),
});

export type FindingCode = (typeof findingCodes)[number];
export type Finding = z.infer<typeof findingSchema>;
export type EndSummary = z.infer<typeof endSummarySchema>;
export type CheckReport = z.infer<typeof checkReportSchema>;

// A hand-written twin of adapterCheckInputSchema for the editor's keystroke path, where a
// zod pass costs as much as the check itself. It may refuse more than the schema (the
// caller then falls back to the schema) but must never accept what the schema refuses;
// a property test holds it to that.

function isRecord(v: unknown): v is Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

const isNil = (v: unknown) => v === null || v === undefined;
const optString = (v: unknown) => isNil(v) || typeof v === 'string';
const isLabel = (v: unknown) =>
  typeof v === 'string' || (typeof v === 'number' && Number.isFinite(v));
const optLabel = (v: unknown) => isNil(v) || isLabel(v);
const optNonNegative = (v: unknown) =>
  isNil(v) || (typeof v === 'number' && Number.isFinite(v) && v >= 0);
const isPositiveInt = (v: unknown) => typeof v === 'number' && Number.isSafeInteger(v) && v > 0;

function labelList(v: unknown): boolean {
  if (isNil(v) || isLabel(v)) return true;
  if (!Array.isArray(v)) return false;
  for (let i = 0; i < v.length; i++) if (!isLabel(v[i])) return false;
  return true;
}

function wellFormedEnd(e: unknown): boolean {
  if (isNil(e)) return true;
  if (!isRecord(e)) return false;
  if (!optString(e.label) || !optLabel(e.connectorId)) return false;
  if (!isNil(e.cavities)) {
    if (!Array.isArray(e.cavities)) return false;
    for (let i = 0; i < e.cavities.length; i++) if (!isLabel(e.cavities[i])) return false;
  }
  const n = e.cavityCount;
  if (
    !isNil(n) &&
    !(typeof n === 'number' && Number.isSafeInteger(n) && n >= 0 && n <= MAX_CAVITIES)
  ) {
    return false;
  }
  if (!isNil(e.sealed) && typeof e.sealed !== 'boolean') return false;
  if (!isNil(e.roles)) {
    if (!isRecord(e.roles)) return false;
    for (const key of Object.keys(e.roles)) {
      // The schema drops a "__proto__" key; leave such inputs to it.
      if (key === '__proto__' || !optString(e.roles[key])) return false;
    }
  }
  if (!isNil(e.wireSize)) {
    if (!isRecord(e.wireSize) || !optLabel(e.wireSize.min) || !optLabel(e.wireSize.max))
      return false;
  }
  if (!isNil(e.view) && e.view !== 'mating-face' && e.view !== 'wire-side') return false;
  if (!isNil(e.layout)) {
    if (!isRecord(e.layout) || !isPositiveInt(e.layout.rows) || !isPositiveInt(e.layout.cols))
      return false;
  }
  return true;
}

function wellFormedCircuit(c: unknown): boolean {
  return (
    isRecord(c) &&
    optLabel(c.id) &&
    labelList(c.a) &&
    labelList(c.b) &&
    optString(c.role) &&
    optLabel(c.size) &&
    optString(c.color) &&
    optString(c.termination) &&
    optNonNegative(c.lengthMm) &&
    optNonNegative(c.currentA) &&
    optString(c.note)
  );
}

/**
 * Fast, conservative test that `value` matches {@link adapterCheckInputSchema}: true
 * only when the schema would accept it unchanged apart from dropping unknown keys.
 * False means "ask the schema", not necessarily "invalid".
 */
export function isWellFormedAdapterInput(value: unknown): value is AdapterInput {
  if (!isRecord(value)) return false;
  const v = value.systemVoltage;
  if (!isNil(v) && !(typeof v === 'number' && Number.isFinite(v) && v > 0)) return false;
  if (!isNil(value.ends)) {
    if (!isRecord(value.ends) || !wellFormedEnd(value.ends.A) || !wellFormedEnd(value.ends.B))
      return false;
  }
  const circuits = value.circuits;
  if (!isNil(circuits)) {
    if (!Array.isArray(circuits)) return false;
    for (let i = 0; i < circuits.length; i++) if (!wellFormedCircuit(circuits[i])) return false;
  }
  return true;
}

/** One reason a body was refused, with where it is ("circuits[2].a[0]"). */
export interface InputIssue {
  path: string;
  message: string;
}

/** Result of {@link parseAdapterCheckInput}. */
export type ParsedAdapterCheckInput =
  { ok: true; data: AdapterInput } | { ok: false; message: string; issues: InputIssue[] };

function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out;
}

/**
 * One schema issue as a sentence: "circuits[2].a[0]: a cavity label must be text or a
 * number." When the message already names the last key, the path stops at its parent.
 */
export function describeInputIssue(issue: {
  path: readonly PropertyKey[];
  message: string;
}): string {
  let path = issue.path;
  const last = path[path.length - 1];
  if (typeof last === 'string' && issue.message.startsWith(`${last} `)) path = path.slice(0, -1);
  const where = formatPath(path);
  if (where) return `${where}: ${issue.message}.`;
  // A message that opens with a field name keeps the name's spelling.
  return path.length < issue.path.length ? `${issue.message}.` : `${capitalise(issue.message)}.`;
}

/**
 * Validates a request body. On failure `message` is one readable paragraph for a 400
 * answer ("circuits[2].a[0]: a cavity label must be text or a number."), and `issues`
 * lists each problem with its path.
 */
export function parseAdapterCheckInput(body: unknown): ParsedAdapterCheckInput {
  const result = adapterCheckInputSchema.safeParse(body);
  if (result.success) return { ok: true, data: result.data };
  const first = result.error.issues.slice(0, 20);
  const issues: InputIssue[] = first.map((issue) => ({
    path: formatPath(issue.path),
    message: issue.message,
  }));
  const sentences = first.map(describeInputIssue);
  return {
    ok: false,
    message: `The adapter cannot be checked because the request is not in the expected shape. ${sentences.join(' ')}`,
    issues,
  };
}

function capitalise(s: string): string {
  return s ? s[0].toUpperCase() + s.slice(1) : s;
}
