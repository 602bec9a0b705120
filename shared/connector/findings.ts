/**
 * The automatic findings of a connector sheet: what the editor shows beside the cell
 * that is wrong and what the moderator sees on the review page.
 *
 * Errors mean the pin map cannot be trusted as written (no view side, a pin row for a
 * cavity the housing does not have, a size nobody can read); warnings ask for a second
 * look. Neither blocks saving a draft.
 */
import type { ConnectorContent, PinRow } from '../schemas/connector';
import { parseWireColor } from '../wire/colors';
import { parseWireSize } from '../wire/awg';
import { connectorCavityLabels, layoutCavities } from './layout';

export type SheetFindingCode =
  | 'NO_CAVITIES'
  | 'VIEW_MISSING'
  | 'CAVITY_DUPLICATE'
  | 'PIN_CAVITY_MISSING'
  | 'PIN_CAVITY_UNKNOWN'
  | 'PIN_CAVITY_REPEATED'
  | 'SIZE_UNREADABLE'
  | 'HOUSING_MISSING'
  | 'COLOR_UNKNOWN'
  | 'SIZE_OUT_OF_RANGE'
  | 'WIRE_RANGE_UNREADABLE'
  | 'WIRE_RANGE_INVERTED'
  | 'ROLE_MISSING'
  | 'CAVITY_UNDOCUMENTED'
  | 'LAYOUT_TOO_SMALL'
  | 'POSITION_PROBLEM';

/** One finding; `row` is the 0-based index into `pins`, `field` the cell's column. */
export interface SheetFinding {
  code: SheetFindingCode;
  severity: 'error' | 'warning';
  message: string;
  cavity?: string;
  row?: number;
  field?: string;
}

/** Cautions a page must show for what the circuits carry. */
export type CautionKind = 'battery' | 'airbag' | 'fuel' | 'high-current';
export const CAUTION_ORDER: readonly CautionKind[] = ['airbag', 'fuel', 'battery', 'high-current'];

export interface ConnectorFindings {
  /** True when there are no errors. */
  ok: boolean;
  errors: SheetFinding[];
  warnings: SheetFinding[];
  cautions: CautionKind[];
  summary: { cavities: number; documented: number; undocumented: string[] };
}

const ERROR_CODES = new Set<SheetFindingCode>([
  'NO_CAVITIES',
  'VIEW_MISSING',
  'CAVITY_DUPLICATE',
  'PIN_CAVITY_MISSING',
  'PIN_CAVITY_UNKNOWN',
  'PIN_CAVITY_REPEATED',
  'SIZE_UNREADABLE',
]);

const CAUTION_PATTERNS: Array<[CautionKind, RegExp]> = [
  ['airbag', /air ?bag|\bsrs\b|squib|restraint|pretensioner|deploy/i],
  ['fuel', /fuel|injector/i],
  ['battery', /battery|\bbatt\b|\bb\+|unfused|permanent (?:feed|live)|constant (?:feed|live)/i],
  [
    'high-current',
    /high[- ]current|starter|alternator|glow ?plug|cooling fan|fan motor|heater element/i,
  ],
];

/** Cross-section from which a circuit counts as high-current: 12 AWG is 3.31 mm² (common practice). */
const HIGH_CURRENT_AREA_MM2 = 3.0;

const list = (labels: string[], max = 12) =>
  labels.length > max
    ? `${labels.slice(0, max).join(', ')} and ${labels.length - max} more`
    : labels.join(', ');

const blank = (s: string | null | undefined) => !s || !s.trim();

function rowIsBlank(p: PinRow) {
  return [p.cavity, p.role, p.color, p.size, p.circuit, p.note].every(blank);
}

/**
 * The cautions a sheet needs: battery feeds, airbag (SRS) circuits, fuel pump and
 * injector circuits, and high-current circuits (named so, or wire of 12 AWG / 3 mm² and
 * heavier), from the pin roles, notes and circuit names and the component.
 */
