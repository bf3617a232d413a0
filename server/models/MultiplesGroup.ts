import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** Copies of one design (#1..#n), made so distress and wet/stunt scenes can follow story order. */
export class MultiplesGroup extends Model<InferAttributes<MultiplesGroup>, InferCreationAttributes<MultiplesGroup>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare name: string;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

MultiplesGroup.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "multiples_groups", modelName: "MultiplesGroup", underscored: true },
);
