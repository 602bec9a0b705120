import type { Sequelize } from 'sequelize';
import { User } from './User';
import { Session } from './Session';
import { AuthToken } from './AuthToken';
import { AuditEntry } from './AuditEntry';
import { OutboxMessage } from './OutboxMessage';

/** Initialises every model on one connection and wires their associations. */
export function initModels(sequelize: Sequelize) {
  User.initModel(sequelize);
  Session.initModel(sequelize);
  AuthToken.initModel(sequelize);
  AuditEntry.initModel(sequelize);
  OutboxMessage.initModel(sequelize);

  AuthToken.belongsTo(User, { foreignKey: 'userId', as: 'user' });
  AuditEntry.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });

  return { User, Session, AuthToken, AuditEntry, OutboxMessage };
}

export type Models = ReturnType<typeof initModels>;
export { User, Session, AuthToken, AuditEntry, OutboxMessage };
