import type { Router } from 'express';
import type { AppContext } from '../context';
import { mount } from '../http/access';
import { healthRoutes } from './health';
import { authRoutes } from './auth';
import { adminRoutes } from './admin';
import { devMailRoutes } from './devMail';
import { documentRoutes } from './documents';
import { reviewRoutes } from './review';
import { meRoutes } from './me';
import { browseRoutes, searchRoutes } from './search';
import { adapterRoutes } from './adapters';
import { connectorRoutes } from './connectors';
import { writeupRoutes } from './writeups';
import { replyRoutes, threadRoutes } from './replies';
import { flagRoutes } from './flags';
import { notificationRoutes, notificationSettingsRoutes, unsubscribeRoutes } from './notifications';
import { adminMailRoutes } from './adminMail';
import { uploadRoutes } from './uploads';

/** Paths (below /api) that change nothing and so need no CSRF token. */
export const CSRF_EXEMPT = ['/unsubscribe', '/adapters/check'];

/** Mounts every resource's router under /api. */
export function apiRoutes(ctx: AppContext, api: Router) {
  mount(api, '/', healthRoutes(ctx));
  mount(api, '/auth', authRoutes(ctx));
  mount(api, '/admin', adminRoutes(ctx));
  mount(api, '/dev', devMailRoutes(ctx));
  mount(api, '/documents', documentRoutes(ctx));
  mount(api, '/review', reviewRoutes(ctx));
  mount(api, '/me', meRoutes());
  mount(api, '/search', searchRoutes(ctx));
  mount(api, '/browse', browseRoutes(ctx));
  mount(api, '/adapters', adapterRoutes(ctx));
  mount(api, '/connectors', connectorRoutes(ctx));
  mount(api, '/writeups', writeupRoutes(ctx));
  // Replies, thread subscriptions, flags and notifications.
  mount(api, '/documents', threadRoutes(ctx));
  mount(api, '/replies', replyRoutes(ctx));
  mount(api, '/flags', flagRoutes(ctx));
  mount(api, '/notifications', notificationRoutes());
  mount(api, '/me', notificationSettingsRoutes(ctx));
  mount(api, '/unsubscribe', unsubscribeRoutes(ctx));
  mount(api, '/admin', adminMailRoutes(ctx));
  mount(api, '/uploads', uploadRoutes(ctx));
}
