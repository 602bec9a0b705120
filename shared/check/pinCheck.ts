/**
 * The pin-to-pin check of an adapter between two connectors (end A, end B).
 *
 * Runs in the browser on every keystroke and on the server, so it is linear in the size
 * of the input: every lookup is a Map, Set or array index built once per check, and
 * nothing compares circuits pairwise.
 */
import {
  adapterCheckInputSchema,
  describeInputIssue,
  isWellFormedAdapterInput,
  type AdapterEnd,
  type AdapterInput,
  type CheckReport,
  type CircuitInput,
  type EndSummary,
  type Finding,
  type FindingCode,
} from '../schemas/adapter';
import { parseWireSize, awgGaugeName, type WireSizeResult } from '../wire/awg';
import { parseWireColor, type WireColorResult } from '../wire/colors';
import { endCavityLabels, normalizeCavityLabel } from '../wire/cavities';
import {
  ABYC_E11_CRITICAL_DROP_PERCENT,
  DEFAULT_SYSTEM_VOLTAGE,
  smallestAwgForDrop,
  voltageDrop,
} from '../wire/voltageDrop';

export type Side = 'A' | 'B';

const ERROR_CODES: ReadonlySet<FindingCode> = new Set<FindingCode>([
  'END_MISSING',
  'CAVITY_UNKNOWN',
  'CAVITY_REUSED',
  'OPEN_END',
  'EMPTY_CIRCUIT',
  'COUNT_MISMATCH',
  'SIZE_UNREADABLE',
  'INPUT_INVALID',
  'CHECK_FAILED',
]);

/** Whether a code is an error (the adapter cannot be built as written) or a warning. */
export function severityOf(code: FindingCode): 'error' | 'warning' {
  return ERROR_CODES.has(code) ? 'error' : 'warning';
}

/**
 * Role text in the form roles are compared in: trimmed, case-folded, single spaces,
 * every dash or minus sign as "-", and a trailing sign attached ("Motor −" = "motor-").
 * Deliberately no synonyms: "gnd" and "ground" stay different.
 */
export function normalizeRole(role: string): string {
  // NFKC is slow and only matters outside printable ASCII (full-width signs and the like).
  const folded = /^[\x20-\x7e]*$/.test(role) ? role : role.normalize('NFKC');
  return folded
    .trim()
    .toLowerCase()
    .replace(/[\u2010-\u2015\u2212\ufe63\uff0d]/g, '-')
    .replace(/\s+/g, ' ')
    .replace(/ ([+-])$/, '$1');
}

interface Label {
  /** As written, trimmed. */
  text: string;
  /** Normalised, for comparison. */
  key: string;
  /** Position in the end's cavity list, or −1 when the end has no such cavity. */
  slot: number;
}

interface DocumentedRole {
  text: string;
  key: string;
}

interface SizeBound {
  area: number;
  label: string;
}

/** Role text → comparison key, shared by one check run (roles repeat a lot). */
type RoleKeys = Map<string, string>;

function roleKey(cache: RoleKeys, text: string): string {
  let key = cache.get(text);
  if (key === undefined) {
    key = normalizeRole(text);
    cache.set(text, key);
  }
  return key;
}

interface EndInfo {
  side: Side;
  missing: boolean;
  absent: boolean;
  labels: string[];
  /** Normalised label → position in `labels`; left empty when `numeric` applies. */
  slotOf: Map<string, number>;
  /** When the labels are exactly "1".."n", n (positions are then found by arithmetic). */
  numeric: number;
  /** Documented role per position. */
  roleOf: (DocumentedRole | undefined)[];
  hasRoles: boolean;
  /** First circuit using each position, −1 while unused. */
  owner: Int32Array;
  /** First circuit naming each label the end does not have. */
  strayOwner: Map<string, number>;
  sealed: boolean;
  min?: SizeBound;
  max?: SizeBound;
}

