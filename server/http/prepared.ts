import crypto from 'node:crypto';
import type { Response } from 'express';

/** An answer serialised once, with its validator, to be sent many times. */
export interface Prepared {
  json: string;
  etag: string;
}

/** Serialises `value` and computes the weak ETag Express would (so a repeat answers 304 alike). */
export function prepare(value: unknown): Prepared {
  const json = JSON.stringify(value);
  const hash = crypto.createHash('sha1').update(json, 'utf8').digest('base64').slice(0, 27);
  return { json, etag: `W/"${Buffer.byteLength(json).toString(16)}-${hash}"` };
}

/** Sends a prepared answer; Express sees the ETag is set and does not hash the body again. */
export function sendPrepared(res: Response, answer: Prepared): void {
  res.set('ETag', answer.etag);
  res.type('application/json').send(answer.json);
}
