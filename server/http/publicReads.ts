import type { NextFunction, Request, Response } from 'express';
import type { AppContext } from '../context';
import type { Prepared } from './prepared';
import { parseQuery } from './query';
import { addressHoldsNul } from './nul';
import { SEARCH_PARAMS, searchQuerySchema } from '../../shared/schemas/search';
import { searchPrepared } from '../services/search';
import { publishedView } from '../services/publicViews';

const SHEET = /^\/api\/documents\/([^/]+)$/;

/**
 * The two reads readers make most — a search and a published sheet — answered for a
 * reader without a session straight from the prepared answers, ahead of the request log,
 * the body parser, the session and the router. The security headers are already set
 * (this runs after helmet); the answer, its ETag and 304 are exactly those of the routes.
 * Anything else, and any answer that is not a 200 (a 404, a bad parameter, a busy
 * database), falls through to the routes, which answer and log it as usual.
 */
export function cachedPublicReads(ctx: AppContext, sessionCookie: string) {
  return async (req: Request, res: Response, next: NextFunction) => {
    if (!ctx.config.answerCache || (req.method !== 'GET' && req.method !== 'HEAD')) return next();
    if (req.headers.cookie?.includes(`${sessionCookie}=`) || addressHoldsNul(req.url))
      return next();
    let answer: Prepared | undefined;
    try {
      if (req.path === '/api/search') {
        answer = await searchPrepared(ctx, parseQuery(searchQuerySchema, req.query, SEARCH_PARAMS));
      } else {
        const m = SHEET.exec(req.path);
        if (!m || Object.keys(req.query as object).length) return next();
        const idOrSlug = decodeURIComponent(m[1]);
        answer = await publishedView(ctx, idOrSlug);
      }
    } catch {
      return next();
    }
    if (!answer) return next();
    res.setHeader('ETag', answer.etag);
    const sent = req.headers['if-none-match'];
    if (sent && sent.split(',').some((tag) => tag.trim() === answer.etag)) {
      res.statusCode = 304;
      res.end();
      return;
    }
    res.statusCode = 200;
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    res.setHeader('Content-Length', Buffer.byteLength(answer.json));
    res.end(req.method === 'HEAD' ? undefined : answer.json);
  };
}
