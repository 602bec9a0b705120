/**
 * In-app notifications: the lines under the header's bell. They are written in the
 * transaction of the change they tell about (a reply, a review decision, a flag's
 * outcome) and marked read when the member opens the bell.
 */
import { Op, type Transaction } from 'sequelize';
import { Notification } from '../models';
import type { NotificationKind } from '../models/Notification';

export interface NotificationInput {
  userId: number;
  kind: NotificationKind;
  title: string;
  body?: string | null;
  /** A path inside the app. */
  link?: string | null;
}

const MAX_LISTED = 30;

function clip(s: string | null | undefined, n: number) {
  if (!s) return null;
  const flat = s.replace(/\s+/g, ' ').trim();
  return flat.length > n ? `${flat.slice(0, n - 1)}…` : flat;
}

/** Writes notifications, in the caller's transaction. */
export async function notify(
  inputs: NotificationInput | NotificationInput[],
  transaction?: Transaction,
) {
  const list = (Array.isArray(inputs) ? inputs : [inputs]).map((n) => ({
    userId: n.userId,
    kind: n.kind,
    title: clip(n.title, 200) ?? '',
    body: clip(n.body, 400),
    link: n.link ? n.link.slice(0, 300) : null,
  }));
  if (list.length) await Notification.bulkCreate(list, { transaction });
}

function json(n: Notification) {
  return {
    id: n.id,
    kind: n.kind,
    title: n.title,
    body: n.body,
    link: n.link,
    read: n.readAt !== null,
    createdAt: n.createdAt,
  };
}

async function unreadCount(userId: number) {
  return Notification.count({ where: { userId, readAt: null } });
}

/** The member's newest notifications and how many are unread. */
export async function listNotifications(user: Pick<Express.User, 'id'>) {
  const rows = await Notification.findAll({
    where: { userId: user.id },
    order: [['id', 'DESC']],
    limit: MAX_LISTED,
  });
  return { unread: await unreadCount(user.id), items: rows.map(json) };
}

/** Marks the given notifications (or every unread one) as read; answers the new unread count. */
export async function markRead(user: Pick<Express.User, 'id'>, ids?: number[]) {
  await Notification.update(
    { readAt: new Date() },
    {
      where: {
        userId: user.id,
        readAt: null,
        ...(ids ? { id: { [Op.in]: ids } } : {}),
      },
    },
  );
  return { unread: await unreadCount(user.id) };
}
