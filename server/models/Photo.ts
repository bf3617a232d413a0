import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { PhotoView } from "@shared/schemas/photos.js";

/** Stored keys of one photo's files, relative to the storage root. */
export interface PhotoVariants {
  original: string;
  display: string;
  /** JPEG at print size; photos stored before it existed have none (reports fall back to display). */
  print?: string;
  thumb: string;
}

/** A stored image linked to one owner record (continuity entry, scene, character, …). */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare ownerType: string;
  declare ownerId: string;
  declare view: CreationOptional<PhotoView>;
  declare caption: string | null;
  declare contentHash: string;
  declare originalName: string | null;
  declare width: number;
  declare height: number;
  declare bytes: number;
  declare variants: PhotoVariants;
  declare uploadedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Photo.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    ownerType: { type: DataTypes.STRING(30), allowNull: false },
    ownerId: { type: DataTypes.UUID, allowNull: false },
    view: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "other" },
    caption: { type: DataTypes.STRING(300), allowNull: true },
    contentHash: { type: DataTypes.CHAR(64), allowNull: false },
    originalName: { type: DataTypes.STRING(255), allowNull: true },
    width: { type: DataTypes.INTEGER, allowNull: false },
    height: { type: DataTypes.INTEGER, allowNull: false },
    bytes: { type: DataTypes.INTEGER, allowNull: false },
    variants: { type: DataTypes.JSONB, allowNull: false },
    uploadedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "photos", modelName: "Photo" },
);
