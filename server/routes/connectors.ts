import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { findConnectorSheets } from '../services/adapters';

const lookupQuerySchema = z.object({
  q: z
    .string({ error: 'must be text' })
    .max(120, { error: 'must be at most 120 characters' })
    .optional()
    .default(''),
  limit: z.coerce
    .number({ error: 'must be a number' })
    .int({ error: 'must be a whole number' })
    .min(1, { error: 'must be at least 1' })
    .max(20, { error: 'can be at most 20' })
    .optional()
    .default(10),
});

/**
 * The adapter editor's look-up of published connector sheets to link as an end
 * (search as you type). Drafts never appear.
 */
export function connectorRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/', allow('anyone'), async (req, res) => {
    const { q, limit } = parseWith(lookupQuerySchema, req.query);
    res.json({ items: await findConnectorSheets(ctx, q, limit) });
  });
  return r;
}
