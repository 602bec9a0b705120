import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';

export function healthRoutes(ctx: AppContext) {
  const r = Router();
  r.get('/health', allow('anyone'), (_req, res) => {
    res.json({ ok: true });
  });
  r.get('/meta', allow('anyone'), (_req, res) => {
    res.json({ env: ctx.config.env, devMail: !!ctx.fakeSmtp });
  });
  return r;
}
