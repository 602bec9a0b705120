import crypto from 'node:crypto';
import { Op, UniqueConstraintError, type Transaction } from 'sequelize';
import type { AppContext } from '../context';
import { conflict, HttpError, badRequest } from '../errors';
import { AuthToken, User } from '../models';
import type { TokenPurpose } from '../models/AuthToken';
import { hashPassword, passwordProblem, verifyPassword } from '../auth/passwords';
import { composeMail } from '../mail/templates';
import { enqueueMail } from './outbox';
import { audit } from './audit';

const TOKEN_LIFETIME: Record<TokenPurpose, number> = {
  verify: 48 * 60 * 60 * 1000,
  reset: 60 * 60 * 1000,
};

const sha256 = (s: string) => crypto.createHash('sha256').update(s).digest('hex');

async function issueToken(userId: number, purpose: TokenPurpose, transaction?: Transaction) {
  const token = crypto.randomBytes(32).toString('base64url');
  // One live token per purpose: a new link makes the older ones useless.
  await AuthToken.update(
    { usedAt: new Date() },
    { where: { userId, purpose, usedAt: null }, transaction },
  );
  await AuthToken.create(
    {
      userId,
      purpose,
      tokenHash: sha256(token),
      expiresAt: new Date(Date.now() + TOKEN_LIFETIME[purpose]),
      usedAt: null,
    },
    { transaction },
  );
  return token;
}

async function assertAcceptablePassword(password: string, context: string[]) {
  const problem = await passwordProblem(password, context);
  if (problem) throw badRequest(problem, [{ path: 'password', message: problem }]);
}

function domainOf(ctx: AppContext) {
  return new URL(ctx.config.publicUrl).hostname || 'loomwright.test';
}

/** Queues the e-mail with a fresh verification link. */
export async function sendVerification(ctx: AppContext, user: User, transaction?: Transaction) {
  const token = await issueToken(user.id, 'verify', transaction);
  const url = `${ctx.config.publicUrl}/verify-email?token=${encodeURIComponent(token)}`;
  const mail = composeMail('Confirm your e-mail address for Loomwright', {
    paragraphs: [
      `Hello ${user.displayName},`,
      'Please confirm this e-mail address so you can post connector sheets, adapters, write-ups and replies. The link works once and for 48 hours.',
      'If you did not create an account, you can ignore this message.',
    ],
    action: { label: 'Confirm my address', url },
  });
  await enqueueMail(
    { ...mail, to: user.email, kind: 'verify' },
    { transaction, domain: domainOf(ctx) },
  );
}

/** Creates an unverified member account and queues its verification e-mail. */
export async function register(
  ctx: AppContext,
  input: { email: string; displayName: string; password: string },
) {
  await assertAcceptablePassword(input.password, [input.email.split('@')[0], input.displayName]);
  const passwordHash = await hashPassword(input.password, ctx.config.passwordHashCost);
  try {
    return await ctx.sequelize.transaction(async (transaction) => {
      const user = await User.create(
        { email: input.email, displayName: input.displayName, passwordHash, emailVerifiedAt: null },
        { transaction },
      );
      await sendVerification(ctx, user, transaction);
      await audit(
        { actorId: user.id, action: 'account.register', targetType: 'user', targetId: user.id },
        transaction,
      );
      return user;
    });
  } catch (err) {
    if (err instanceof UniqueConstraintError)
      throw conflict(
        'EMAIL_TAKEN',
        'An account with this e-mail address already exists. Sign in, or reset its password.',
      );
    throw err;
  }
}

/**
 * Uses a single-use token and runs `then` with its account in the same transaction,
 * so a token is spent exactly when its effect is saved.
 */
async function consumeToken<T>(
  ctx: AppContext,
  token: string,
  purpose: TokenPurpose,
  then: (user: User, transaction: Transaction) => Promise<T>,
): Promise<T> {
  return ctx.sequelize.transaction(async (transaction) => {
    const row = await AuthToken.findOne({
      where: { tokenHash: sha256(token), purpose },
      transaction,
    });
    if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) {
      throw new HttpError(
        400,
        'TOKEN_INVALID',
        purpose === 'verify'
          ? 'This verification link has already been used, has expired or is not valid. Sign in and ask for a new one on your account page.'
          : 'This password-reset link has already been used, has expired or is not valid. Ask for a new one.',
      );
    }
    await row.update({ usedAt: new Date() }, { transaction });
    const user = await User.findByPk(row.userId, { transaction });
    if (!user)
      throw new HttpError(
        400,
        'TOKEN_INVALID',
        'This link belongs to an account that no longer exists.',
      );
    return then(user, transaction);
  });
}

