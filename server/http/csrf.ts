import crypto from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { HttpError } from '../errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Returns the session's CSRF token, creating one the first time. */
export function csrfToken(req: Request): string {
  if (!req.session.csrfToken) req.session.csrfToken = crypto.randomBytes(24).toString('base64url');
  return req.session.csrfToken;
}

function sameToken(a: string, b: string) {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && crypto.timingSafeEqual(x, y);
}

/**
 * Refuses state-changing requests without the session's token in X-CSRF-Token, and any
 * a browser marks as cross-site. `exempt` lists paths that change nothing.
 */
export function csrfProtection(exempt: string[]) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method) || exempt.includes(req.path)) return next();
    if (req.get('sec-fetch-site') === 'cross-site')
      return next(new HttpError(403, 'CROSS_SITE', 'Requests from other sites are not accepted.'));
    const sent = req.get('x-csrf-token');
    const expected = req.session?.csrfToken;
    if (!sent || !expected || !sameToken(sent, expected))
      return next(
        new HttpError(
          403,
          'CSRF_INVALID',
          'This request is missing its security token or the token is out of date. Reload the page and try again.',
        ),
      );
    next();
  };
}
