import { Router } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { updateRoleSchema } from '../../shared/schemas/auth';
import { changeRole, listUsers } from '../services/admin';
import { listAudit } from '../services/audit';

const idParam = z.coerce.number().int().positive();
const pageQuery = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
});

export function adminRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/users', allow('admin'), async (_req, res) => {
    res.json(await listUsers());
  });

  r.patch('/users/:id', allow('admin'), async (req, res) => {
    const id = parseWith(idParam, req.params.id);
    const { role } = parseWith(updateRoleSchema, req.body);
    const user = await changeRole(ctx, req.user!.id, id, role);
    res.json({ user: { ...user.toPublic(), createdAt: user.createdAt } });
  });

  r.get('/audit', allow('admin'), async (req, res) => {
    const { limit, offset } = parseWith(pageQuery, req.query);
    res.json(await listAudit(limit, offset));
  });

  return r;
}
