import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { DocumentKind, RevisionStatus } from '../../shared/schemas/document';

/**
 * One version of a document's title and content. At most one revision per document is
 * open (draft, submitted or returned); `version` rises with every save and is what a
 * save must name to succeed (optimistic locking).
 */
export class Revision extends Model<InferAttributes<Revision>, InferCreationAttributes<Revision>> {
  declare id: CreationOptional<number>;
  declare documentId: number;
  /** Copied from the document so the review queue reads one index. */
  declare kind: DocumentKind;
  declare number: number;
  declare title: string;
  declare content: Record<string, unknown>;
  declare status: RevisionStatus;
  declare authorId: number;
  declare reviewerId: CreationOptional<number | null>;
  declare note: CreationOptional<string | null>;
  declare submittedAt: CreationOptional<Date | null>;
  declare decidedAt: CreationOptional<Date | null>;
  declare publishedAt: CreationOptional<Date | null>;
  declare claimedById: CreationOptional<number | null>;
  declare claimedAt: CreationOptional<Date | null>;
  declare version: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Revision.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        documentId: { type: DataTypes.INTEGER, allowNull: false },
        kind: { type: DataTypes.STRING(16), allowNull: false },
        number: { type: DataTypes.INTEGER, allowNull: false },
        title: { type: DataTypes.STRING(200), allowNull: false },
        content: {
          type: DataTypes.TEXT,
          allowNull: false,
          get() {
            const raw = this.getDataValue('content') as unknown as string | null;
            return raw ? JSON.parse(raw) : {};
          },
          set(value: Record<string, unknown>) {
            this.setDataValue('content', JSON.stringify(value ?? {}) as never);
          },
        },
        status: { type: DataTypes.STRING(16), allowNull: false },
        authorId: { type: DataTypes.INTEGER, allowNull: false },
        reviewerId: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
        note: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
        submittedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        decidedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        publishedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        claimedById: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
        claimedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'revisions' },
    );
  }
}
