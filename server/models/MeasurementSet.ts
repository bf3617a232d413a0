import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { MeasurementKey } from "@shared/domain/plausibility.js";
import type { User } from "./User.js";

/** Dated body measurements of one performer, in mm, keyed by ISO 8559-1 names. Newest is current. */
export class MeasurementSet extends Model<InferAttributes<MeasurementSet>, InferCreationAttributes<MeasurementSet>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare performerId: string;
  declare takenOn: string;
  declare takenBy: string | null;
  declare valuesMm: Partial<Record<MeasurementKey, number>>;
  declare enteredUnit: "cm" | "in";
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare taker?: NonAttribute<User | null>;
}

MeasurementSet.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    performerId: { type: DataTypes.UUID, allowNull: false },
    takenOn: { type: DataTypes.DATEONLY, allowNull: false },
    takenBy: { type: DataTypes.UUID, allowNull: true },
    valuesMm: { type: DataTypes.JSONB, allowNull: false },
    enteredUnit: { type: DataTypes.STRING(2), allowNull: false, defaultValue: "cm" },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "measurement_sets", modelName: "MeasurementSet", underscored: true },
);
