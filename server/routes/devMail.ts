import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { notFound } from '../errors';

/** The local mailbox of the SMTP fake; absent (404) in production. */
export function devMailRoutes(ctx: AppContext) {
  const r = Router();
  const production = ctx.config.isProduction || !ctx.fakeSmtp;

  r.get('/mail', allow('dev', { production }), async (_req, res) => {
    if (!ctx.fakeSmtp) throw notFound();
    await ctx.outbox.flush();
    res.json(ctx.fakeSmtp.list());
  });

  r.delete('/mail', allow('dev', { production }), (_req, res) => {
    if (!ctx.fakeSmtp) throw notFound();
    ctx.fakeSmtp.clear();
    res.status(204).end();
  });

  return r;
}
