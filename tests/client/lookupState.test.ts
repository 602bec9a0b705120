import { describe, expect, it } from 'vitest';
import { DOCUMENT_KINDS } from '@shared/schemas/document';
import { HOUSINGS } from '@shared/schemas/connector';
import { SEARCH_PARAMS, SEARCH_SORTS } from '@shared/schemas/search';
import {
  FILTER_KEYS,
  activeFilters,
  apiParams,
  isAsking,
  queryFromState,
  stateFromQuery,
} from '@/components/search/lookupState';

describe('the lookup state in the URL', () => {
  it('reads every filter, and writes the same query back', () => {
    const query = {
      q: 'coolant sensor',
      kind: 'connector',
      cavities: '3',
      component: 'coolant temperature sensor',
      sealed: 'true',
      housing: 'socket',
      color: 'gn/ye',
      role: 'signal',
      tag: 'Quorvane T3 engine',
      sort: 'newest',
      page: '2',
    };
    const state = stateFromQuery(query);
    expect(state).toMatchObject({ cavities: 3, sealed: true, color: 'GN/YE', page: 2 });
    expect(queryFromState(state)).toEqual({ ...query, color: 'GN/YE' });
    expect(apiParams(state)).toMatchObject({ limit: 20, offset: 20, q: 'coolant sensor' });
    expect(activeFilters(state).map((c) => c.label)).toContain('3 cavities');
  });

  it('drops what it cannot read instead of sending it on', () => {
    const state = stateFromQuery({
      kind: 'sheet',
      cavities: 'many',
      sealed: 'maybe',
      color: 'plaid',
      sort: 'random',
      page: '-3',
      cavitiesMin: '9',
      cavitiesMax: '4',
    });
    expect(state).toMatchObject({ kind: undefined, cavities: undefined, sealed: undefined });
    expect(state).toMatchObject({ color: undefined, sort: undefined, page: 1 });
    expect([state.cavitiesMin, state.cavitiesMax]).toEqual([4, 9]);
    expect(isAsking(stateFromQuery({}))).toBe(false);
  });

  it('knows the same kinds, housings, sorts and parameters as the server', () => {
    for (const kind of DOCUMENT_KINDS) expect(stateFromQuery({ kind }).kind).toBe(kind);
    for (const housing of HOUSINGS) expect(stateFromQuery({ housing }).housing).toBe(housing);
    for (const sort of SEARCH_SORTS) expect(stateFromQuery({ sort }).sort).toBe(sort);
    for (const key of FILTER_KEYS) expect(SEARCH_PARAMS).toContain(key);
  });
});
