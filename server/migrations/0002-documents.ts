import { DataTypes, type QueryInterface } from 'sequelize';

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

const user = (allowNull: boolean, onDelete: 'CASCADE' | 'SET NULL' | 'RESTRICT') => ({
  type: DataTypes.INTEGER,
  allowNull,
  references: { model: 'users', key: 'id' },
  onDelete,
});

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('documents', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    kind: { type: DataTypes.STRING(16), allowNull: false },
    slug: { type: DataTypes.STRING(100), allowNull: false, unique: true },
    owner_id: user(false, 'RESTRICT'),
    // No foreign key: revisions reference documents, and SQLite cannot add one later.
    published_revision_id: { type: DataTypes.INTEGER, allowNull: true },
    ...timestamps,
  });
  await qi.addIndex('documents', ['owner_id']);
  await qi.addIndex('documents', ['kind', 'published_revision_id']);

  await qi.createTable('revisions', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    document_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'documents', key: 'id' },
      onDelete: 'CASCADE',
    },
    kind: { type: DataTypes.STRING(16), allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    content: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.STRING(16), allowNull: false },
    author_id: user(false, 'RESTRICT'),
    reviewer_id: user(true, 'SET NULL'),
    note: { type: DataTypes.TEXT, allowNull: true },
    submitted_at: { type: DataTypes.DATE, allowNull: true },
    decided_at: { type: DataTypes.DATE, allowNull: true },
    published_at: { type: DataTypes.DATE, allowNull: true },
    claimed_by_id: user(true, 'SET NULL'),
    claimed_at: { type: DataTypes.DATE, allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    ...timestamps,
  });
  await qi.addIndex('revisions', ['document_id', 'number'], { unique: true });
  await qi.addIndex('revisions', ['status', 'kind', 'submitted_at']);
  await qi.addIndex('revisions', ['author_id', 'updated_at']);
  // At most one open revision per document, even under concurrent first saves.
  await qi.addIndex('revisions', ['document_id'], {
    unique: true,
    name: 'revisions_one_open_per_document',
    where: { status: ['draft', 'submitted', 'returned'] },
  });
  await qi.addIndex('revisions', ['document_id'], {
    unique: true,
    name: 'revisions_one_published_per_document',
    where: { status: 'published' },
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('revisions');
  await qi.dropTable('documents');
}