export function connectorCautions(
  content: Pick<ConnectorContent, 'pins' | 'component'>,
): CautionKind[] {
  const found = new Set<CautionKind>();
  const texts = [content.component ?? ''];
  for (const p of content.pins ?? []) {
    texts.push(p.role ?? '', p.note ?? '', p.circuit ?? '');
    if (p.size && !blank(p.size)) {
      const size = parseWireSize(p.size);
      if (size.ok && size.areaMm2 >= HIGH_CURRENT_AREA_MM2) found.add('high-current');
    }
  }
  const all = texts.join('\n');
  for (const [kind, re] of CAUTION_PATTERNS) if (re.test(all)) found.add(kind);
  return CAUTION_ORDER.filter((k) => found.has(k));
}

/** Every finding of a connector sheet, errors first. Never throws on schema-valid content. */
export function connectorFindings(content: ConnectorContent): ConnectorFindings {
  const out: SheetFinding[] = [];
  const add = (f: Omit<SheetFinding, 'severity'>) =>
    out.push({ ...f, severity: ERROR_CODES.has(f.code) ? 'error' : 'warning' });

  const labels = connectorCavityLabels(content);
  const known = new Map(labels.map((l) => [l.toLowerCase(), l]));

  if (!labels.length) {
    add({
      code: 'NO_CAVITIES',
      field: 'cavities',
      message: 'The sheet has no cavities yet: give the cavity count or list the labels.',
    });
  }
  if (!content.view) {
    add({
      code: 'VIEW_MISSING',
      field: 'view',
      message:
        'Say which side the drawing is viewed from (mating face or wire side); a pin map without it can be read mirrored.',
    });
  }
  if (!content.housing) {
    add({
      code: 'HOUSING_MISSING',
      field: 'housing',
      message: 'Say whether the housing holds pins or sockets.',
    });
  }

  if (Array.isArray(content.cavities)) {
    const seen = new Set<string>();
    const repeated = new Set<string>();
    for (const raw of content.cavities) {
      const key = raw.trim().toLowerCase();
      if (!key) continue;
      if (seen.has(key)) repeated.add(raw.trim());
      seen.add(key);
    }
    if (repeated.size) {
      add({
        code: 'CAVITY_DUPLICATE',
        field: 'cavities',
        message: `The cavity list names ${list([...repeated])} more than once; every cavity needs its own label.`,
      });
    }
  }

  let range: { min?: number; max?: number } = {};
  for (const bound of ['min', 'max'] as const) {
    const text = content.wireSize?.[bound];
    if (blank(text)) continue;
    const parsed = parseWireSize(text);
    if (parsed.ok) range = { ...range, [bound]: parsed.areaMm2 };
    else
      add({
        code: 'WIRE_RANGE_UNREADABLE',
        field: `wireSize.${bound}`,
        message: `Wire-size range ${bound}: ${parsed.reason}`,
      });
  }
  if (range.min !== undefined && range.max !== undefined && range.min > range.max) {
    add({
      code: 'WIRE_RANGE_INVERTED',
      field: 'wireSize',
      message:
        'The wire-size range runs backwards: "min" should be the thinnest wire the terminals take, "max" the thickest.',
    });
    range = { min: range.max, max: range.min };
  }

  const documented = new Map<string, number>();
  (content.pins ?? []).forEach((p, row) => {
    if (rowIsBlank(p)) return;
    const label = p.cavity.trim();
    if (!label) {
      add({
        code: 'PIN_CAVITY_MISSING',
        row,
        field: 'cavity',
        message: `Row ${row + 1} has no cavity: say which cavity it describes.`,
      });
    } else {
      const key = label.toLowerCase();
      if (labels.length && !known.has(key)) {
        add({
          code: 'PIN_CAVITY_UNKNOWN',
          row,
          field: 'cavity',
          cavity: label,
          message: `Row ${row + 1} names cavity "${label}", which this connector does not have (its cavities are ${list(labels)}).`,
        });
      } else if (documented.has(key)) {
        add({
          code: 'PIN_CAVITY_REPEATED',
          row,
          field: 'cavity',
          cavity: label,
          message: `Cavity ${label} is described twice, in rows ${documented.get(key)! + 1} and ${row + 1}; keep one row per cavity.`,
        });
      } else {
        documented.set(key, row);
      }
      if (blank(p.role)) {
        add({
          code: 'ROLE_MISSING',
          row,
          field: 'role',
          cavity: label,
          message: `Cavity ${label} has no circuit role; use "unused" for an empty cavity.`,
        });
      }
    }
    if (!blank(p.color)) {
      const c = parseWireColor(p.color);
      if (!c.ok)
        add({
          code: 'COLOR_UNKNOWN',
          row,
          field: 'color',
          cavity: label || undefined,
          message: `Row ${row + 1}: ${c.reason}`,
        });
    }
    if (!blank(p.size)) {
      const s = parseWireSize(p.size);
      if (!s.ok) {
        add({
          code: 'SIZE_UNREADABLE',
          row,
          field: 'size',
          cavity: label || undefined,
          message: `Row ${row + 1}: ${s.reason}`,
        });
      } else if (
        (range.min !== undefined && s.areaMm2 < range.min * (1 - 1e-6)) ||
        (range.max !== undefined && s.areaMm2 > range.max * (1 + 1e-6))
      ) {
        add({
          code: 'SIZE_OUT_OF_RANGE',
          row,
          field: 'size',
          cavity: label || undefined,
          message: `Row ${row + 1}: ${p.size!.trim()} is outside the terminals' wire-size range (${content.wireSize?.min || '…'} to ${content.wireSize?.max || '…'}).`,
        });
      }
    }
  });

  const undocumented = labels.filter((l) => !documented.has(l.toLowerCase()));
  if (labels.length && undocumented.length) {
    add({
      code: 'CAVITY_UNDOCUMENTED',
      field: 'pins',
      message: `Cavit${undocumented.length === 1 ? 'y' : 'ies'} ${list(undocumented)} ${undocumented.length === 1 ? 'has' : 'have'} no row in the pin table; add ${undocumented.length === 1 ? 'it' : 'them'}, with the role "unused" if empty.`,
    });
  }

  const layout = content.layout;
  if (layout?.positions?.length) {
    const layoutOut = layoutCavities(content);
    const problems: string[] = [];
    const cells = new Set<string>();
    for (const p of layout.positions) {
      if (!known.has(p.label.trim().toLowerCase()))
        problems.push(`"${p.label}" is not one of the cavities`);
      const cell = `${p.row},${p.col}`;
      if (cells.has(cell))
        problems.push(`two cavities share row ${p.row + 1}, column ${p.col + 1}`);
      cells.add(cell);
    }
    if (layoutOut.unplaced.length)
      problems.push(
        `${list(layoutOut.unplaced)} ha${layoutOut.unplaced.length === 1 ? 's' : 've'} no position`,
      );
    if (problems.length)
      add({
        code: 'POSITION_PROBLEM',
        field: 'layout.positions',
        message: `Cavity positions: ${problems.slice(0, 5).join('; ')}.`,
      });
  } else if (layout?.rows && layout?.cols && labels.length > layout.rows * layout.cols) {
    add({
      code: 'LAYOUT_TOO_SMALL',
      field: 'layout',
      message: `A ${layout.rows} × ${layout.cols} grid holds ${layout.rows * layout.cols} cavities but the connector has ${labels.length}; the drawing adds rows.`,
    });
  }

  const errors = out.filter((f) => f.severity === 'error');
  const warnings = out.filter((f) => f.severity === 'warning');
  return {
    ok: errors.length === 0,
    errors,
    warnings,
    cautions: connectorCautions(content),
    summary: { cavities: labels.length, documented: documented.size, undocumented },
  };
}
