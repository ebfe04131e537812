import { type CreationOptional, DataTypes, type InferAttributes, type InferCreationAttributes, Model, type NonAttribute, type Sequelize } from 'sequelize';
import type { PhotoKind, Photo as PhotoDto } from '../../shared/schemas/photos';
import type { User } from './user';

/** One uploaded site or pit photo of a test location, optionally of one of its runs. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>;
  declare locationId: number;
  declare runId: number | null;
  declare kind: PhotoKind;
  declare caption: string;
  /** Names the stored files: `<key>.<originalExt>`, `<key>-thumb.jpg`, `<key>-preview.jpg`. */
  declare fileKey: string;
  declare originalExt: string;
  declare mime: string;
  declare bytes: number;
  declare width: number;
  declare height: number;
  declare sha256: string;
  declare uploadedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare uploader?: NonAttribute<User | null>;

  toDto(): PhotoDto {
    return {
      id: this.id,
      locationId: this.locationId,
      runId: this.runId,
      kind: this.kind,
      caption: this.caption,
      width: this.width,
      height: this.height,
      mime: this.mime,
      bytes: this.bytes,
      sha256: this.sha256,
      uploadedBy: this.uploader ? { id: this.uploader.id, name: this.uploader.name } : null,
      createdAt: this.createdAt.toISOString(),
    };
  }

  static initModel(sequelize: Sequelize) {
    Photo.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        locationId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        kind: { type: DataTypes.STRING(10), allowNull: false },
        caption: { type: DataTypes.STRING(300), allowNull: false, defaultValue: '' },
        fileKey: { type: DataTypes.STRING(40), allowNull: false, unique: true },
        originalExt: { type: DataTypes.STRING(8), allowNull: false },
        mime: { type: DataTypes.STRING(40), allowNull: false },
        bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        sha256: { type: DataTypes.CHAR(64), allowNull: false },
        uploadedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'photos' },
    );
  }
}
