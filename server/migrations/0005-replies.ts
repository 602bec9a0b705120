import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

const ref = (model: string, allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model, key: 'id' },
  onDelete,
});

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('replies', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    document_id: ref('documents', false, 'CASCADE'),
    author_id: ref('users', false, 'RESTRICT'),
    parent_id: ref('replies', true, 'CASCADE'),
    body: { type: DataTypes.TEXT, allowNull: false },
    body_html: { type: DataTypes.TEXT, allowNull: false },
    // visible | hidden (by a moderator) | deleted (by its author)
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'visible' },
    is_answer: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    hidden_reason: { type: DataTypes.TEXT, allowNull: true },
    hidden_by_id: ref('users', true, 'SET NULL'),
    hidden_at: { type: DataTypes.DATE, allowNull: true },
    edited_at: { type: DataTypes.DATE, allowNull: true },
    deleted_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('replies', ['document_id', 'created_at']);
  await qi.addIndex('replies', ['author_id', 'created_at']);
  await qi.addIndex('replies', ['created_at']);
  await qi.addIndex('replies', ['document_id'], {
    unique: true,
    name: 'replies_one_answer_per_document',
    where: { is_answer: true },
  });

  await qi.createTable('thread_subscriptions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    document_id: ref('documents', false, 'CASCADE'),
    user_id: ref('users', false, 'CASCADE'),
    // false: the member opted out (the document's author is subscribed unless this says so)
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    // author | replied | manual
    source: { type: DataTypes.STRING(16), allowNull: false },
    ...timestamps,
  });
  await qi.addIndex('thread_subscriptions', ['document_id', 'user_id'], { unique: true });
  await qi.addIndex('thread_subscriptions', ['user_id']);

  await qi.createTable('notification_settings', {
    user_id: { ...ref('users', false, 'CASCADE'), primaryKey: true },
    // each | digest | none
    email_mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'each' },
    // The digest covers replies after this moment; it moves on with each digest.
    digest_since: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('notification_settings', ['email_mode', 'digest_since']);

  await qi.createTable('flags', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    target_type: { type: DataTypes.STRING(16), allowNull: false },
    // "document:12" or "reply:40": one key so an open flag per reporter and target is unique
    target_key: { type: DataTypes.STRING(40), allowNull: false },
    document_id: ref('documents', false, 'CASCADE'),
    reply_id: ref('replies', true, 'CASCADE'),
    reporter_id: ref('users', false, 'CASCADE'),
    reason: { type: DataTypes.STRING(32), allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'open' },
    action: { type: DataTypes.STRING(24), allowNull: true },
    resolution_note: { type: DataTypes.TEXT, allowNull: true },
    resolved_by_id: ref('users', true, 'SET NULL'),
    resolved_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('flags', ['status', 'created_at']);
  await qi.addIndex('flags', ['target_key', 'status']);
  await qi.addIndex('flags', ['reporter_id', 'target_key'], {
    unique: true,
    name: 'flags_one_open_per_reporter_and_target',
    where: { status: 'open' },
  });

  await qi.createTable('notifications', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: ref('users', false, 'CASCADE'),
    // reply | review | flag | answer | moderation
    kind: { type: DataTypes.STRING(16), allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: true },
    link: { type: DataTypes.STRING(300), allowNull: true },
    read_at: { type: DataTypes.DATE, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('notifications', ['user_id', 'read_at', 'id']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('notifications');
  await qi.dropTable('flags');
  await qi.dropTable('notification_settings');
  await qi.dropTable('thread_subscriptions');
  await qi.dropTable('replies');
}
