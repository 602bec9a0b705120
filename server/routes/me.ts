import { Router } from 'express';
import { allow } from '../http/access';
import * as documents from '../services/documents';

/** What belongs to the signed-in account. */
export function meRoutes() {
  const r = Router();

  r.get('/documents', allow('signedIn'), async (req, res) => {
    res.json(await documents.listMine(req.user!));
  });

  return r;
}
