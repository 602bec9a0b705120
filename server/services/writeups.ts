/**
 * Write-ups on the server: the findings only the server can add (the images are stored,
 * linked sheets are published), the plain text for search and summaries (read from the
 * Markdown parse, never rendered to HTML on the server), who may see a write-up's images,
 * and the list of published write-ups.
 */
import { Op, col, where } from 'sequelize';
import type { AppContext } from '../context';
import { Document, Revision, Upload, User } from '../models';
import { writeupContentSchema, type WriteupContent } from '../../shared/schemas/writeup';
import { bodyPlainText, outlineBody } from '../../shared/writeup/markdown';
import {
  writeupFindings,
  type WriteupFinding,
  type WriteupFindings,
} from '../../shared/writeup/findings';
import { cautionMentions, type CheckedCautionKind } from '../../shared/writeup/cautions';
import { userRef } from './documents';

type Content = Record<string, unknown>;

/** Reads stored content as a write-up, filling defaults; null when it does not fit at all. */
export function asWriteup(content: Content): WriteupContent | null {
  const parsed = writeupContentSchema.safeParse(content ?? {});
  return parsed.success ? parsed.data : null;
}

/** How much of the body a summary reads: a line of 160 characters never needs more. */
const SUMMARY_SOURCE_CHARS = 4_000;

/** Everything a search index needs of a write-up: body text, captions, markings, wire run. */
export function writeupSearchText(content: Content): string {
  const w = asWriteup(content);
  if (!w) return '';
  const parts = [w.summary ?? '', bodyPlainText(w.body)];
  for (const img of w.images) {
    parts.push(img.caption);
    for (const a of img.annotations) if ('text' in a && a.text) parts.push(a.text);
  }
  for (const wire of w.wireRun?.wires ?? [])
    parts.push(wire.role, wire.from, wire.to, wire.color, wire.size);
  for (const item of w.parts?.items ?? []) parts.push(item.name);
  return parts.filter(Boolean).join(' ').replace(/\s+/g, ' ').trim();
}

/** One line for lists and search results when the author wrote no summary. */
export function writeupSummary(title: string, content: Content): string {
  const w = asWriteup(content);
  if (w?.summary?.trim()) return w.summary.trim();
  const text = w ? bodyPlainText(w.body.slice(0, SUMMARY_SOURCE_CHARS)) : '';
  if (!text) return title;
  return text.length > 160 ? `${text.slice(0, 157).trimEnd()}…` : text;
}

/** The cautions a write-up's page needs: what its text and wire run mention. */
export function writeupCautionsNeeded(content: Content): CheckedCautionKind[] {
  const w = asWriteup(content);
  return w ? cautionMentions(w).map((m) => m.kind) : [];
}

/**
 * All findings of a write-up: the shared ones (cautions, image references, wire run,
 * parts) and the server's: every image is stored and ready, and every `[[sheet:…]]`
 * names a published connector or adapter sheet.
 */
