import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { DocumentKind } from '../../shared/schemas/document';

/** A connector sheet, adapter sheet or write-up; its words live in its revisions. */
export class Document extends Model<InferAttributes<Document>, InferCreationAttributes<Document>> {
  declare id: CreationOptional<number>;
  declare kind: DocumentKind;
  declare slug: string;
  declare ownerId: number;
  /** The revision readers see; null until one is published. */
  declare publishedRevisionId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Document.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        slug: { type: DataTypes.STRING(100), allowNull: false, unique: true },
        ownerId: { type: DataTypes.INTEGER, allowNull: false },
        publishedRevisionId: { type: DataTypes.INTEGER, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'documents' },
    );
  }
}
