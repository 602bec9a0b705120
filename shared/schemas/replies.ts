/**
 * Replies, thread subscriptions, e-mail preferences, flags and in-app notifications:
 * the request bodies and queries of their routes. The client's forms use the same schemas.
 */
import { z } from 'zod';
import { REPLY_MARKDOWN_BUDGET, markdownSourceProblem } from '../markdown/budget';

/** A reply's Markdown source may be at most this long. */
export const MAX_REPLY = REPLY_MARKDOWN_BUDGET.maxLength;
/** Minutes after posting during which the author may still change a reply. */
export const REPLY_EDIT_MINUTES = 15;
export const MAX_FLAG_NOTE = 1000;
export const MAX_HIDE_REASON = 500;

const replyBody = z
  .string({ error: 'must be text' })
  .trim()
  .min(1, { error: 'cannot be empty: write your reply first' })
  .max(MAX_REPLY, { error: `must be at most ${MAX_REPLY} characters` })
  .superRefine((body, ctx) => {
    const problem = markdownSourceProblem(body, REPLY_MARKDOWN_BUDGET);
    if (problem) ctx.addIssue({ code: 'custom', message: problem });
  });

const positiveId = (what: string) =>
  z
    .number({ error: `must be the number of ${what}` })
    .int({ error: 'must be a whole number' })
    .positive({ error: 'must be 1 or more' });

/** `POST /api/documents/:id/replies`. `parentId` answers another reply (one level deep). */
export const createReplySchema = z.strictObject({
  body: replyBody,
  parentId: positiveId('the reply you answer').nullish(),
});

/** `PATCH /api/replies/:id`. */
export const editReplySchema = z.strictObject({ body: replyBody });

/** `POST /api/replies/:id/hide`: readers see "hidden by a moderator"; the reason is for the author and moderators. */
export const hideReplySchema = z.strictObject({
  reason: z
    .string({ error: 'must be text' })
    .trim()
    .min(1, { error: 'is required: say why the reply is hidden' })
    .max(MAX_HIDE_REASON, { error: `must be at most ${MAX_HIDE_REASON} characters` }),
});

/** `PUT /api/documents/:id/subscription`. */
export const subscriptionSchema = z.strictObject({
  subscribed: z.boolean({ error: 'must be true or false' }),
});

export const EMAIL_MODES = ['each', 'digest', 'none'] as const;
export type EmailMode = (typeof EMAIL_MODES)[number];
export const EMAIL_MODE_LABELS: Record<EmailMode, string> = {
  each: 'An e-mail for each reply',
  digest: 'One daily digest',
  none: 'No e-mail',
};

/** `PUT /api/me/notifications`. */
export const notificationSettingsSchema = z.strictObject({
  emailMode: z.enum(EMAIL_MODES, { error: 'must be "each", "digest" or "none"' }),
});

/** `POST /api/unsubscribe`: the token from the e-mail's link. */
export const unsubscribeSchema = z.strictObject({
  token: z.string({ error: 'must be the token from the e-mail' }).min(10).max(400),
});
/** The one-click form body mail programs send (RFC 8058), with the token in the query. */
export const oneClickBodySchema = z.object({
  'List-Unsubscribe': z.literal('One-Click').optional(),
});
export const unsubscribeQuerySchema = z.object({
  token: z.string({ error: 'is required: open the link from the e-mail' }).min(10).max(400),
});

export const FLAG_REASONS = [
  'wrong-pinout',
  'unsafe-advice',
  'copied-material',
  'personal-data',
  'spam-abuse',
  'other',
] as const;
export type FlagReason = (typeof FLAG_REASONS)[number];
export const FLAG_REASON_LABELS: Record<FlagReason, string> = {
  'wrong-pinout': 'Wrong pinout',
  'unsafe-advice': 'Unsafe advice',
  'copied-material': 'Copied material',
  'personal-data': 'Personal data in an image',
  'spam-abuse': 'Spam or abuse',
  other: 'Other',
};

/** `POST /api/flags`. A note is required when the reason is "other". */
export const createFlagSchema = z
  .strictObject({
    targetType: z.enum(['document', 'reply'], { error: 'must be "document" or "reply"' }),
    targetId: positiveId('the document or reply you flag'),
    reason: z.enum(FLAG_REASONS, {
      error: `must be one of: ${FLAG_REASONS.join(', ')}`,
    }),
    note: z
      .string({ error: 'must be text' })
      .trim()
      .max(MAX_FLAG_NOTE, { error: `must be at most ${MAX_FLAG_NOTE} characters` })
      .optional(),
  })
  .refine((f) => f.reason !== 'other' || !!f.note, {
    path: ['note'],
    error: 'is required when the reason is "other": say what is wrong',
  });

export const FLAG_ACTIONS = ['dismiss', 'hide-reply', 'return-document'] as const;
export type FlagAction = (typeof FLAG_ACTIONS)[number];
export const FLAG_STATUSES = ['open', 'resolved', 'all'] as const;

/** `POST /api/flags/:id/resolve`. Hiding and returning tell the author why, so they need a note. */
export const resolveFlagSchema = z
  .strictObject({
    action: z.enum(FLAG_ACTIONS, { error: 'must be "dismiss", "hide-reply" or "return-document"' }),
    note: z
      .string({ error: 'must be text' })
      .trim()
      .max(MAX_HIDE_REASON, { error: `must be at most ${MAX_HIDE_REASON} characters` })
      .optional(),
  })
  .refine((r) => r.action === 'dismiss' || !!r.note, {
    path: ['note'],
    error: 'is required: tell the author what is wrong',
  });

/** `GET /api/flags?status=`. */
export const flagQuerySchema = z.object({
  status: z.preprocess(
    (v) => (v === '' || v === undefined ? 'open' : v),
    z.enum(FLAG_STATUSES, { error: 'must be "open", "resolved" or "all"' }),
  ),
});

/** `POST /api/notifications/read`: the ids shown, or every unread one when left out. */
export const readNotificationsSchema = z.strictObject({
  ids: z.array(positiveId('a notification')).max(200).optional(),
});

export const OUTBOX_FILTERS = ['failed', 'queued', 'sent', 'all'] as const;
/** `GET /api/admin/mail?status=`. */
export const outboxQuerySchema = z.object({
  status: z.preprocess(
    (v) => (v === '' || v === undefined ? 'failed' : v),
    z.enum(OUTBOX_FILTERS, { error: 'must be "failed", "queued", "sent" or "all"' }),
  ),
  limit: z.coerce.number().int().min(1).max(200).default(100),
});

export type CreateReplyInput = z.infer<typeof createReplySchema>;
export type CreateFlagInput = z.infer<typeof createFlagSchema>;
export type ResolveFlagInput = z.infer<typeof resolveFlagSchema>;
