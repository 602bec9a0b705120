/**
 * The lookup page's state and its URL: every filter, the words, the sort and the page
 * live in the query string, so a search can be shared and the back button restores it.
 * Values the page cannot read are dropped rather than sent on to the server.
 */
import type { LocationQuery, LocationQueryRaw } from 'vue-router';
import type { DocumentKind } from '@shared/schemas/document';
import type { Housing } from '@shared/schemas/connector';
import type { SearchSort } from '@shared/schemas/search';
import { describeWireColor, parseWireColor } from '@shared/wire/colors';
import type { SearchParams } from '@/api/search';

// Spelled out here rather than imported: the shared schema modules bring zod with them,
// and the reader's first load has no use for it.
const DOCUMENT_KINDS: readonly DocumentKind[] = ['connector', 'adapter', 'writeup'];
const HOUSINGS: readonly Housing[] = ['pin', 'socket'];
const SEARCH_SORTS: readonly SearchSort[] = ['relevance', 'newest', 'cavities'];

export const PAGE_SIZE = 20;

export interface LookupState {
  q: string;
  kind?: DocumentKind;
  cavities?: number;
  cavitiesMin?: number;
  cavitiesMax?: number;
  component?: string;
  sealed?: boolean;
  housing?: 'pin' | 'socket';
  color?: string;
  role?: string;
  tag?: string;
  sort?: SearchSort;
  page: number;
}

/** The filters, in the order the chips show them. */
export const FILTER_KEYS = [
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
] as const;
export type FilterKey = (typeof FILTER_KEYS)[number];

function one(v: LocationQuery[string]): string {
  const s = Array.isArray(v) ? v[0] : v;
  return typeof s === 'string' ? s.trim() : '';
}

function count(v: LocationQuery[string], min: number): number | undefined {
  const s = one(v);
  if (!/^\d{1,3}$/.test(s)) return undefined;
  const n = Number(s);
  return n >= min && n <= 400 ? n : undefined;
}

function pick<T extends string>(v: LocationQuery[string], values: readonly T[]): T | undefined {
  const s = one(v).toLowerCase();
  return (values as readonly string[]).includes(s) ? (s as T) : undefined;
}

const text = (v: LocationQuery[string], max: number) => one(v).slice(0, max) || undefined;

/** Reads the lookup state from a route's query. */
export function stateFromQuery(query: LocationQuery): LookupState {
  const sealed = one(query.sealed);
  const color = one(query.color);
  const parsedColor = color ? parseWireColor(color) : null;
  let cavitiesMin = count(query.cavitiesMin, 0);
  let cavitiesMax = count(query.cavitiesMax, 0);
  if (cavitiesMin !== undefined && cavitiesMax !== undefined && cavitiesMin > cavitiesMax)
    [cavitiesMin, cavitiesMax] = [cavitiesMax, cavitiesMin];
  const page = count(query.page, 1);
  return {
    q: one(query.q).slice(0, 200),
    kind: pick(query.kind, DOCUMENT_KINDS),
    cavities: count(query.cavities, 1),
    cavitiesMin,
    cavitiesMax,
    component: text(query.component, 120),
    sealed: sealed === 'true' ? true : sealed === 'false' ? false : undefined,
    housing: pick(query.housing, HOUSINGS),
    color: parsedColor?.ok ? parsedColor.normalized : undefined,
    role: text(query.role, 80),
    tag: text(query.tag, 60),
    sort: pick(query.sort, SEARCH_SORTS),
    page: page && page <= 500 ? page : 1,
  };
}

/** The query string for a state, leaving out what is unset (page 1 included). */
export function queryFromState(state: LookupState): LocationQueryRaw {
  const out: Record<string, string> = {};
  if (state.q.trim()) out.q = state.q.trim();
  for (const k of FILTER_KEYS) {
    const v = state[k];
    if (v !== undefined && v !== '') out[k] = String(v);
  }
  if (state.sort) out.sort = state.sort;
  if (state.page > 1) out.page = String(state.page);
  return out;
}

/** The API parameters for a state. */
export function apiParams(state: LookupState): SearchParams {
  const params: SearchParams = { limit: PAGE_SIZE, offset: (state.page - 1) * PAGE_SIZE };
  if (state.q.trim()) params.q = state.q.trim();
  for (const k of FILTER_KEYS) {
    const v = state[k];
    if (v !== undefined && v !== '') (params as Record<string, unknown>)[k] = v;
  }
  if (state.sort) params.sort = state.sort;
  return params;
}

/** True when the state asks for anything (words or a filter). */
export function isAsking(state: LookupState): boolean {
  return !!state.q.trim() || FILTER_KEYS.some((k) => state[k] !== undefined);
}

export const KIND_WORDS: Record<DocumentKind, string> = {
  connector: 'Connector sheets',
  adapter: 'Adapter sheets',
  writeup: 'Write-ups',
};

/** A colour filter in words: "GN/YE (green with a yellow tracer)". */
export function colorWords(code: string): string {
  const parsed = parseWireColor(code);
  return parsed.ok
    ? `${parsed.normalized} (${describeWireColor(parsed.base, parsed.tracer)})`
    : code;
}

/** The active filters as chips: what each says, and which keys removing it clears. */
export function activeFilters(
  state: LookupState,
): Array<{ key: FilterKey; label: string; clears: FilterKey[] }> {
  const chips: Array<{ key: FilterKey; label: string; clears: FilterKey[] }> = [];
  if (state.kind) chips.push({ key: 'kind', label: KIND_WORDS[state.kind], clears: ['kind'] });
  if (state.cavities !== undefined)
    chips.push({
      key: 'cavities',
      label: `${state.cavities} ${state.cavities === 1 ? 'cavity' : 'cavities'}`,
      clears: ['cavities'],
    });
  if (state.cavitiesMin !== undefined || state.cavitiesMax !== undefined) {
    const lo = state.cavitiesMin;
    const hi = state.cavitiesMax;
    const label =
      lo !== undefined && hi !== undefined
        ? `${lo}–${hi} cavities`
        : lo !== undefined
          ? `${lo} or more cavities`
          : `up to ${hi} cavities`;
    chips.push({ key: 'cavitiesMin', label, clears: ['cavitiesMin', 'cavitiesMax'] });
  }
  if (state.component)
    chips.push({ key: 'component', label: state.component, clears: ['component'] });
  if (state.sealed !== undefined)
    chips.push({ key: 'sealed', label: state.sealed ? 'Sealed' : 'Unsealed', clears: ['sealed'] });
  if (state.housing)
    chips.push({ key: 'housing', label: `${state.housing} housing`, clears: ['housing'] });
  if (state.color)
    chips.push({ key: 'color', label: `wire ${colorWords(state.color)}`, clears: ['color'] });
  if (state.role) chips.push({ key: 'role', label: `role: ${state.role}`, clears: ['role'] });
  if (state.tag) chips.push({ key: 'tag', label: state.tag, clears: ['tag'] });
  return chips;
}
