import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { writeupListQuerySchema } from '../../shared/schemas/writeup';
import { listPublishedWriteups } from '../services/writeups';

export function writeupRoutes(_ctx: AppContext) {
  const r = Router();

  r.get('/', allow('anyone'), async (req, res) => {
    const { limit, offset } = parseWith(writeupListQuerySchema, req.query);
    res.json(await listPublishedWriteups({ limit: limit || undefined, offset }));
  });

  return r;
}
