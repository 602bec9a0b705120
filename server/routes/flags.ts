import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { createFlagSchema, flagQuerySchema, resolveFlagSchema } from '../../shared/schemas/replies';
import * as flags from '../services/flags';
import { numericId } from './documents';

/** Flags on documents and replies, and the moderators' flag queue. */
export function flagRoutes(ctx: AppContext) {
  const r = Router();

  r.post('/', allow('signedIn'), async (req, res) => {
    const body = parseWith(createFlagSchema, req.body);
    res.status(201).json(await flags.createFlag(ctx, req.user!, body));
  });

  r.get('/', allow('moderator'), async (req, res) => {
    const { status } = parseWith(flagQuerySchema, req.query);
    res.json(await flags.listFlags(req.user!, status));
  });

  r.post('/:id/resolve', allow('moderator'), async (req, res) => {
    const body = parseWith(resolveFlagSchema, req.body);
    res.json(await flags.resolveFlag(ctx, req.user!, numericId(req.params.id), body));
  });

  return r;
}
