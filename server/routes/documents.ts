import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { notFound } from '../errors';
import {
  createDocumentSchema,
  revisionQuerySchema,
  saveDraftSchemaFor,
  submitSchema,
} from '../../shared/schemas/document';
import * as documents from '../services/documents';
import { publishedView } from '../services/publicViews';
import { sendPrepared } from '../http/prepared';

/** A numeric `:id`; anything else names nothing. */
export function numericId(raw: unknown): number {
  if (typeof raw !== 'string' || !/^\d{1,12}$/.test(raw))
    throw notFound('There is nothing at this address: the id must be a number.');
  return Number(raw);
}

export function documentRoutes(ctx: AppContext) {
  const r = Router();

  r.post('/', allow('verified'), async (req, res) => {
    const body = parseWith(createDocumentSchema, req.body);
    res.status(201).json(await documents.createDocument(ctx, req.user!, body));
  });

  r.get('/:idOrSlug', allow('anyone'), async (req, res) => {
    const { revision } = parseWith(revisionQuerySchema, req.query);
    const idOrSlug = String(req.params.idOrSlug);
    // Without ?revision everyone sees the same published view, so it can be kept.
    if (revision === undefined) {
      const view = await publishedView(ctx, idOrSlug);
      sendPrepared(res, view);
      return;
    }
    res.json(await documents.getDocumentView(ctx, req.user, idOrSlug, revision));
  });

  r.get('/:id/editor', allow('verified'), async (req, res) => {
    res.json(await documents.getEditor(req.user, numericId(req.params.id)));
  });

  r.put('/:id/draft', allow('verified'), async (req, res) => {
    const id = numericId(req.params.id);
    const kind = await documents.ownedDocumentKind(req.user, id);
    const body = parseWith(saveDraftSchemaFor(kind), req.body);
    res.json(await documents.saveDraft(ctx, req.user, id, body));
  });

  r.post('/:id/submit', allow('verified'), async (req, res) => {
    const id = numericId(req.params.id);
    const body = parseWith(submitSchema, req.body ?? {});
    res.json(await documents.submit(ctx, req.user, id, body));
  });

  r.post('/:id/withdraw', allow('verified'), async (req, res) => {
    res.json(await documents.withdraw(ctx, req.user, numericId(req.params.id)));
  });

  r.get('/:id/revisions', allow('signedIn'), async (req, res) => {
    res.json(await documents.listRevisions(req.user, numericId(req.params.id)));
  });

  return r;
}
