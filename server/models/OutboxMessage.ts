import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed';

export class OutboxMessage extends Model<
  InferAttributes<OutboxMessage>,
  InferCreationAttributes<OutboxMessage>
> {
  declare id: CreationOptional<number>;
  /** Message-ID header; unique, so a retried delivery can be recognised downstream. */
  declare messageId: string;
  declare toAddress: string;
  declare subject: string;
  declare textBody: string;
  declare htmlBody: string | null;
  declare headers: Record<string, string> | null;
  declare kind: CreationOptional<string>;
  declare status: CreationOptional<OutboxStatus>;
  declare attempts: CreationOptional<number>;
  declare nextAttemptAt: Date;
  declare lastError: string | null;
  declare sentAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    OutboxMessage.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        messageId: { type: DataTypes.STRING(128), allowNull: false, unique: true },
        toAddress: { type: DataTypes.STRING(254), allowNull: false },
        subject: { type: DataTypes.STRING(255), allowNull: false },
        textBody: { type: DataTypes.TEXT, allowNull: false },
        htmlBody: { type: DataTypes.TEXT, allowNull: true },
        headers: {
          type: DataTypes.TEXT,
          allowNull: true,
          get() {
            const raw = this.getDataValue('headers') as unknown as string | null;
            return raw ? JSON.parse(raw) : null;
          },
          set(value: Record<string, string> | null) {
            this.setDataValue('headers', (value == null ? null : JSON.stringify(value)) as never);
          },
        },
        kind: { type: DataTypes.STRING(32), allowNull: false, defaultValue: 'general' },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'queued' },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        nextAttemptAt: { type: DataTypes.DATE, allowNull: false },
        lastError: { type: DataTypes.TEXT, allowNull: true },
        sentAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'mail_outbox' },
    );
  }
}
