import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type SubscriptionSource = 'author' | 'replied' | 'manual';

/**
 * A member following the replies under one document. `active: false` records an
 * opt-out, which also stops the document's author (subscribed without a row).
 */
export class ThreadSubscription extends Model<
  InferAttributes<ThreadSubscription>,
  InferCreationAttributes<ThreadSubscription>
> {
  declare id: CreationOptional<number>;
  declare documentId: number;
  declare userId: number;
  declare active: boolean;
  declare source: SubscriptionSource;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ThreadSubscription.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        documentId: { type: DataTypes.INTEGER, allowNull: false },
        userId: { type: DataTypes.INTEGER, allowNull: false },
        active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        source: { type: DataTypes.STRING(16), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'thread_subscriptions' },
    );
  }
}