/** Marks the address verified; the token works once. */
export async function verifyEmail(ctx: AppContext, token: string) {
  return consumeToken(ctx, token, 'verify', async (user, transaction) => {
    if (!user.emailVerifiedAt) await user.update({ emailVerifiedAt: new Date() }, { transaction });
    await audit(
      { actorId: user.id, action: 'account.verify', targetType: 'user', targetId: user.id },
      transaction,
    );
    return user;
  });
}

/** Queues a reset link when the address has an account; says nothing either way. */
export async function requestPasswordReset(ctx: AppContext, email: string) {
  const user = await User.findOne({ where: { email } });
  if (!user) return;
  await ctx.sequelize.transaction(async (transaction) => {
    const token = await issueToken(user.id, 'reset', transaction);
    const url = `${ctx.config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
    const mail = composeMail('Reset your Loomwright password', {
      paragraphs: [
        `Hello ${user.displayName},`,
        'Someone asked to reset the password of your Loomwright account. The link below works once and for one hour.',
        'If it was not you, ignore this message: your password stays as it is.',
      ],
      action: { label: 'Choose a new password', url },
    });
    await enqueueMail(
      { ...mail, to: user.email, kind: 'reset' },
      { transaction, domain: domainOf(ctx) },
    );
  });
}

/** Sets a new password from a reset link and ends every session of the account. */
export async function confirmPasswordReset(ctx: AppContext, token: string, password: string) {
  const tokenRow = await AuthToken.findOne({
    where: { tokenHash: sha256(token), purpose: 'reset' },
  });
  const owner = tokenRow ? await User.findByPk(tokenRow.userId) : null;
  if (owner)
    await assertAcceptablePassword(password, [owner.email.split('@')[0], owner.displayName]);
  const passwordHash = await hashPassword(password, ctx.config.passwordHashCost);
  const user = await consumeToken(ctx, token, 'reset', async (u, transaction) => {
    await u.update(
      {
        passwordHash,
        sessionEpoch: u.sessionEpoch + 1,
        // Following a link from the inbox proves the address too.
        emailVerifiedAt: u.emailVerifiedAt ?? new Date(),
      },
      { transaction },
    );
    await audit(
      { actorId: u.id, action: 'account.password-reset', targetType: 'user', targetId: u.id },
      transaction,
    );
    return u;
  });
  await ctx.sessionStore.destroyForUser(user.id);
  return user;
}

/** The account for an e-mail and password, or null for any bad pair. */
export async function authenticate(
  ctx: AppContext,
  email: string,
  password: string,
): Promise<User | null> {
  const user = await User.findOne({ where: { email } });
  if (!user) {
    // Spend the same time as a real check, so timing does not reveal which accounts exist.
    dummyHash ??= hashPassword(crypto.randomUUID(), ctx.config.passwordHashCost);
    await verifyPassword(password, await dummyHash);
    return null;
  }
  return (await verifyPassword(password, user.passwordHash)) ? user : null;
}

let dummyHash: Promise<string> | undefined;

/** Changes the password after checking the current one; other sessions end. */
export async function changePassword(
  ctx: AppContext,
  userId: number,
  current: string,
  next: string,
  keepSid?: string,
) {
  const user = await User.findByPk(userId);
  if (!user) throw new HttpError(401, 'UNAUTHENTICATED', 'Please sign in first.');
  if (!(await verifyPassword(current, user.passwordHash)))
    throw badRequest('The current password is not right.', [
      { path: 'currentPassword', message: 'The current password is not right.' },
    ]);
  await assertAcceptablePassword(next, [user.email.split('@')[0], user.displayName]);
  await user.update({
    passwordHash: await hashPassword(next, ctx.config.passwordHashCost),
    sessionEpoch: user.sessionEpoch + 1,
  });
  await ctx.sessionStore.destroyForUser(user.id, keepSid);
  await audit({
    actorId: user.id,
    action: 'account.password-change',
    targetType: 'user',
    targetId: user.id,
  });
  return user;
}

export async function updateProfile(userId: number, displayName: string) {
  const user = await User.findByPk(userId);
  if (!user) throw new HttpError(401, 'UNAUTHENTICATED', 'Please sign in first.');
  await user.update({ displayName });
  return user;
}

/** Removes tokens that expired more than a day ago. */
export async function pruneTokens() {
  await AuthToken.destroy({
    where: { expiresAt: { [Op.lt]: new Date(Date.now() - 24 * 3600 * 1000) } },
  });
}
