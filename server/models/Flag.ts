import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { FlagAction, FlagReason } from '../../shared/schemas/replies';

export type FlagStatus = 'open' | 'resolved';
export type FlagTarget = 'document' | 'reply';

/** A reader's report that a published document or a reply needs a moderator's look. */
export class Flag extends Model<InferAttributes<Flag>, InferCreationAttributes<Flag>> {
  declare id: CreationOptional<number>;
  declare targetType: FlagTarget;
  /** "document:12" or "reply:40". */
  declare targetKey: string;
  declare documentId: number;
  declare replyId: number | null;
  declare reporterId: number;
  declare reason: FlagReason;
  declare note: string | null;
  declare status: CreationOptional<FlagStatus>;
  declare action: CreationOptional<FlagAction | null>;
  declare resolutionNote: CreationOptional<string | null>;
  declare resolvedById: CreationOptional<number | null>;
  declare resolvedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Flag.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        targetType: { type: DataTypes.STRING(16), allowNull: false },
        targetKey: { type: DataTypes.STRING(40), allowNull: false },
        documentId: { type: DataTypes.INTEGER, allowNull: false },
        replyId: { type: DataTypes.INTEGER, allowNull: true },
        reporterId: { type: DataTypes.INTEGER, allowNull: false },
        reason: { type: DataTypes.STRING(32), allowNull: false },
        note: { type: DataTypes.TEXT, allowNull: true },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'open' },
        action: { type: DataTypes.STRING(24), allowNull: true, defaultValue: null },
        resolutionNote: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        resolvedById: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
        resolvedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'flags' },
    );
  }
}
