import type { NextFunction, Request, Response } from 'express';
import { HttpError } from '../errors';

/** Whether a request address (path and query, as sent) carries a NUL, escaped or raw. */
export function addressHoldsNul(url: string): boolean {
  return /%00|\0/i.test(url);
}

/**
 * Refuses a NUL character (U+0000) anywhere in the address or the JSON body. No text in
 * the product has a use for it, and the SQLite driver ends a statement at the first NUL,
 * so a value carrying one would otherwise fail inside the database instead of being
 * answered. The body is walked without recursion, so deep nesting costs nothing extra.
 */
export function refuseNul() {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (addressHoldsNul(req.url))
      return next(
        new HttpError(
          400,
          'NUL_CHARACTER',
          'The address contains a NUL character (%00). Remove it and try again.',
        ),
      );
    if (req.body !== undefined && req.body !== null && holdsNul(req.body))
      return next(
        new HttpError(
          400,
          'NUL_CHARACTER',
          'The request contains a NUL character (U+0000), which no field accepts. Remove it and send again.',
        ),
      );
    next();
  };
}

function holdsNul(value: unknown): boolean {
  const stack: unknown[] = [value];
  while (stack.length) {
    const v = stack.pop();
    if (typeof v === 'string') {
      if (v.includes('\0')) return true;
    } else if (v && typeof v === 'object') {
      for (const [k, child] of Object.entries(v)) {
        if (k.includes('\0')) return true;
        stack.push(child);
      }
    }
  }
  return false;
}
