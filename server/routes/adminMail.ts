import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { outboxQuerySchema } from '../../shared/schemas/replies';
import { listOutbox, retryOutboxMessage } from '../services/outbox';
import { numericId } from './documents';

/** The outbox for admins: failed and waiting messages, and a retry. Mounted on /admin. */
export function adminMailRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/mail', allow('admin'), async (req, res) => {
    const { status, limit } = parseWith(outboxQuerySchema, req.query);
    res.json(await listOutbox(status, limit));
  });

  r.post('/mail/:id/retry', allow('admin'), async (req, res) => {
    const message = await retryOutboxMessage(numericId(req.params.id), req.user!.id);
    void ctx.outbox.flush();
    res.json({ message });
  });

  return r;
}
