import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { User } from "./User.js";

/** A snag the department accepts, with the evidence hash it was accepted against (it lapses when that changes). */
export class SnagDismissal extends Model<InferAttributes<SnagDismissal>, InferCreationAttributes<SnagDismissal>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare snagKey: string;
  declare evidenceHash: string;
  declare reason: string;
  declare dismissedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare dismisser?: NonAttribute<User | null>;
}

SnagDismissal.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    snagKey: { type: DataTypes.STRING(300), allowNull: false, validate: { len: [1, 300] } },
    evidenceHash: { type: DataTypes.STRING(64), allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false, validate: { len: [3, 500] } },
    dismissedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "snag_dismissals", modelName: "SnagDismissal" },
);
