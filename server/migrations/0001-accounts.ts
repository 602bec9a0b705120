import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    display_name: { type: DataTypes.STRING(60), allowNull: false },
    password_hash: { type: DataTypes.STRING(255), allowNull: false },
    role: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'member' },
    email_verified_at: { type: DataTypes.DATE, allowNull: true },
    session_epoch: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...timestamps,
  });

  await qi.createTable('sessions', {
    sid: { type: DataTypes.STRING(64), primaryKey: true },
    data: { type: DataTypes.TEXT, allowNull: false },
    expires: { type: DataTypes.DATE, allowNull: false },
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE',
    },
    ...timestamps,
  });
  await qi.addIndex('sessions', ['expires']);
  await qi.addIndex('sessions', ['user_id']);

  await qi.createTable('auth_tokens', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE',
    },
    purpose: { type: DataTypes.STRING(16), allowNull: false },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });

  await qi.createTable('audit_log', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    actor_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL',
    },
    action: { type: DataTypes.STRING(64), allowNull: false },
    target_type: { type: DataTypes.STRING(32), allowNull: false },
    target_id: { type: DataTypes.STRING(64), allowNull: true },
    details: { type: DataTypes.TEXT, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('audit_log', ['created_at']);

  await qi.createTable('mail_outbox', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    message_id: { type: DataTypes.STRING(128), allowNull: false, unique: true },
    to_address: { type: DataTypes.STRING(254), allowNull: false },
    subject: { type: DataTypes.STRING(255), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    headers: { type: DataTypes.TEXT, allowNull: true },
    kind: { type: DataTypes.STRING(32), allowNull: false, defaultValue: 'general' },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    next_attempt_at: { type: DataTypes.DATE, allowNull: false },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('mail_outbox', ['status', 'next_attempt_at']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('mail_outbox');
  await qi.dropTable('audit_log');
  await qi.dropTable('auth_tokens');
  await qi.dropTable('sessions');
  await qi.dropTable('users');
}
