import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { ContinuityEntryGarment } from "./ContinuityEntryGarment.js";

/** What a character actually wore in a scene on a shoot day: notes, state, garment copies, photos. */
export class ContinuityEntry extends Model<InferAttributes<ContinuityEntry>, InferCreationAttributes<ContinuityEntry>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare shootDayId: string | null;
  declare sceneId: string;
  declare characterId: string;
  declare distressStage: number | null;
  declare notes: string | null;
  declare loggedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare garments?: NonAttribute<ContinuityEntryGarment[]>;
}

ContinuityEntry.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    shootDayId: { type: DataTypes.UUID, allowNull: true },
    sceneId: { type: DataTypes.UUID, allowNull: false },
    characterId: { type: DataTypes.UUID, allowNull: false },
    distressStage: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 0, max: 10 } },
    notes: { type: DataTypes.TEXT, allowNull: true },
    loggedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "continuity_entries", modelName: "ContinuityEntry" },
);
