import express, { Router } from 'express';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import {
  notificationSettingsSchema,
  oneClickBodySchema,
  readNotificationsSchema,
  unsubscribeQuerySchema,
  unsubscribeSchema,
} from '../../shared/schemas/replies';
import * as notifications from '../services/notifications';
import * as subscriptions from '../services/subscriptions';

/** The bell's notifications. */
export function notificationRoutes() {
  const r = Router();

  r.get('/', allow('signedIn'), async (req, res) => {
    res.json(await notifications.listNotifications(req.user!));
  });

  r.post('/read', allow('signedIn'), async (req, res) => {
    const { ids } = parseWith(readNotificationsSchema, req.body ?? {});
    res.json(await notifications.markRead(req.user!, ids));
  });

  return r;
}

/** The member's e-mail preference and followed threads: mounted on /me. */
export function notificationSettingsRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/notifications', allow('signedIn'), async (req, res) => {
    res.json(await subscriptions.getSettings(req.user!));
  });

  r.put('/notifications', allow('signedIn'), async (req, res) => {
    const { emailMode } = parseWith(notificationSettingsSchema, req.body);
    res.json(await subscriptions.updateSettings(ctx, req.user!, emailMode));
  });

  return r;
}

/**
 * Unsubscribe links, without signing in: the signed token is the permission, so the
 * POST needs no CSRF token. It takes `{token}` as JSON from the confirm page, or the
 * token in the query with the form body `List-Unsubscribe=One-Click` (RFC 8058).
 */
export function unsubscribeRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/', allow('anyone'), async (req, res) => {
    const { token } = parseWith(unsubscribeQuerySchema, req.query);
    res.json(await subscriptions.describeUnsubscribe(ctx, token));
  });

  r.post(
    '/',
    allow('anyone'),
    express.urlencoded({ extended: false, limit: '4kb' }),
    async (req, res) => {
      let token: string;
      if (req.query.token !== undefined) {
        token = parseWith(unsubscribeQuerySchema, req.query).token;
        parseWith(oneClickBodySchema, req.body ?? {});
      } else {
        token = parseWith(unsubscribeSchema, req.body ?? {}).token;
      }
      res.json(await subscriptions.unsubscribe(ctx, token));
    },
  );

  return r;
}
