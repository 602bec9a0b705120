/**
 * The search query (`GET /api/search`) and the shapes of its answers, shared by the
 * server, which validates with the schema, and the lookup page, which builds the
 * same parameters from its URL.
 *
 * Query values arrive as text. Each message completes a sentence that starts with
 * the parameter's name ("limit must be at most 100").
 */
import { z } from 'zod';
import { DOCUMENT_KINDS, type DocumentKind } from './document';
import { HOUSINGS, MAX_CONNECTOR_CAVITIES, type ConnectorView, type Housing } from './connector';
import { parseWireColor } from '../wire/colors';

export const SEARCH_SORTS = ['relevance', 'newest', 'cavities'] as const;
export type SearchSort = (typeof SEARCH_SORTS)[number];

export const MAX_SEARCH_LIMIT = 100;
export const DEFAULT_SEARCH_LIMIT = 20;
/** Deep paging past this is refused: nobody reads page 500, and it costs a full sort. */
export const MAX_SEARCH_OFFSET = 10_000;
export const MAX_QUERY_LENGTH = 200;

/** Every parameter the search understands, in the order the docs list them. */
export const SEARCH_PARAMS = [
  'q',
  'kind',
  'cavities',
  'cavitiesMin',
  'cavitiesMax',
  'component',
  'sealed',
  'housing',
  'color',
  'role',
  'tag',
  'sort',
  'limit',
  'offset',
] as const;
export type SearchParam = (typeof SEARCH_PARAMS)[number];

const blank = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? undefined : v);

const count = (min: number, max: number) =>
  z.preprocess(
    blank,
    z.coerce
      .number({ error: 'must be a number' })
      .int({ error: 'must be a whole number' })
      .min(min, { error: `must be at least ${min}` })
      .max(max, { error: `must be at most ${max}` })
      .optional(),
  );

const words = (max: number) =>
  z.preprocess(
    blank,
    z
      .string({ error: 'must be text' })
      .trim()
      .max(max, { error: `must be at most ${max} characters` })
      .optional(),
  );

const choice = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess(
    (v) => (typeof v === 'string' ? blank(v.trim().toLowerCase()) : v),
    z.enum(values, { error: `must be ${values.map((v) => `"${v}"`).join(', ')}` }).optional(),
  );

const TRUE = new Set(['true', 'yes', '1']);
const FALSE = new Set(['false', 'no', '0']);

export const searchQuerySchema = z
  .object({
    q: words(MAX_QUERY_LENGTH),
    kind: choice(DOCUMENT_KINDS),
    cavities: count(1, MAX_CONNECTOR_CAVITIES),
    cavitiesMin: count(0, MAX_CONNECTOR_CAVITIES),
    cavitiesMax: count(0, MAX_CONNECTOR_CAVITIES),
    component: words(120),
    sealed: z.preprocess(
      (v) => {
        if (typeof v !== 'string') return v;
        const s = v.trim().toLowerCase();
        if (!s) return undefined;
        return TRUE.has(s) ? true : FALSE.has(s) ? false : v;
      },
      z.boolean({ error: 'must be "true" or "false"' }).optional(),
    ),
    housing: choice(HOUSINGS),
    color: words(24)
      .transform((v, ctx) => {
        if (v === undefined) return undefined;
        const parsed = parseWireColor(v);
        if (!parsed.ok) {
          ctx.addIssue({
            code: 'custom',
            message: 'must be a wire colour code such as "GN", "GN/YE" or a name such as "green"',
          });
          return z.NEVER;
        }
        return parsed.normalized;
      })
      .optional(),
    role: words(80),
    tag: words(60),
    sort: choice(SEARCH_SORTS),
    limit: count(1, MAX_SEARCH_LIMIT),
    offset: count(0, MAX_SEARCH_OFFSET),
  })
  .superRefine((v, ctx) => {
    if (v.cavitiesMin !== undefined && v.cavitiesMax !== undefined && v.cavitiesMin > v.cavitiesMax)
      ctx.addIssue({
        code: 'custom',
        path: ['cavitiesMax'],
        message: `must not be below cavitiesMin (${v.cavitiesMin})`,
      });
  });

export type SearchQuery = z.infer<typeof searchQuerySchema>;

export const suggestQuerySchema = z.object({ q: words(MAX_QUERY_LENGTH) });

/**
 * A pin map small enough for a result card: the grid, the side it is drawn from, and
 * per cavity `[label, row, col, colour code]` (colour '' when the sheet gives none).
 */
export interface CompactPinMap {
  rows: number;
  cols: number;
  view: ConnectorView | null;
  housing: Housing | null;
  cells: Array<[label: string, row: number, col: number, color: string]>;
}

/** What a result card shows besides the stable fields. */
export interface SearchCard {
  cavityCount: number | null;
  component: string;
  tags: string[];
  sealed: boolean | null;
  housing: Housing | null;
  /** When a moderator published the revision shown. */
  reviewedAt: string;
  pinMap: CompactPinMap | null;
  /** An adapter sheet's two ends. */
  ends?: {
    A: { label: string; cavities: number | null };
    B: { label: string; cavities: number | null };
  };
}

export interface SearchItem extends SearchCard {
  id: number;
  slug: string;
  kind: DocumentKind;
  title: string;
  /**
   * The snippet as HTML: every character escaped except our own `<mark>` tags around
   * the matched words (`snippetParts` in shared/search/snippet.ts shows it without HTML).
   */
  snippet: string;
  /** Match ranges inside the title. */
  titleRanges: Array<[start: number, end: number]>;
}

export interface SearchAnswer {
  total: number;
  items: SearchItem[];
  limit: number;
  offset: number;
  sort: SearchSort;
  /** Set when nothing matched as typed and close spellings did: what was searched instead. */
  corrected: { q: string; words: Array<{ from: string; to: string }> } | null;
}

export interface Suggestion {
  type: 'document' | 'component' | 'tag';
  text: string;
  /** For a document: where it is. */
  slug?: string;
  kind?: DocumentKind;
  cavityCount?: number | null;
  /** For a component or tag: how many published documents carry it. */
  count?: number;
}

export interface BrowseAnswer {
  total: number;
  kinds: Array<{ kind: DocumentKind; count: number }>;
  components: Array<{ name: string; count: number }>;
  cavities: Array<{ cavities: number; count: number }>;
  tags: Array<{ name: string; count: number }>;
}
