import type { Sequelize } from 'sequelize';
import { User } from './User';
import { Session } from './Session';
import { AuthToken } from './AuthToken';
import { AuditEntry } from './AuditEntry';
import { OutboxMessage } from './OutboxMessage';
import { Document } from './Document';
import { Revision } from './Revision';
import { Reply } from './Reply';
import { ThreadSubscription } from './ThreadSubscription';
import { NotificationSetting } from './NotificationSetting';
import { Flag } from './Flag';
import { Notification } from './Notification';
import { Upload } from './Upload';

/** Initialises every model on one connection and wires their associations. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Session.initModel(sequelize);
  AuthToken.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  OutboxMessage.initModel(sequelize);
  Document.initModel(sequelize);
  Revision.initModel(sequelize);
  Reply.initModel(sequelize);
  ThreadSubscription.initModel(sequelize);
  NotificationSetting.initModel(sequelize);
  Flag.initModel(sequelize);
  Notification.initModel(sequelize);
  Upload.initModel(sequelize);

  AuthToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
  Document.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });
  Document.hasMany(Revision, { foreignKey: 'documentId', as: 'revisions' });
  Document.belongsTo(Revision, {
    foreignKey: 'publishedRevisionId',
    as: 'publishedRevision',
    constraints: false,
  });
  Revision.belongsTo(Document, { foreignKey: 'documentId', as: 'document' });
  Revision.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
  Revision.belongsTo(User, { foreignKey: 'reviewerId', as: 'reviewer' });
  Revision.belongsTo(User, { foreignKey: 'claimedById', as: 'claimedBy' });
  Reply.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
  Reply.belongsTo(User, { foreignKey: 'hiddenById', as: 'hiddenBy' });
  Reply.belongsTo(Document, { foreignKey: 'documentId', as: 'document' });
  ThreadSubscription.belongsTo(Document, { foreignKey: 'documentId', as: 'document' });
  ThreadSubscription.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  Flag.belongsTo(User, { foreignKey: 'reporterId', as: 'reporter' });
  Flag.belongsTo(User, { foreignKey: 'resolvedById', as: 'resolvedBy' });
  Flag.belongsTo(Document, { foreignKey: 'documentId', as: 'document' });
  Flag.belongsTo(Reply, { foreignKey: 'replyId', as: 'reply' });
  Upload.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' });

  return {
    User,
    Session,
    AuthToken,
    AuditEntry,
    OutboxMessage,
    Document,
    Revision,
    Reply,
    ThreadSubscription,
    NotificationSetting,
    Flag,
    Notification,
    Upload,
  };
}

export type Models = ReturnType<typeof initModels>;
export {
  User,
  Session,
  AuthToken,
  AuditEntry,
  OutboxMessage,
  Document,
  Revision,
  Reply,
  ThreadSubscription,
  NotificationSetting,
  Flag,
  Notification,
  Upload,
};
