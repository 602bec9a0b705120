import type { NextFunction, Request, RequestHandler, Response, Router } from 'express';
import { forbidden, HttpError, unauthenticated } from '../errors';
import type { Role } from '../models/User';

/**
 * Who may call a route. Deny by default: every route states one of these as its first
 * handler, and a test fails for any route that does not.
 * - anyone: readers without an account too
 * - signedIn: any account, verified or not
 * - verified: a member (or above) whose e-mail address is verified
 * - moderator / admin: that role or above
 * - dev: development and test only (404 in production)
 */
export type Access = 'anyone' | 'signedIn' | 'verified' | 'moderator' | 'admin' | 'dev';

const RANK: Record<Role, number> = { member: 1, moderator: 2, admin: 3 };

export const ACCESS_MARK = Symbol('access');
export type MarkedHandler = RequestHandler & { [ACCESS_MARK]?: Access };

/** True when a user of `role` holds at least `needed`. */
export function hasRole(role: Role | undefined, needed: Role): boolean {
  return !!role && RANK[role] >= RANK[needed];
}

/** The first handler of every route: states and enforces who may call it. */
export function allow(access: Access, opts: { production?: boolean } = {}): MarkedHandler {
  const handler: MarkedHandler = (req: Request, _res: Response, next: NextFunction) => {
    if (access === 'anyone') return next();
    if (access === 'dev') {
      if (opts.production)
        return next(new HttpError(404, 'NOT_FOUND', 'Nothing was found at this address.'));
      return next();
    }
    const user = req.user;
    if (!user) return next(unauthenticated());
    if (access === 'signedIn') return next();
    if (access === 'verified') {
      if (!user.emailVerified)
        return next(
          new HttpError(
            403,
            'EMAIL_UNVERIFIED',
            'Please verify your e-mail address first: open the link we sent you, or ask for a new one on your account page.',
          ),
        );
      return next();
    }
    if (!hasRole(user.role, access)) return next(forbidden(`Only a ${access} can do this.`));
    next();
  };
  handler[ACCESS_MARK] = access;
  return handler;
}

export const MOUNT_PATH = Symbol('mountPath');

/** Mounts a router and remembers its prefix, so tests can list every route with its full path. */
export function mount(parent: Router, prefix: string, child: Router) {
  (child as unknown as Record<symbol, string>)[MOUNT_PATH] = prefix;
  parent.use(prefix, child);
}

export interface RouteInfo {
  method: string;
  path: string;
  access: Access | undefined;
}

interface Layer {
  route?: {
    path: string;
    methods: Record<string, boolean>;
    stack: Array<{ handle: MarkedHandler }>;
  };
  handle: { stack?: Layer[] } & Record<symbol, unknown>;
}

/** Every route of an app with the access its first handler declares. */
export function listRoutes(router: { stack: Layer[] }, prefix = ''): RouteInfo[] {
  const out: RouteInfo[] = [];
  for (const layer of router.stack) {
    if (layer.route) {
      const first = layer.route.stack[0]?.handle;
      for (const method of Object.keys(layer.route.methods)) {
        out.push({
          method: method.toUpperCase(),
          path: layer.route.path === '/' && prefix ? prefix : prefix + layer.route.path,
          access: first?.[ACCESS_MARK],
        });
      }
    } else if (layer.handle?.stack) {
      const sub = layer.handle[MOUNT_PATH] as string | undefined;
      out.push(
        ...listRoutes(layer.handle as { stack: Layer[] }, prefix + (sub && sub !== '/' ? sub : '')),
      );
    }
  }
  return out;
}