const EMPTY_END_SUMMARY = (): EndSummary => ({ cavities: 0, used: 0, unused: [], plugsNeeded: 0 });

function emptyReport(finding: Finding): CheckReport {
  return {
    ok: false,
    errors: [finding],
    warnings: [],
    summary: {
      circuits: 0,
      splices: 0,
      ends: { A: EMPTY_END_SUMMARY(), B: EMPTY_END_SUMMARY() },
      landed: { A: 0, B: 0 },
    },
  };
}

/** Shortens user text quoted inside a message. */
function clip(text: string, max = 60): string {
  return text.length > max ? `${text.slice(0, max - 1)}…` : text;
}

/** "cavity 7" for numbers, "cavity "A"" otherwise so letters do not read as end names. */
function cav(label: string): string {
  return /^\d+$/.test(label) ? `cavity ${label}` : `cavity "${clip(label, 24)}"`;
}

function row(i: number): string {
  return `Circuit ${i + 1}`;
}

function other(side: Side): Side {
  return side === 'A' ? 'B' : 'A';
}

function fmtVolts(v: number): string {
  return v >= 0.1 ? v.toFixed(2) : v.toPrecision(2);
}

function fmtPercent(p: number): string {
  return p >= 10 ? p.toFixed(0) : p.toFixed(1);
}

function sizeText(result: WireSizeResult & { ok: true }): string {
  return result.size.label;
}

/** Position of `key` in `end`'s labels, or −1. */
function slotFor(end: EndInfo, key: string): number {
  if (end.numeric < 0) return end.slotOf.get(key) ?? -1;
  // Canonical decimal only: "01" or "1.0" is not cavity 1.
  const len = key.length;
  if (len === 0 || len > 9 || key.charCodeAt(0) === 48) return -1;
  let n = 0;
  for (let k = 0; k < len; k++) {
    const d = key.charCodeAt(k) - 48;
    if (d < 0 || d > 9) return -1;
    n = n * 10 + d;
  }
  return n <= end.numeric ? n - 1 : -1;
}

const NO_LABELS: Label[] = [];

function toLabels(value: CircuitInput['a'], end: EndInfo): Label[] {
  if (value === null || value === undefined) return NO_LABELS;
  const list = Array.isArray(value) ? value : [value];
  if (list.length === 0) return NO_LABELS;
  let out: Label[] | undefined;
  let seen: Set<string> | undefined;
  for (const raw of list) {
    const text = String(raw).trim();
    if (!text) continue;
    const key = text.toLowerCase();
    if (out === undefined) {
      out = [];
    } else {
      // Splices are rare and short; only build a set once a second label shows up.
      seen ??= new Set(out.map((l) => l.key));
      if (seen.has(key)) continue;
      seen.add(key);
    }
    out.push({ text, key, slot: slotFor(end, key) });
  }
  return out ?? NO_LABELS;
}

function blankToUndefined(value: string | null | undefined): string | undefined {
  if (typeof value !== 'string') return undefined;
  const t = value.trim();
  return t ? t : undefined;
}

/**
 * An end's labels (as {@link endCavityLabels} gives them) with their index, in one pass.
 * Lists that read exactly "1".."n" skip the Map.
 */
function indexEnd(end: AdapterEnd | null | undefined): {
  labels: string[];
  slotOf: Map<string, number>;
  numeric: number;
} {
  const slotOf = new Map<string, number>();
  if (!end) return { labels: [], slotOf, numeric: -1 };
  const list = Array.isArray(end.cavities) ? end.cavities : undefined;
  if (list && list.length > 0) {
    let numeric = true;
    for (let k = 0; k < list.length && numeric; k++) {
      const raw = list[k];
      numeric = typeof raw === 'number' ? raw === k + 1 : raw === String(k + 1);
    }
    if (numeric) return { labels: list.map(String), slotOf, numeric: list.length };
    const labels: string[] = [];
    for (const raw of list) {
      const label = String(raw).trim();
      const key = label.toLowerCase();
      if (!label || slotOf.has(key)) continue;
      slotOf.set(key, labels.length);
      labels.push(label);
    }
    if (labels.length > 0) return { labels, slotOf, numeric: -1 };
  }
  const labels = endCavityLabels({ cavityCount: end.cavityCount });
  return { labels, slotOf, numeric: labels.length };
}

