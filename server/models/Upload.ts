import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type UploadStatus = 'processing' | 'ready' | 'failed';
export type StoredImageType = 'image/jpeg' | 'image/png';

/** One stored copy of an upload: where it is and what it holds. */
export interface UploadVariant {
  key: string;
  contentType: StoredImageType;
  width: number;
  height: number;
  bytes: number;
}

export interface UploadVariants {
  web: UploadVariant;
  thumb: UploadVariant;
}

/**
 * An uploaded image. Only re-encoded copies are kept (the original file, with whatever
 * metadata it carried, never reaches the disk). `publicId` is what URLs show.
 */
export class Upload extends Model<InferAttributes<Upload>, InferCreationAttributes<Upload>> {
  declare id: CreationOptional<number>;
  declare publicId: string;
  declare ownerId: number;
  /** Set by the write-up code when the image is placed in a document. */
  declare documentId: number | null;
  declare status: CreationOptional<UploadStatus>;
  /** sha256 of the web copy's bytes. */
  declare sha256: string;
  /** Type of the stored copies (WebP input is stored as JPEG or PNG). */
  declare contentType: StoredImageType;
  /** Size of the web copy. */
  declare width: number;
  declare height: number;
  declare bytes: number;
  declare variants: UploadVariants;
  /** The uploaded file's name, reduced to a safe base name; never used as a path. */
  declare originalName: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Upload.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        publicId: { type: DataTypes.STRING(36), allowNull: false, unique: true },
        ownerId: { type: DataTypes.INTEGER, allowNull: false },
        documentId: { type: DataTypes.INTEGER, allowNull: true },
        status: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'ready' },
        sha256: { type: DataTypes.STRING(64), allowNull: false },
        contentType: { type: DataTypes.STRING(32), allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        bytes: { type: DataTypes.INTEGER, allowNull: false },
        variants: {
          type: DataTypes.TEXT,
          allowNull: false,
          get() {
            return JSON.parse(this.getDataValue('variants') as unknown as string);
          },
          set(value: UploadVariants) {
            this.setDataValue('variants', JSON.stringify(value) as never);
          },
        },
        originalName: { type: DataTypes.STRING(120), allowNull: false },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'uploads' },
    );
  }
}