export async function writeupServerFindings(
  _ctx: AppContext,
  content: Content,
): Promise<WriteupFindings> {
  const w = asWriteup(content);
  if (!w) {
    return {
      ok: false,
      errors: [
        {
          code: 'CONTENT_INVALID',
          severity: 'error',
          message:
            'This write-up was saved in a shape the editor no longer reads. Open it in the editor and save it again.',
        },
      ],
      warnings: [],
      cautions: [],
      summary: {
        images: 0,
        markings: 0,
        placedImages: 0,
        wires: 0,
        splices: 0,
        partOptions: 0,
        cautionBlocks: 0,
      },
    };
  }
  const outline = outlineBody(w.body);
  const findings = writeupFindings(w, outline);
  const extra: WriteupFinding[] = [];

  const ids = [...new Set(w.images.map((i) => i.uploadId))];
  if (ids.length) {
    const stored = await Upload.findAll({
      where: { publicId: ids },
      attributes: ['publicId', 'status'],
    });
    const ready = new Set(stored.filter((u) => u.status === 'ready').map((u) => u.publicId));
    w.images.forEach((img, i) => {
      if (!ready.has(img.uploadId))
        findings.errors.push({
          code: 'IMAGE_MISSING',
          severity: 'error',
          field: 'images',
          image: i,
          message: `Image ${i + 1} is not stored (it may have failed to upload). Remove it and upload it again.`,
        });
    });
  }

  const slugs = [...new Set(outline.sheets.map((s) => s.slug))];
  if (slugs.length) {
    const docs = await Document.findAll({
      where: {
        [Op.or]: [{ slug: slugs }, { id: slugs.filter((s) => /^\d{1,12}$/.test(s)).map(Number) }],
      },
      attributes: ['id', 'slug', 'kind', 'publishedRevisionId'],
    });
    const bySlug = new Map<string, Document>();
    for (const d of docs) {
      bySlug.set(d.slug, d);
      bySlug.set(String(d.id), d);
    }
    for (const s of outline.sheets) {
      const d = bySlug.get(s.slug);
      if (!d || !d.publishedRevisionId)
        extra.push({
          code: 'SHEET_LINK_UNKNOWN',
          severity: 'warning',
          field: 'body',
          line: s.line,
          message: `Line ${s.line} links the sheet "${s.slug}", but no published sheet has that address. Check the spelling, or wait until that sheet is published.`,
        });
      else if (d.kind === 'writeup')
        extra.push({
          code: 'SHEET_LINK_WRITEUP',
          severity: 'warning',
          field: 'body',
          line: s.line,
          message: `Line ${s.line}: "${s.slug}" is a write-up, not a sheet. Link it as [words](/documents/${d.slug}) instead.`,
        });
    }
  }
  findings.warnings.push(...extra);
  findings.ok = findings.errors.length === 0;
  return findings;
}

/**
 * Whether an upload appears in a published write-up by the same person who uploaded it.
 * Only the uploader's own write-ups count, so nobody can make someone else's image
 * public by naming its id; an image the next revision removes stops being public once
 * that revision is published.
 */
export async function inPublishedWriteup(
  upload: Pick<Upload, 'publicId' | 'ownerId'>,
): Promise<boolean> {
  if (!/^[0-9a-f-]{36}$/.test(upload.publicId)) return false;
  const rev = await Revision.findOne({
    attributes: ['id'],
    where: {
      kind: 'writeup',
      status: 'published',
      authorId: upload.ownerId,
      [Op.and]: [where(col('content'), Op.like, `%"uploadId":"${upload.publicId}"%`)],
    },
  });
  return rev !== null;
}

/** A published write-up in lists. */
export interface WriteupListItem {
  id: number;
  slug: string;
  title: string;
  summary: string;
  owner: { id: number; displayName: string } | null;
  publishedAt: Date | null;
  images: number;
  thumbUrl: string | null;
  hasWireRun: boolean;
  hasParts: boolean;
}

/** Published write-ups, most recently published first. */
export async function listPublishedWriteups(opts: { limit?: number; offset?: number } = {}) {
  const limit = Math.min(Math.max(opts.limit ?? 50, 1), 100);
  const offset = Math.max(opts.offset ?? 0, 0);
  // One revision per document is 'published' (a unique index): the one readers see.
  const { rows, count } = await Revision.findAndCountAll({
    where: { kind: 'writeup', status: 'published' },
    include: [
      {
        model: Document,
        as: 'document',
        attributes: ['id', 'slug', 'ownerId'],
        include: [{ model: User, as: 'owner', attributes: ['id', 'displayName'] }],
      },
    ],
    order: [
      ['publishedAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit,
    offset,
  });
  const items: WriteupListItem[] = rows.flatMap((rev) => {
    const d = (rev as Revision & { document?: Document & { owner?: User } }).document;
    if (!d) return [];
    const w = asWriteup(rev.content);
    const first = w?.images[0];
    return [
      {
        id: d.id,
        slug: d.slug,
        title: rev.title,
        summary: writeupSummary(rev.title, rev.content),
        owner: userRef(d.owner),
        publishedAt: rev.publishedAt,
        images: w?.images.length ?? 0,
        thumbUrl: first ? `/api/uploads/${first.uploadId}/thumb` : null,
        hasWireRun: !!w?.wireRun?.wires.length,
        hasParts: !!w?.parts?.items.length,
      },
    ];
  });
  return { total: count, items };
}
