import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('uploads', {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    public_id: { type: DataTypes.STRING(36), allowNull: false, unique: true },
    owner_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'RESTRICT',
    },
    // No foreign key: attaching happens in the write-up code, and a document that goes
    // away only makes the image private again (see canReadUpload).
    document_id: { type: DataTypes.INTEGER, allowNull: true },
    status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'ready' },
    sha256: { type: DataTypes.STRING(64), allowNull: false },
    content_type: { type: DataTypes.STRING(32), allowNull: false },
    width: { type: DataTypes.INTEGER, allowNull: false },
    height: { type: DataTypes.INTEGER, allowNull: false },
    bytes: { type: DataTypes.INTEGER, allowNull: false },
    variants: { type: DataTypes.TEXT, allowNull: false },
    original_name: { type: DataTypes.STRING(120), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex('uploads', ['owner_id', 'created_at']);
  await qi.addIndex('uploads', ['document_id']);
  await qi.addIndex('uploads', ['sha256']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('uploads');
}