function prepareEnd(side: Side, end: AdapterEnd | null | undefined, roleKeys: RoleKeys): EndInfo {
  const { labels, slotOf, numeric } = indexEnd(end);
  const info: EndInfo = {
    side,
    missing: labels.length === 0,
    absent: !end,
    labels,
    slotOf,
    numeric,
    roleOf: [],
    hasRoles: false,
    owner: new Int32Array(labels.length).fill(-1),
    strayOwner: new Map(),
    sealed: end?.sealed === true,
  };
  if (!end) return info;
  if (end.roles) {
    for (const cavity of Object.keys(end.roles)) {
      const text = blankToUndefined(end.roles[cavity]);
      const slot = text ? slotFor(info, normalizeCavityLabel(cavity)) : -1;
      // A role for a cavity the end does not have documents nothing a circuit can reach.
      if (text && slot >= 0) {
        info.roleOf[slot] = { text, key: roleKey(roleKeys, text) };
        info.hasRoles = true;
      }
    }
  }
  if (end.wireSize) {
    const lo = end.wireSize.min == null ? undefined : parseWireSize(end.wireSize.min);
    const hi = end.wireSize.max == null ? undefined : parseWireSize(end.wireSize.max);
    // Unreadable bounds are ignored: the range is a hint, not part of the pinout.
    let min = lo?.ok ? { area: lo.areaMm2, label: sizeText(lo) } : undefined;
    let max = hi?.ok ? { area: hi.areaMm2, label: sizeText(hi) } : undefined;
    // "min 18 AWG, max 22 AWG" is written by people thinking in gauge numbers.
    if (min && max && min.area > max.area) [min, max] = [max, min];
    info.min = min;
    info.max = max;
  }
  return info;
}

function endMissingMessage(info: EndInfo, end: AdapterEnd | null | undefined): string {
  if (info.absent) {
    return `End ${info.side} is missing. Describe the connector at end ${info.side} with its cavity labels or a cavity count.`;
  }
  const name = blankToUndefined(end?.label);
  const named = name ? `End ${info.side} (${clip(name)})` : `End ${info.side}`;
  return `${named} has no cavities. List its cavity labels or give its cavity count.`;
}

/** Check of an input already known to match {@link adapterCheckInputSchema}. */
export function checkParsedAdapter(input: AdapterInput): CheckReport {
  try {
    return runCheck(input);
  } catch {
    return emptyReport({
      code: 'CHECK_FAILED',
      severity: 'error',
      message:
        'The check could not finish on this input. Please report the adapter so it can be fixed.',
    });
  }
}

/**
 * Runs the pin-to-pin check on any value. A value that is not an adapter of the
 * expected shape gives a report with one INPUT_INVALID error (the server answers 400
 * for those instead); the function never throws.
 */
export function checkAdapter(input: unknown): CheckReport {
  try {
    if (isWellFormedAdapterInput(input)) return checkParsedAdapter(input);
    const parsed = adapterCheckInputSchema.safeParse(input);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const path = issue?.path ?? [];
      const finding: Finding = {
        code: 'INPUT_INVALID',
        severity: 'error',
        message: `The adapter cannot be checked. ${issue ? describeInputIssue(issue) : 'The input is not an adapter.'}`,
      };
      if (path[0] === 'circuits' && typeof path[1] === 'number') {
        finding.circuit = path[1];
        if (typeof path[2] === 'string') finding.field = path[2];
      } else if (path[0] === 'ends' && (path[1] === 'A' || path[1] === 'B')) {
        finding.end = path[1];
        if (typeof path[2] === 'string') finding.field = path[2];
      }
      return emptyReport(finding);
    }
    return checkParsedAdapter(parsed.data);
  } catch {
    return emptyReport({
      code: 'CHECK_FAILED',
      severity: 'error',
      message:
        'The check could not finish on this input. Please report the adapter so it can be fixed.',
    });
  }
}

