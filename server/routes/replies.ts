import { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import {
  createReplySchema,
  editReplySchema,
  hideReplySchema,
  subscriptionSchema,
} from '../../shared/schemas/replies';
import * as replies from '../services/replies';
import * as subscriptions from '../services/subscriptions';
import { numericId } from './documents';

/** The thread under a document: mounted on /documents beside the document routes. */
export function threadRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/:id/replies', allow('anyone'), async (req, res) => {
    res.json(await replies.listReplies(req.user, String(req.params.id)));
  });

  r.post('/:id/replies', allow('verified'), async (req, res) => {
    const body = parseWith(createReplySchema, req.body);
    res.status(201).json(await replies.createReply(ctx, req.user!, String(req.params.id), body));
  });

  r.get('/:id/subscription', allow('signedIn'), async (req, res) => {
    res.json(await subscriptions.getSubscription(req.user!, numericId(req.params.id)));
  });

  r.put('/:id/subscription', allow('signedIn'), async (req, res) => {
    const { subscribed } = parseWith(subscriptionSchema, req.body);
    res.json(
      await subscriptions.updateSubscription(ctx, req.user!, numericId(req.params.id), subscribed),
    );
  });

  return r;
}

/** One reply: edit, delete, hide, answer. */
export function replyRoutes(ctx: AppContext) {
  const r = Router();

  r.patch('/:id', allow('verified'), async (req, res) => {
    const { body } = parseWith(editReplySchema, req.body);
    res.json(await replies.editReply(ctx, req.user!, numericId(req.params.id), body));
  });

  r.delete('/:id', allow('signedIn'), async (req, res) => {
    res.json(await replies.deleteReply(ctx, req.user!, numericId(req.params.id)));
  });

  r.post('/:id/hide', allow('moderator'), async (req, res) => {
    const { reason } = parseWith(hideReplySchema, req.body);
    res.json(await replies.hideReply(ctx, req.user!, numericId(req.params.id), reason));
  });

  r.post('/:id/unhide', allow('moderator'), async (req, res) => {
    res.json(await replies.unhideReply(ctx, req.user!, numericId(req.params.id)));
  });

  r.post('/:id/answer', allow('verified'), async (req, res) => {
    res.json(await replies.markAnswer(ctx, req.user!, numericId(req.params.id)));
  });

  r.delete('/:id/answer', allow('verified'), async (req, res) => {
    res.json(await replies.unmarkAnswer(ctx, req.user!, numericId(req.params.id)));
  });

  return r;
}
