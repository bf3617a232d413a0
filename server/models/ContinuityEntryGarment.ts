import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** A garment copy worn in a continuity entry. */
export class ContinuityEntryGarment extends Model<
  InferAttributes<ContinuityEntryGarment>,
  InferCreationAttributes<ContinuityEntryGarment>
> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare continuityEntryId: string;
  declare garmentId: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ContinuityEntryGarment.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    continuityEntryId: { type: DataTypes.UUID, allowNull: false },
    garmentId: { type: DataTypes.UUID, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "continuity_entry_garments", modelName: "ContinuityEntryGarment" },
);