function runCheck(input: AdapterInput): CheckReport {
  const errors: Finding[] = [];
  const warnings: Finding[] = [];
  const add: Add = (f) => {
    const severity = severityOf(f.code);
    const { code, ...rest } = f;
    (severity === 'error' ? errors : warnings).push({ code, severity, ...rest });
  };

  const ends = input.ends ?? undefined;
  const roleKeys: RoleKeys = new Map();
  const info: Record<Side, EndInfo> = {
    A: prepareEnd('A', ends?.A, roleKeys),
    B: prepareEnd('B', ends?.B, roleKeys),
  };
  for (const side of ['A', 'B'] as const) {
    if (info[side].missing) {
      add({ code: 'END_MISSING', end: side, message: endMissingMessage(info[side], ends?.[side]) });
    }
  }

  const systemVoltage = input.systemVoltage ?? DEFAULT_SYSTEM_VOLTAGE;
  const circuits = input.circuits ?? [];
  const duplicateOf = new Map<string, number>();
  const sizeCache = new Map<string, WireSizeResult>();
  const colorCache = new Map<string, WireColorResult>();
  let splices = 0;
  const landed = { A: 0, B: 0 };
  const landedUnterminated = { A: 0, B: 0 };

  // Duplicate detection is lazy: two circuits with the same cavity sets must share a
  // cavity, so a circuit's set key is only needed once one of its cavities is reused.
  const sideLabels: Record<Side, Label[][]> = {
    A: new Array(circuits.length),
    B: new Array(circuits.length),
  };
  const keyed = new Set<number>();
  const register = (j: number): number | undefined => {
    if (keyed.has(j)) return undefined;
    keyed.add(j);
    const key = duplicateKey(sideLabels.A[j], sideLabels.B[j]);
    const first = duplicateOf.get(key);
    if (first === undefined) duplicateOf.set(key, j);
    return first;
  };

  const landSide = (i: number, side: Side, labels: Label[], terminated: boolean): boolean => {
    landed[side]++;
    if (!terminated) landedUnterminated[side]++;
    const end = info[side];
    const field = side === 'A' ? 'a' : 'b';
    let reused = false;
    for (const label of labels) {
      let first: number | undefined;
      if (label.slot >= 0) {
        first = end.owner[label.slot];
        if (first < 0) {
          end.owner[label.slot] = i;
          continue;
        }
      } else {
        first = end.strayOwner.get(label.key);
        if (first === undefined) end.strayOwner.set(label.key, i);
      }
      if (label.slot < 0 && !end.missing) {
        add({
          code: 'CAVITY_UNKNOWN',
          circuit: i,
          end: side,
          cavity: label.text,
          field,
          message: `${row(i)} names ${cav(label.text)} on end ${side}, but end ${side} has no cavity with that label.`,
        });
      }
      if (first !== undefined && first !== i) {
        reused = true;
        register(first);
        add({
          code: 'CAVITY_REUSED',
          circuit: i,
          end: side,
          cavity: label.slot >= 0 ? end.labels[label.slot] : label.text,
          field,
          message: `${row(i)} uses ${cav(label.text)} on end ${side}, which is also used by circuit ${first + 1}. A cavity holds one terminal; join wires with a splice inside one circuit instead.`,
        });
      }
    }
    return reused;
  };

  const leaveSide = (i: number, side: Side, termination: string | undefined): void => {
    if (termination) {
      add({
        code: 'TERMINATED',
        circuit: i,
        end: side,
        field: 'termination',
        message: `${row(i)} has no cavity on end ${side}; it leaves the adapter through "${clip(termination, 80)}". Make sure the build sheet shows where it goes.`,
      });
    } else {
      add({
        code: 'OPEN_END',
        circuit: i,
        end: side,
        field: side === 'A' ? 'a' : 'b',
        message: `${row(i)} lands on end ${other(side)} but has no cavity on end ${side} and no termination. Give it a cavity on end ${side}, or describe where it goes (for example "ring terminal to ground").`,
      });
    }
  };

  for (let i = 0; i < circuits.length; i++) {
    const c = circuits[i];
    const la = toLabels(c.a, info.A);
    const lb = toLabels(c.b, info.B);
    sideLabels.A[i] = la;
    sideLabels.B[i] = lb;
    const termination = blankToUndefined(c.termination);
    if (la.length > 1 || lb.length > 1) splices++;

    let reused = false;
    if (la.length > 0) reused = landSide(i, 'A', la, termination !== undefined);
    if (lb.length > 0) reused = landSide(i, 'B', lb, termination !== undefined) || reused;

    if (la.length === 0 && lb.length === 0) {
      add({
        code: 'EMPTY_CIRCUIT',
        circuit: i,
        message: `${row(i)} has no cavity on either end. Give it a cavity on end A and on end B, or remove the row.`,
      });
    } else {
      if (la.length === 0) leaveSide(i, 'A', termination);
      if (lb.length === 0) leaveSide(i, 'B', termination);
      if (termination && la.length > 0 && lb.length > 0) {
        add({
          code: 'TERMINATED',
          circuit: i,
          field: 'termination',
          message: `${row(i)} lands on both ends and also leaves the adapter through "${clip(termination, 80)}". Make sure the build sheet shows that branch.`,
        });
      }
      if (reused) {
        const first = register(i);
        if (first !== undefined) {
          add({
            code: 'DUPLICATE_CIRCUIT',
            circuit: i,
            message: `${row(i)} joins exactly the same cavities as circuit ${first + 1}. Remove one of the two rows, or correct its cavities.`,
          });
        }
      }
    }

    const sides = { A: la, B: lb };
    checkSize(i, c, sides, info, systemVoltage, sizeCache, add);
    checkColor(i, c, colorCache, add);
    checkRoles(i, c, sides, info, roleKeys, add);
  }

  if (landedUnterminated.A !== landedUnterminated.B) {
    add({
      code: 'COUNT_MISMATCH',
      message: `End A carries ${plural(landedUnterminated.A, 'circuit')} but end B carries ${landedUnterminated.B} (not counting circuits with a termination). Every circuit without a termination must land on both ends.`,
    });
  }

  const summaryEnds = {} as Record<Side, EndSummary>;
  for (const side of ['A', 'B'] as const) {
    const end = info[side];
    const unused: string[] = [];
    for (let k = 0; k < end.labels.length; k++) {
      if (end.owner[k] >= 0) continue;
      const label = end.labels[k];
      unused.push(label);
      add({
        code: 'CAVITY_UNUSED',
        end: side,
        cavity: label,
        message: end.sealed
          ? `${capital(cav(label))} on end ${side} is not used by any circuit. End ${side} is sealed, so it needs a cavity plug.`
          : `${capital(cav(label))} on end ${side} is not used by any circuit.`,
      });
    }
    summaryEnds[side] = {
      cavities: end.labels.length,
      used: end.labels.length - unused.length,
      unused,
      plugsNeeded: end.sealed ? unused.length : 0,
    };
  }

  return {
    ok: errors.length === 0,
    errors,
    warnings,
    summary: { circuits: circuits.length, splices, ends: summaryEnds, landed },
  };
}

