import { Router, type Request } from 'express';
import passport from 'passport';
import type { AppContext } from '../context';
import { allow } from '../http/access';
import { parseWith } from '../http/validate';
import { csrfToken } from '../http/csrf';
import { HttpError } from '../errors';
import {
  changePasswordSchema,
  loginSchema,
  passwordResetConfirmSchema,
  passwordResetSchema,
  registerSchema,
  tokenSchema,
  updateMeSchema,
} from '../../shared/schemas/auth';
import * as accounts from '../services/accounts';
import { User } from '../models';

const AUTH_FAILED = 'The e-mail address or password is not right.';

function logIn(req: Request, user: Express.User & { sessionEpoch: number }) {
  return new Promise<void>((resolve, reject) =>
    // passport regenerates the session id here, so a planted id never gains an account.
    req.logIn(user, (err) => (err ? reject(err) : resolve())),
  );
}

export function authRoutes(ctx: AppContext) {
  const r = Router();

  r.get('/csrf', allow('anyone'), (req, res) => {
    res.json({ token: csrfToken(req) });
  });

  r.post('/register', allow('anyone'), async (req, res) => {
    const body = parseWith(registerSchema, req.body);
    const user = await accounts.register(ctx, body);
    void ctx.outbox.flush();
    res.status(201).json({ user: user.toPublic() });
  });

  r.post('/verify', allow('anyone'), async (req, res) => {
    const { token } = parseWith(tokenSchema, req.body);
    const user = await accounts.verifyEmail(ctx, token);
    if (req.user && req.user.id === user.id) req.user.emailVerified = true;
    res.json({ user: user.toPublic() });
  });

  r.post('/verify/resend', allow('signedIn'), async (req, res) => {
    const user = await User.findByPk(req.user!.id);
    if (!user) throw new HttpError(401, 'UNAUTHENTICATED', 'Please sign in first.');
    if (user.emailVerifiedAt)
      throw new HttpError(409, 'ALREADY_VERIFIED', 'Your e-mail address is already verified.');
    await ctx.sequelize.transaction((t) => accounts.sendVerification(ctx, user, t));
    void ctx.outbox.flush();
    res.status(202).json({ ok: true });
  });

  r.post('/login', allow('anyone'), async (req, res) => {
    const { email, password } = parseWith(loginSchema, req.body);
    const ip = req.ip ?? 'unknown';
    await ctx.throttle.check(email, ip);
    const user = await accounts.authenticate(ctx, email, password);
    if (!user) {
      await ctx.throttle.failed(email, ip);
      throw new HttpError(401, 'AUTH_FAILED', AUTH_FAILED);
    }
    await ctx.throttle.succeeded(email);
    await logIn(req, { ...user.toPublic(), sessionEpoch: user.sessionEpoch });
    res.json({ user: user.toPublic(), csrfToken: csrfToken(req) });
  });

  r.post('/logout', allow('signedIn'), async (req, res) => {
    await new Promise<void>((resolve, reject) =>
      req.logOut((err) => (err ? reject(err) : resolve())),
    );
    await new Promise<void>((resolve) => req.session.destroy(() => resolve()));
    res.clearCookie('lw.sid');
    res.status(204).end();
  });

  r.get('/me', allow('anyone'), (req, res) => {
    if (!req.user) throw new HttpError(401, 'UNAUTHENTICATED', 'You are not signed in.');
    res.json({ user: req.user });
  });

  r.patch('/me', allow('signedIn'), async (req, res) => {
    const { displayName } = parseWith(updateMeSchema, req.body);
    const user = await accounts.updateProfile(req.user!.id, displayName);
    res.json({ user: user.toPublic() });
  });

  r.post('/password', allow('signedIn'), async (req, res) => {
    const body = parseWith(changePasswordSchema, req.body);
    const user = await accounts.changePassword(
      ctx,
      req.user!.id,
      body.currentPassword,
      body.newPassword,
      req.sessionID,
    );
    // Regenerate this session too: the old id stops working, the member stays signed in.
    await logIn(req, { ...user.toPublic(), sessionEpoch: user.sessionEpoch });
    res.json({ user: user.toPublic(), csrfToken: csrfToken(req) });
  });

  r.post('/password-reset', allow('anyone'), async (req, res) => {
    const { email } = parseWith(passwordResetSchema, req.body);
    await accounts.requestPasswordReset(ctx, email);
    void ctx.outbox.flush();
    res.status(202).json({
      message: 'If an account uses this address, a link to reset its password is on its way.',
    });
  });

  r.post('/password-reset/confirm', allow('anyone'), async (req, res) => {
    const { token, password } = parseWith(passwordResetConfirmSchema, req.body);
    await accounts.confirmPasswordReset(ctx, token, password);
    res.json({ ok: true, message: 'Your password is changed. Sign in with the new one.' });
  });

  return r;
}

export { passport };
