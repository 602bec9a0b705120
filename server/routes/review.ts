import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import {
  declineDecisionSchema,
  publishDecisionSchema,
  returnDecisionSchema,
  reviewQueueQuerySchema,
} from '../../shared/schemas/document';
import * as review from '../services/review';
import { composeReturnNote } from '../../shared/writeup/imageNotes';
import { numericId } from './documents';

export function reviewRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/queue', allow('moderator'), async (req, res) => {
    const { kind } = parseWith(reviewQueueQuerySchema, req.query);
    res.json(await review.listQueue(req.user!, kind));
  });

  r.get('/:revisionId', allow('moderator'), async (req, res) => {
    res.json(await review.getReview(ctx, req.user!, numericId(req.params.revisionId)));
  });

  r.post('/:revisionId/claim', allow('moderator'), async (req, res) => {
    res.json(await review.claim(ctx, req.user!, numericId(req.params.revisionId)));
  });

  r.post('/:revisionId/release', allow('moderator'), async (req, res) => {
    res.json(await review.release(ctx, req.user!, numericId(req.params.revisionId)));
  });

  r.post('/:revisionId/publish', allow('moderator'), async (req, res) => {
    const { note } = parseWith(publishDecisionSchema, req.body ?? {});
    res.json(
      await review.decide(ctx, req.user!, numericId(req.params.revisionId), 'publish', note),
    );
  });

  r.post('/:revisionId/return', allow('moderator'), async (req, res) => {
    const { note, imageNotes } = parseWith(returnDecisionSchema, req.body ?? {});
    const text = composeReturnNote(note, imageNotes);
    res.json(await review.decide(ctx, req.user!, numericId(req.params.revisionId), 'return', text));
  });

  r.post('/:revisionId/decline', allow('moderator'), async (req, res) => {
    const { note } = parseWith(declineDecisionSchema, req.body ?? {});
    res.json(
      await review.decide(ctx, req.user!, numericId(req.params.revisionId), 'decline', note),
    );
  });

  return r;
}
