import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type ReplyStatus = 'visible' | 'hidden' | 'deleted';

/** A reply under a published document; `parentId` nests it one level under another. */
export class Reply extends Model<InferAttributes<Reply>, InferCreationAttributes<Reply>> {
  declare id: CreationOptional<number>;
  declare documentId: number;
  declare authorId: number;
  declare parentId: number | null;
  /** The Markdown source as written. */
  declare body: string;
  /** The source rendered and sanitised on the server. */
  declare bodyHtml: string;
  declare status: CreationOptional<ReplyStatus>;
  declare isAnswer: CreationOptional<boolean>;
  declare hiddenReason: CreationOptional<string | null>;
  declare hiddenById: CreationOptional<number | null>;
  declare hiddenAt: CreationOptional<Date | null>;
  declare editedAt: CreationOptional<Date | null>;
  declare deletedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Reply.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        documentId: { type: DataTypes.INTEGER, allowNull: false },
        authorId: { type: DataTypes.INTEGER, allowNull: false },
        parentId: { type: DataTypes.INTEGER, allowNull: true },
        body: { type: DataTypes.TEXT, allowNull: false },
        bodyHtml: { type: DataTypes.TEXT, allowNull: false },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'visible' },
        isAnswer: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        hiddenReason: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        hiddenById: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
        hiddenAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        editedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        deletedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'replies' },
    );
  }
}
