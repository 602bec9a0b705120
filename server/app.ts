import fs from 'node:fs';
import path from 'node:path';
import express, { type ErrorRequestHandler, type Express } from 'express';
import helmet from 'helmet';
import session from 'express-session';
import passport from 'passport';
import { pinoHttp } from 'pino-http';
import type { AppContext } from './context';
import { HttpError } from './errors';
import { isBusyError } from './db/sequelize';
import { csrfProtection } from './http/csrf';
import { refuseNul } from './http/nul';
import { cachedPublicReads } from './http/publicReads';
import { mount } from './http/access';
import { configurePassport } from './auth/passport';
import { apiRoutes, CSRF_EXEMPT } from './routes';

export const SESSION_COOKIE = 'lw.sid';
/** API paths (below /api) whose GETs read published data only and never touch a session. */
const PUBLIC_READS = ['/search', '/browse', '/documents/'];
const CLIENT_DIR = path.resolve(import.meta.dirname, '..', 'dist');

/** Builds the Express app on a ready context, without listening. */
export function createApp(ctx: AppContext, opts: { clientDir?: string } = {}): Express {
  const { config, logger } = ctx;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.isProduction ? 1 : false);
  app.set('query parser', 'simple');

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"],
          frameSrc: ["'self'"],
          objectSrc: ["'none'"],
          baseUri: ["'none'"],
          frameAncestors: ["'none'"],
          formAction: ["'self'"],
          ...(config.isProduction ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.isProduction
        ? { maxAge: 31536000, includeSubDomains: true }
        : false,
      referrerPolicy: { policy: 'strict-origin-when-cross-origin' },
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use(cachedPublicReads(ctx, SESSION_COOKIE));
  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => req.url === '/api/health' },
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({
          id: req.id,
          method: req.method,
          url: req.url,
        }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
    }),
  );

  const api = express.Router();
  api.use(express.json({ limit: '1mb', strict: false }));
  api.use(refuseNul());
  // A reader without a session cookie has no session to find, and public reads never
  // start one: they skip the session, passport and their per-request hashing.
  const anonymousRead = (req: express.Request) =>
    (req.method === 'GET' || req.method === 'HEAD') &&
    !req.headers.cookie?.includes(`${SESSION_COOKIE}=`) &&
    PUBLIC_READS.some((prefix) => req.path.startsWith(prefix));
  const unlessAnonymousRead =
    (mw: express.RequestHandler): express.RequestHandler =>
    (req, res, next) =>
      anonymousRead(req) ? next() : mw(req, res, next);
  api.use(
    unlessAnonymousRead(
      session({
        name: SESSION_COOKIE,
        secret: config.sessionSecret ?? 'unset',
        store: ctx.sessionStore,
        resave: false,
        saveUninitialized: false,
        rolling: true,
        cookie: {
          httpOnly: true,
          sameSite: 'lax',
          secure: config.isProduction,
          maxAge: config.session.idleMs,
        },
      }),
    ),
  );
  configurePassport();
  api.use(unlessAnonymousRead(passport.initialize()));
  api.use(unlessAnonymousRead(passport.session()));
  api.use(csrfProtection(CSRF_EXEMPT));
  apiRoutes(ctx, api);
  api.use((req, _res, next) => {
    next(
      new HttpError(
        404,
        'NOT_FOUND',
        `There is no API route ${req.method} ${req.baseUrl}${req.path}.`,
      ),
    );
  });
  mount(app, '/api', api);

  const clientDir = opts.clientDir ?? CLIENT_DIR;
  const indexHtml = path.join(clientDir, 'index.html');
  app.use(express.static(clientDir, { index: false, maxAge: '1h', immutable: false }));
  app.get('/{*splat}', (_req, res) => {
    if (!fs.existsSync(indexHtml)) {
      res
        .status(503)
        .type('text/plain')
        .send(
          'The client has not been built yet. Run "npm run build" (npm start does it for you).',
        );
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.sendFile(indexHtml);
  });

  app.use(errorHandler(ctx));
  return app;
}

function errorHandler(ctx: AppContext): ErrorRequestHandler {
  return (err, req, res, _next) => {
    void _next;
    let status = 500;
    let code = 'INTERNAL';
    let message =
      'Something went wrong on our side. Please try again; if it keeps happening, tell an admin.';
    let details: unknown;
    const e = err as {
      type?: string;
      status?: number;
      name?: string;
      errors?: Array<{ message: string; path?: string }>;
    };
    if (err instanceof HttpError) {
      ({ status, code, message, details } = err);
    } else if (e?.type === 'entity.parse.failed') {
      status = 400;
      code = 'BAD_JSON';
      message = 'The request body is not valid JSON.';
    } else if (e?.type === 'entity.too.large') {
      status = 413;
      code = 'TOO_LARGE';
      message = 'The request body is too large: send at most 1 MB.';
    } else if (e?.type === 'charset.unsupported' || e?.type === 'encoding.unsupported') {
      status = 415;
      code = 'UNSUPPORTED_ENCODING';
      message = 'The request body must be UTF-8 JSON.';
    } else if (typeof e?.status === 'number' && e.status >= 400 && e.status < 500) {
      status = e.status;
      code = 'BAD_REQUEST';
      message = 'The request could not be read.';
    } else if (isBusyError(err)) {
      status = 503;
      code = 'BUSY';
      message = 'The database is busy right now. Please try again in a moment; nothing was saved.';
      res.setHeader('Retry-After', '2');
    } else if (
      e?.name === 'SequelizeValidationError' ||
      e?.name === 'SequelizeUniqueConstraintError'
    ) {
      status = e.name === 'SequelizeUniqueConstraintError' ? 409 : 400;
      code = status === 409 ? 'CONFLICT' : 'VALIDATION';
      message = e.errors?.[0]?.message ? `${e.errors[0].message}.` : 'The data is not valid.';
    }
    if (status >= 500 && status !== 503) req.log?.error({ err }, 'unhandled error');
    const body: { error: Record<string, unknown> } = { error: { code, message } };
    if (details !== undefined) body.error.details = details;
    if (status >= 500 && ctx.config.env === 'development' && err instanceof Error)
      body.error.stack = err.stack;
    if (!res.headersSent) res.status(status).json(body);
  };
}
