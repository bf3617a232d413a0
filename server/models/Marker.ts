import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { MarkerFabricResultDto } from "@shared/schemas/doubles.js";

/** A cached yardage result for a garment or a change in multiples; input_hash tells whether it is still current. */
export class Marker extends Model<InferAttributes<Marker>, InferCreationAttributes<Marker>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare scope: "garment" | "change";
  declare scopeId: string;
  declare multiples: number;
  declare inputHash: string;
  declare result: { fabrics: MarkerFabricResultDto[] };
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Marker.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    scope: { type: DataTypes.STRING(7), allowNull: false },
    scopeId: { type: DataTypes.UUID, allowNull: false },
    multiples: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    inputHash: { type: DataTypes.CHAR(64), allowNull: false },
    result: { type: DataTypes.JSONB, allowNull: false },
    createdBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "markers", modelName: "Marker" },
);
