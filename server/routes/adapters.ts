import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { badRequest } from '../errors';
import { parseAdapterCheckInput } from '../../shared/schemas/adapter';
import { checkParsedAdapter } from '../../shared/check';
import { resolveLinkedEnds } from '../services/adapters';

/** The pin-to-pin check as a service: JSON in, the report out; it changes nothing. */
export function adapterRoutes(ctx: AppContext) {
  const r = Router();
  r.post('/check', allow('anyone'), async (req, res) => {
    const parsed = parseAdapterCheckInput(req.body);
    if (!parsed.ok) throw badRequest(parsed.message, parsed.issues);
    const input = await resolveLinkedEnds(ctx, parsed.data);
    res.json(checkParsedAdapter(input));
  });
  return r;
}
