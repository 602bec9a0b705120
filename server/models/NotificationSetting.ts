import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { EmailMode } from '../../shared/schemas/replies';

/** How a member wants to hear about replies by e-mail. No row means "each reply". */
export class NotificationSetting extends Model<
  InferAttributes<NotificationSetting>,
  InferCreationAttributes<NotificationSetting>
> {
  declare userId: number;
  declare emailMode: EmailMode;
  /** The next digest covers replies after this moment. */
  declare digestSince: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    NotificationSetting.init(
      {
        userId: { type: DataTypes.INTEGER, primaryKey: true },
        emailMode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'each' },
        digestSince: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'notification_settings' },
    );
  }
}