type Add = (f: Omit<Finding, 'severity'> & { code: FindingCode }) => void;

function capital(s: string): string {
  return s[0].toUpperCase() + s.slice(1);
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function sideKey(labels: Label[]): string {
  if (labels.length === 1) return `${labels[0].key.length}:${labels[0].key}`;
  const keys = labels.map((l) => l.key).sort();
  let out = '';
  // Length-prefixed so that no label text can imitate a boundary.
  for (const k of keys) out += `${k.length}:${k}`;
  return out;
}

/** Identity of a circuit's cavity sets, independent of order within a side. */
function duplicateKey(a: Label[], b: Label[]): string {
  return `${a.length}|${sideKey(a)}|${sideKey(b)}`;
}

function checkSize(
  i: number,
  c: CircuitInput,
  sides: Record<Side, Label[]>,
  info: Record<Side, EndInfo>,
  systemVoltage: number,
  cache: Map<string, WireSizeResult>,
  add: Add,
): void {
  if (c.size === null || c.size === undefined) return;
  if (typeof c.size === 'string' && !c.size.trim()) return;
  const cacheKey = typeof c.size === 'number' ? `#${c.size}` : c.size;
  let size = cache.get(cacheKey);
  if (!size) {
    size = parseWireSize(c.size);
    cache.set(cacheKey, size);
  }
  if (!size.ok) {
    add({
      code: 'SIZE_UNREADABLE',
      circuit: i,
      field: 'size',
      message: `${row(i)} has a wire size that cannot be read. ${size.reason}`,
    });
    return;
  }

  for (const side of ['A', 'B'] as const) {
    const end = info[side];
    if (sides[side].length === 0 || (!end.min && !end.max)) continue;
    const tol = 1e-9 * size.areaMm2;
    let problem: string | undefined;
    if (end.min && size.areaMm2 < end.min.area - tol) {
      problem = `thinner than the smallest wire end ${side} takes (${end.min.label})`;
    } else if (end.max && size.areaMm2 > end.max.area + tol) {
      problem = `thicker than the largest wire end ${side} takes (${end.max.label})`;
    }
    if (problem) {
      add({
        code: 'SIZE_OUT_OF_RANGE',
        circuit: i,
        end: side,
        field: 'size',
        message: `${row(i)} uses ${size.size.label}, ${problem}. The terminal may not crimp or seal on it.`,
      });
    }
  }

  if (typeof c.lengthMm === 'number' && typeof c.currentA === 'number') {
    const drop = voltageDrop({
      currentA: c.currentA,
      lengthMm: c.lengthMm,
      areaMm2: size.areaMm2,
      systemVoltage,
      limit: ABYC_E11_CRITICAL_DROP_PERCENT,
    });
    if (drop.exceeds) {
      let better = smallestAwgForDrop(c.currentA, c.lengthMm, systemVoltage, drop.limitPercent);
      // Vehicle wire is stocked in even gauges (common practice), so suggest the next even one.
      if (better !== undefined && better > 0 && better % 2 === 1) better -= 1;
      const advice =
        better === undefined
          ? ' Shorten the run or split the load.'
          : ` ${awgGaugeName(better)} AWG or thicker would stay within it.`;
      add({
        code: 'VOLTAGE_DROP_HIGH',
        circuit: i,
        field: 'size',
        message: `${row(i)} loses ${fmtVolts(drop.volts)} V (${fmtPercent(drop.percent)} % of ${systemVoltage} V) carrying ${c.currentA} A through ${c.lengthMm} mm of ${size.size.label} and back, more than the ${drop.limitPercent} % allowed for critical circuits.${advice}`,
      });
    }
  }
}

function checkColor(
  i: number,
  c: CircuitInput,
  cache: Map<string, WireColorResult>,
  add: Add,
): void {
  const color = blankToUndefined(c.color);
  if (!color) return;
  let parsed = cache.get(color);
  if (!parsed) {
    parsed = parseWireColor(color);
    cache.set(color, parsed);
  }
  if (!parsed.ok) {
    add({
      code: 'COLOR_UNKNOWN',
      circuit: i,
      field: 'color',
      message: `${row(i)} has a colour that is not recognised. ${parsed.reason}`,
    });
  }
}

interface CavityRole {
  role: DocumentedRole;
  cavity: string;
}

const NO_ROLES: CavityRole[] = [];

function documented(labels: Label[], end: EndInfo): CavityRole[] {
  if (!end.hasRoles) return NO_ROLES;
  let out: CavityRole[] | undefined;
  for (const label of labels) {
    const role = label.slot >= 0 ? end.roleOf[label.slot] : undefined;
    if (role) (out ??= []).push({ role, cavity: end.labels[label.slot] });
  }
  return out ?? NO_ROLES;
}

function checkRoles(
  i: number,
  c: CircuitInput,
  sides: Record<Side, Label[]>,
  info: Record<Side, EndInfo>,
  roleKeys: RoleKeys,
  add: Add,
): void {
  if (!info.A.hasRoles && !info.B.hasRoles) return;
  const docs = { A: documented(sides.A, info.A), B: documented(sides.B, info.B) };
  const own = blankToUndefined(c.role);
  if (own) {
    const key = roleKey(roleKeys, own);
    for (const side of ['A', 'B'] as const) {
      for (const doc of docs[side]) {
        if (doc.role.key === key) continue;
        add({
          code: 'ROLE_MISMATCH',
          circuit: i,
          end: side,
          cavity: doc.cavity,
          field: 'role',
          message: `${row(i)} is a "${clip(own, 40)}" wire, but end ${side} documents ${cav(doc.cavity)} as "${clip(doc.role.text, 40)}".`,
        });
      }
    }
    return;
  }
  // Without a role of its own, the circuit's two ends must at least agree with each other.
  if (docs.A.length === 0 || docs.B.length === 0) return;
  const keysA = new Set(docs.A.map((d) => d.role.key));
  const keysB = new Set(docs.B.map((d) => d.role.key));
  let pair: [CavityRole, CavityRole] | undefined;
  const strayB = docs.B.find((d) => !keysA.has(d.role.key));
  if (strayB) pair = [docs.A[0], strayB];
  else {
    const strayA = docs.A.find((d) => !keysB.has(d.role.key));
    if (strayA) pair = [strayA, docs.B[0]];
  }
  if (!pair) return;
  add({
    code: 'ROLE_MISMATCH',
    circuit: i,
    field: 'role',
    message: `${row(i)} joins ${cav(pair[0].cavity)} on end A, documented as "${clip(pair[0].role.text, 40)}", to ${cav(pair[1].cavity)} on end B, documented as "${clip(pair[1].role.text, 40)}".`,
  });
}

/**
 * The same adapter seen from the other side: ends A and B swapped, and each circuit's
 * `a` and `b` swapped. Values that are not adapter-like objects come back unchanged.
 */
export function reverseEnds<T>(input: T): T {
  if (!input || typeof input !== 'object' || Array.isArray(input)) return input;
  const src = input as Record<string, unknown>;
  const out: Record<string, unknown> = { ...src };
  const ends = src.ends;
  if (ends && typeof ends === 'object' && !Array.isArray(ends)) {
    const e = ends as Record<string, unknown>;
    const swapped: Record<string, unknown> = { ...e };
    delete swapped.A;
    delete swapped.B;
    if (Object.hasOwn(e, 'B')) swapped.A = e.B;
    if (Object.hasOwn(e, 'A')) swapped.B = e.A;
    out.ends = swapped;
  }
  if (Array.isArray(src.circuits)) {
    out.circuits = src.circuits.map((c: unknown) => {
      if (!c || typeof c !== 'object' || Array.isArray(c)) return c;
      const circuit = c as Record<string, unknown>;
      const copy: Record<string, unknown> = { ...circuit };
      delete copy.a;
      delete copy.b;
      if (Object.hasOwn(circuit, 'b')) copy.a = circuit.b;
      if (Object.hasOwn(circuit, 'a')) copy.b = circuit.a;
      return copy;
    });
  }
  return out as T;
}
