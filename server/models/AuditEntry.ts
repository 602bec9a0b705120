import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class AuditEntry extends Model<
  InferAttributes<AuditEntry>,
  InferCreationAttributes<AuditEntry>
> {
  declare id: CreationOptional<number>;
  declare actorId: number | null;
  declare action: string;
  declare targetType: string;
  declare targetId: string | null;
  declare details: unknown;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AuditEntry.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        actorId: { type: DataTypes.INTEGER, allowNull: true },
        action: { type: DataTypes.STRING(64), allowNull: false },
        targetType: { type: DataTypes.STRING(32), allowNull: false },
        targetId: { type: DataTypes.STRING(64), allowNull: true },
        details: {
          type: DataTypes.TEXT,
          allowNull: true,
          get() {
            const raw = this.getDataValue('details') as unknown as string | null;
            return raw ? JSON.parse(raw) : null;
          },
          set(value: unknown) {
            this.setDataValue('details', (value == null ? null : JSON.stringify(value)) as never);
          },
        },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_log' },
    );
  }
}
