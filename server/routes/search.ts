import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseQuery } from '../http/query';
import { sendPrepared } from '../http/prepared';
import { SEARCH_PARAMS, searchQuerySchema, suggestQuerySchema } from '../../shared/schemas/search';
import * as search from '../services/search';

/** `GET /api/search` and its as-you-type suggestions. */
export function searchRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/', allow('anyone'), async (req, res) => {
    const query = parseQuery(searchQuerySchema, req.query, SEARCH_PARAMS);
    sendPrepared(res, await search.searchPrepared(ctx, query));
  });

  r.get('/suggest', allow('anyone'), async (req, res) => {
    const { q } = parseQuery(suggestQuerySchema, req.query, ['q']);
    res.json(await search.suggest(ctx, q));
  });

  return r;
}

/** `GET /api/browse`: components, cavity counts and tags with how many documents carry each. */
export function browseRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/', allow('anyone'), async (_req, res) => {
    res.json(await search.browse(ctx));
  });
  return r;
}
