import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { badRequest } from '../errors';
import { parseAdapterCheckInput } from '../../shared/schemas/adapter';
import { checkAdapterWithLinks } from '../services/adapters';

/**
 * The pin-to-pin check as a service: JSON in, the report out; it changes nothing.
 * Ends that link a published connector sheet (`connectorId`) are checked against the
 * sheet; a link to a sheet that is not published still answers 200, with an
 * END_MISSING error that names the sheet.
 */
export function adapterRoutes(ctx: AppContext) {
  const r = Router();
  r.post('/check', allow('anyone'), async (req, res) => {
    const parsed = parseAdapterCheckInput(req.body);
    if (!parsed.ok) throw badRequest(parsed.message, parsed.issues);
    const { report } = await checkAdapterWithLinks(ctx, parsed.data);
    res.json(report);
  });
  return r;
}
