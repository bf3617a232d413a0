import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { CapturedAs, ReviewReason } from "@shared/schemas/continuity.js";
import type { ContinuityEntryGarment } from "./ContinuityEntryGarment.js";

/** What a character actually wore in a scene on a shoot day: notes, state, garment copies, photos. */
export class ContinuityEntry extends Model<InferAttributes<ContinuityEntry>, InferCreationAttributes<ContinuityEntry>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare shootDayId: string | null;
  /** Null when the scene was deleted before an entry captured offline arrived. */
  declare sceneId: string | null;
  /** Null when the character was deleted before an entry captured offline arrived. */
  declare characterId: string | null;
  declare distressStage: number | null;
  declare notes: string | null;
  declare loggedBy: string | null;
  /** The capturing device's id for the entry: unique within the production. */
  declare clientId: string | null;
  /** SHA-256 of what was sent with `clientId`; a repeat must send the same. */
  declare requestHash: string | null;
  declare capturedAs: CapturedAs | null;
  declare reviewReasons: CreationOptional<ReviewReason[]>;
  declare reviewResolvedAt: Date | null;
  declare reviewResolvedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare garments?: NonAttribute<ContinuityEntryGarment[]>;
}

ContinuityEntry.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    shootDayId: { type: DataTypes.UUID, allowNull: true },
    sceneId: { type: DataTypes.UUID, allowNull: true },
    characterId: { type: DataTypes.UUID, allowNull: true },
    distressStage: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 0, max: 10 } },
    notes: { type: DataTypes.TEXT, allowNull: true },
    loggedBy: { type: DataTypes.UUID, allowNull: true },
    clientId: { type: DataTypes.UUID, allowNull: true },
    requestHash: { type: DataTypes.CHAR(64), allowNull: true },
    capturedAs: { type: DataTypes.JSONB, allowNull: true },
    reviewReasons: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    reviewResolvedAt: { type: DataTypes.DATE, allowNull: true },
    reviewResolvedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "continuity_entries", modelName: "ContinuityEntry" },
);
