/**
 * Adapter sheets on the server: linking an end to a published connector sheet, and the
 * pin-to-pin check run against what those sheets document.
 */
import { Op, type Transaction, type WhereOptions } from 'sequelize';
import type { AppContext } from '../context';
import type { AdapterEnd, AdapterInput, CheckReport, Finding } from '../../shared/schemas/adapter';
import { parseAdapterCheckInput } from '../../shared/schemas/adapter';
import { checkAdapter, checkParsedAdapter } from '../../shared/check';
import type { ConnectorContent } from '../../shared/schemas/connector';
import { connectorCavityLabels } from '../../shared/connector/layout';
import { fillLinkedEnd, linkedSheetOf, type LinkedSheet } from '../../shared/adapter/linkedEnd';

type Side = 'A' | 'B';
const SIDES: readonly Side[] = ['A', 'B'];

export type { LinkedSheet };

/** An end that names a sheet that is not published (or does not exist). */
export interface MissingLink {
  end: Side;
  connectorId: string | number;
}

export interface ResolvedAdapter {
  /** The input with linked ends filled in from their sheets. */
  input: AdapterInput;
  linked: Partial<Record<Side, LinkedSheet>>;
  missing: MissingLink[];
}

type Ref = { id: number } | { slug: string };

function refOf(connectorId: string | number): Ref | null {
  const text = String(connectorId).trim();
  if (!text) return null;
  if (/^\d{1,12}$/.test(text)) return { id: Number(text) };
  return { slug: text.toLowerCase() };
}

/**
 * Looks up the published connector sheets the ends of `input` link (`connectorId`: a
 * document id or slug), in one query for both ends, and fills each linked end with its
 * sheet's cavity labels, documented roles (pins[].role by cavity), sealed flag,
 * wire-size range, view side and grid. An id that names no published connector sheet
 * is listed in `missing` and the end is left as it was described.
 */
export async function resolveAdapterLinks(
  ctx: AppContext,
  input: AdapterInput,
  options: { transaction?: Transaction } = {},
): Promise<ResolvedAdapter> {
  const wanted: Array<{ side: Side; end: AdapterEnd; ref: Ref; raw: string | number }> = [];
  for (const side of SIDES) {
    const end = input.ends?.[side];
    if (!end || end.connectorId === null || end.connectorId === undefined) continue;
    const ref = refOf(end.connectorId);
    if (ref) wanted.push({ side, end, ref, raw: end.connectorId });
  }
  if (!wanted.length) return { input, linked: {}, missing: [] };

  const ids = wanted.flatMap((w) => ('id' in w.ref ? [w.ref.id] : []));
  const slugs = wanted.flatMap((w) => ('slug' in w.ref ? [w.ref.slug] : []));
  const either: WhereOptions[] = [];
  if (ids.length) either.push({ id: ids });
  if (slugs.length) either.push({ slug: slugs });
  const { Document, Revision } = ctx.models;
  const docs = await Document.findAll({
    attributes: ['id', 'slug', 'kind', 'publishedRevisionId'],
    where: { kind: 'connector', publishedRevisionId: { [Op.ne]: null }, [Op.or]: either },
    include: [
      {
        model: Revision,
        as: 'publishedRevision',
        attributes: ['id', 'title', 'content', 'status'],
        where: { status: 'published' },
        required: true,
      },
    ],
    transaction: options.transaction,
  });

  const byId = new Map<number, LinkedSheet>();
  const bySlug = new Map<string, LinkedSheet>();
  for (const doc of docs) {
    const rev = (doc as typeof doc & { publishedRevision?: InstanceType<typeof Revision> })
      .publishedRevision;
    if (!rev) continue;
    const sheet = linkedSheetOf(doc, rev.title, rev.content as ConnectorContent);
    byId.set(doc.id, sheet);
    bySlug.set(doc.slug, sheet);
  }

  const ends = { ...(input.ends ?? {}) };
  const linked: ResolvedAdapter['linked'] = {};
  const missing: MissingLink[] = [];
  for (const w of wanted) {
    const sheet = 'id' in w.ref ? byId.get(w.ref.id) : bySlug.get(w.ref.slug);
    if (!sheet) {
      missing.push({ end: w.side, connectorId: w.raw });
      continue;
    }
    linked[w.side] = sheet;
    ends[w.side] = fillLinkedEnd(w.end, sheet);
  }
  return { input: { ...input, ends }, linked, missing };
}

/**
 * Fills in the cavities and documented roles of ends that link a published connector
 * sheet (`connectorId`), so the check compares against the sheet, not a stale copy.
 * Ends whose sheet is not published are left as they were described.
 */
