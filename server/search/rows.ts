/**
 * What the search index holds for one published revision: the text columns of the
 * FTS5 table, the facet row the filters and sorts read, the facet values (colours,
 * roles, tags), the words of the typo vocabulary, and the prepared result card.
 * Pure: no database here, so the publish path, the rebuild and the bulk seed share it.
 */
import type { DocumentKind } from '../../shared/schemas/document';
import type { ConnectorContent } from '../../shared/schemas/connector';
import type { CompactPinMap, SearchCard } from '../../shared/schemas/search';
import { connectorCavityLabels, layoutCavities } from '../../shared/connector/layout';
import { normalizeCavityLabel } from '../../shared/wire/cavities';
import { parseWireColor } from '../../shared/wire/colors';
import { kindOf } from '../services/kinds';
import { fold, normalizeForIndex, vocabularyWords } from './text';

/** The document as the index needs it. */
export interface IndexDoc {
  id: number;
  kind: DocumentKind;
  slug: string;
}

/** The published revision as the index needs it. */
export interface IndexRevision {
  id: number;
  title: string;
  content: Record<string, unknown>;
  publishedAt: Date | string | number | null;
}

export type Facet = 'color' | 'role' | 'tag';

export interface IndexRow {
  documentId: number;
  revisionId: number;
  kind: DocumentKind;
  slug: string;
  title: string;
  summary: string;
  component: string;
  componentKey: string;
  /** Folded title and tags: where the ranking looks for the words. */
  titleKey: string;
  tagsKey: string;
  cavityCount: number | null;
  cavityCountB: number | null;
  sealed: 0 | 1 | null;
  housing: string | null;
  publishedAt: number;
  /** Original text shown in snippets. */
  tagsText: string;
  pinsText: string;
  bodyText: string;
  /** Folded text the short-word LIKE fallback reads. */
  keywords: string;
  words: string[];
  card: string;
  values: Array<[facet: Facet, value: string, label: string]>;
  /** The FTS5 columns, normalised: title, component, tags, pins, body. */
  fts: [string, string, string, string, string];
}

/** The most text of one document the index keeps; longer write-ups are cut. */
const MAX_BODY = 50_000;
const MAX_VOCABULARY_TEXT = 20_000;

const str = (v: unknown) => (typeof v === 'string' ? v.trim() : '');
const list = (v: unknown): unknown[] => (Array.isArray(v) ? v : []);
const obj = (v: unknown): Record<string, unknown> =>
  v && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : {};

function colorCode(raw: string): { code: string; parts: string[] } | null {
  if (!raw) return null;
  const parsed = parseWireColor(raw);
  if (!parsed.ok) return { code: raw, parts: [] };
  return {
    code: parsed.normalized,
    parts: [parsed.base.code, ...(parsed.tracer ? [parsed.tracer.code] : [])],
  };
}

function timeOf(v: IndexRevision['publishedAt']): number {
  if (v === null || v === undefined) return Date.now();
  const t = v instanceof Date ? v.getTime() : typeof v === 'number' ? v : Date.parse(v);
  return Number.isFinite(t) ? t : Date.now();
}

