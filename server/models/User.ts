import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export const ROLES = ['member', 'moderator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>;
  declare email: string;
  declare displayName: string;
  declare passwordHash: string;
  declare role: CreationOptional<Role>;
  declare emailVerifiedAt: Date | null;
  declare sessionEpoch: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  /** The fields any API answer may show about the signed-in user. */
  toPublic() {
    return {
      id: this.id,
      email: this.email,
      displayName: this.displayName,
      role: this.role,
      emailVerified: this.emailVerifiedAt !== null,
    };
  }

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
        displayName: { type: DataTypes.STRING(60), allowNull: false },
        passwordHash: { type: DataTypes.STRING(255), allowNull: false },
        role: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'member' },
        emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
        sessionEpoch: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users' },
    );
  }
}