export async function resolveLinkedEnds(
  ctx: AppContext,
  input: AdapterInput,
): Promise<AdapterInput> {
  return (await resolveAdapterLinks(ctx, input)).input;
}

function missingFinding(m: MissingLink): Finding {
  const id = String(m.connectorId).slice(0, 80);
  return {
    code: 'END_MISSING',
    severity: 'error',
    end: m.end,
    field: 'connectorId',
    message: `End ${m.end} links the connector sheet "${id}", but no published connector sheet has that id or address. Link a published sheet, or describe end ${m.end} inline.`,
  };
}

/**
 * The pin-to-pin check of an adapter whose ends may link connector sheets. A link to a
 * sheet that is not published is an error (END_MISSING naming the sheet): the adapter
 * says it follows a reviewed pinout that readers cannot see. The end's own description
 * is still checked, so the rest of the report stays useful; the check's own
 * END_MISSING for that end, if any, is replaced by the one that names the sheet.
 */
export async function checkAdapterWithLinks(
  ctx: AppContext,
  input: AdapterInput,
): Promise<{ report: CheckReport; linked: ResolvedAdapter['linked'] }> {
  const resolved = await resolveAdapterLinks(ctx, input);
  const report = checkParsedAdapter(resolved.input);
  if (!resolved.missing.length) return { report, linked: resolved.linked };
  const sides = new Set(resolved.missing.map((m) => m.end));
  const errors = [
    ...resolved.missing.map(missingFinding),
    ...report.errors.filter((f) => !(f.code === 'END_MISSING' && f.end && sides.has(f.end))),
  ];
  return { report: { ...report, ok: false, errors }, linked: resolved.linked };
}

/**
 * The check of stored adapter content (as saved, so already in the schema's shape; a
 * stored body that no longer parses gets the check's own INPUT_INVALID report).
 */
export async function checkAdapterContent(
  ctx: AppContext,
  content: unknown,
): Promise<{ report: CheckReport; linked: ResolvedAdapter['linked'] }> {
  const parsed = parseAdapterCheckInput(content);
  if (!parsed.ok) return { report: checkAdapter(content), linked: {} };
  return checkAdapterWithLinks(ctx, parsed.data);
}

/** A published connector sheet as the adapter editor's look-up lists it. */
export interface ConnectorChoice {
  id: number;
  slug: string;
  title: string;
  component: string;
  cavities: number;
  sealed: boolean;
  view: string | null;
}

const MAX_CHOICES = 20;

/**
 * Published connector sheets whose title, component or tags contain every word of `q`
 * (case-insensitive), newest first; without `q`, the newest. One query.
 */
export async function findConnectorSheets(
  ctx: AppContext,
  q: string,
  limit = 10,
): Promise<ConnectorChoice[]> {
  const { Document, Revision } = ctx.models;
  const words = q
    .toLowerCase()
    .split(/\s+/)
    .map((w) => w.replace(/[%_\\]/g, ''))
    .filter(Boolean)
    .slice(0, 6);
  const revWhere: WhereOptions = { status: 'published' };
  if (words.length) {
    // Content is stored as JSON text, so one LIKE per word finds tags and the component too.
    (revWhere as Record<symbol, unknown>)[Op.and] = words.map((w) => ({
      [Op.or]: [{ title: { [Op.like]: `%${w}%` } }, { content: { [Op.like]: `%${w}%` } }],
    }));
  }
  const docs = await Document.findAll({
    attributes: ['id', 'slug', 'publishedRevisionId', 'updatedAt'],
    where: { kind: 'connector', publishedRevisionId: { [Op.ne]: null } },
    include: [
      {
        model: Revision,
        as: 'publishedRevision',
        attributes: ['id', 'title', 'content', 'publishedAt'],
        where: revWhere,
        required: true,
      },
    ],
    order: [[{ model: Revision, as: 'publishedRevision' }, 'publishedAt', 'DESC']],
    limit: Math.max(1, Math.min(MAX_CHOICES, limit)),
  });
  return docs.map((doc) => {
    const rev = (doc as typeof doc & { publishedRevision: InstanceType<typeof Revision> })
      .publishedRevision;
    const content = rev.content as ConnectorContent;
    return {
      id: doc.id,
      slug: doc.slug,
      title: rev.title,
      component: (content.component ?? '').trim(),
      cavities: connectorCavityLabels(content).length,
      sealed: content.sealed === true,
      view: content.view || null,
    };
  });
}