/** Markdown to readable text for snippets: no image or link syntax, no markers. */
function markdownText(md: string): string {
  return md
    .replace(/!\[([^\]]*)\]\([^)]*\)/g, '$1')
    .replace(/\[([^\]]*)\]\([^)]*\)/g, '$1')
    .replace(/<[^>]*>/g, ' ')
    .replace(/^[ \t]*(#{1,6}|>|[-*+]|\d+\.)[ \t]+/gm, '')
    .replace(/[*_`~]+/g, '')
    .replace(/\s+/g, ' ')
    .trim();
}

function joinLine(parts: string[]): string {
  return parts.filter(Boolean).join(', ');
}

class Collector {
  values = new Map<string, [Facet, string, string]>();
  add(facet: Facet, label: string) {
    const l = label.trim();
    if (!l) return;
    const value = facet === 'color' ? l : fold(l).replace(/\s+/g, ' ').trim();
    if (!value) return;
    const key = `${facet}\u0000${value}`;
    if (!this.values.has(key)) this.values.set(key, [facet, value, l.slice(0, 120)]);
  }
  color(raw: string) {
    const c = colorCode(raw);
    if (!c) return '';
    if (c.parts.length) {
      this.add('color', c.code);
      for (const p of c.parts) this.add('color', p);
    }
    return c.code;
  }
}

function compactPinMap(content: ConnectorContent): CompactPinMap | null {
  const layout = layoutCavities(content);
  if (!layout.cells.length) return null;
  const colors = new Map<string, string>();
  for (const p of list(content.pins)) {
    const pin = obj(p);
    const key = normalizeCavityLabel(str(pin.cavity));
    if (!key || colors.has(key)) continue;
    const raw = str(pin.color);
    const parsed = raw ? parseWireColor(raw) : null;
    colors.set(key, parsed?.ok ? parsed.normalized : '');
  }
  return {
    rows: layout.rows,
    cols: layout.cols,
    view: layout.view,
    housing: content.housing === 'pin' || content.housing === 'socket' ? content.housing : null,
    cells: layout.cells.map((c) => [
      c.label,
      c.row,
      c.col,
      colors.get(normalizeCavityLabel(c.label)) ?? '',
    ]),
  };
}

function endCavities(end: Record<string, unknown>): number | null {
  const listed = list(end.cavities).length;
  if (listed) return listed;
  return typeof end.cavityCount === 'number' && end.cavityCount > 0 ? end.cavityCount : null;
}

/** Builds everything the index stores for `revision`, the published revision of `doc`. */
export function buildIndexRow(doc: IndexDoc, revision: IndexRevision): IndexRow {
  const content = obj(revision.content);
  const title = str(revision.title) || 'Untitled';
  const summary = kindOf(doc.kind).summary(title, content).slice(0, 500);
  const facets = new Collector();
  let component = '';
  let tags: string[] = [];
  let cavityCount: number | null = null;
  let cavityCountB: number | null = null;
  let sealed: 0 | 1 | null = null;
  let housing: string | null = null;
  let pinMap: CompactPinMap | null = null;
  let ends: SearchCard['ends'];
  const pinLines: string[] = [];
  const keywordParts: string[] = [];
  const vocabularyParts: string[] = [title, summary];
  let body: string;

  if (doc.kind === 'connector') {
    const c = content as ConnectorContent;
    component = str(c.component);
    tags = list(c.tags).map(str).filter(Boolean);
    cavityCount = connectorCavityLabels(c).length || null;
    sealed = c.sealed === true ? 1 : c.sealed === false ? 0 : null;
    housing = c.housing === 'pin' || c.housing === 'socket' ? c.housing : null;
    pinMap = compactPinMap(c);
    for (const p of list(c.pins)) {
      const pin = obj(p);
      const role = str(pin.role);
      const code = facets.color(str(pin.color));
      const circuit = str(pin.circuit);
      if (role) facets.add('role', role);
      const line = joinLine([
        role,
        code,
        str(pin.size),
        circuit ? `circuit ${circuit}` : '',
        str(pin.note),
      ]);
      if (line) pinLines.push(`${str(pin.cavity) || '?'}: ${line}`);
      keywordParts.push(role, code, circuit);
      vocabularyParts.push(role);
    }
    const wire = obj(c.wireSize);
    body = [
      summary,
      str(c.notes),
      str(c.terminalSize) ? `terminal ${str(c.terminalSize)}` : '',
      str(wire.min) || str(wire.max) ? `wire ${str(wire.min)} to ${str(wire.max)}` : '',
    ]
      .filter(Boolean)
      .join(' · ');
  } else if (doc.kind === 'adapter') {
    const e = obj(content.ends);
    const a = obj(e.A);
    const b = obj(e.B);
    cavityCount = endCavities(a);
    cavityCountB = endCavities(b);
    ends = {
      A: { label: str(a.label), cavities: cavityCount },
      B: { label: str(b.label), cavities: cavityCountB },
    };
    for (const end of [a, b])
      for (const role of Object.values(obj(end.roles)))
        if (str(role)) facets.add('role', str(role));
    for (const raw of list(content.circuits)) {
      const ci = obj(raw);
      const role = str(ci.role);
      const code = facets.color(str(ci.color));
      if (role) facets.add('role', role);
      const from = list(ci.a).map(String).join('+');
      const to = list(ci.b).map(String).join('+');
      const line = joinLine([
        role,
        code,
        typeof ci.size === 'string' || typeof ci.size === 'number' ? String(ci.size) : '',
        str(ci.termination),
        str(ci.note),
      ]);
      pinLines.push(`A${from || '–'} → B${to || '–'}: ${line}`);
      keywordParts.push(role, code);
      vocabularyParts.push(role);
    }
    component = '';
    body = [summary, str(a.label), str(b.label)].filter(Boolean).join(' · ');
    keywordParts.push(str(a.label), str(b.label));
    vocabularyParts.push(str(a.label), str(b.label));
  } else {
    body = [summary, markdownText(str(content.body))].filter(Boolean).join(' · ');
    vocabularyParts.push(body.slice(0, MAX_VOCABULARY_TEXT));
  }
  body = body.slice(0, MAX_BODY);
  for (const t of tags) facets.add('tag', t);
  const tagsText = tags.join(' · ');
  const pinsText = pinLines.join(' · ').slice(0, MAX_BODY);
  vocabularyParts.push(component, ...tags);

  const publishedAt = timeOf(revision.publishedAt);
  const card: SearchCard = {
    cavityCount,
    component,
    tags,
    sealed: sealed === null ? null : sealed === 1,
    housing: (housing as SearchCard['housing']) ?? null,
    reviewedAt: new Date(publishedAt).toISOString(),
    pinMap,
    ...(ends ? { ends } : {}),
  };

  return {
    documentId: doc.id,
    revisionId: revision.id,
    kind: doc.kind,
    slug: doc.slug,
    title,
    summary,
    component,
    componentKey: fold(component).replace(/\s+/g, ' ').trim(),
    titleKey: fold(title),
    tagsKey: fold(tags.join(' | ')),
    cavityCount,
    cavityCountB,
    sealed,
    housing,
    publishedAt,
    tagsText,
    pinsText,
    bodyText: body,
    keywords: fold([title, component, tagsText, ...keywordParts].filter(Boolean).join(' | ')),
    words: [...new Set(vocabularyWords(vocabularyParts.join(' ')))],
    card: JSON.stringify(card),
    values: [...facets.values.values()],
    fts: [
      normalizeForIndex(title),
      normalizeForIndex(component),
      normalizeForIndex(tags.join(' | ')),
      normalizeForIndex(pinsText),
      normalizeForIndex(body),
    ],
  };
}
