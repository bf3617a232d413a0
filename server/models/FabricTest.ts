import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { FabricTestDerived, FabricTestKind, FabricTestReadings } from "@shared/schemas/fabrics.js";
import type { User } from "./User.js";

/** One recorded test of a fabric: raw readings kept as entered, derived values beside them. */
export class FabricTest extends Model<InferAttributes<FabricTest>, InferCreationAttributes<FabricTest>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare fabricId: string;
  declare kind: FabricTestKind;
  declare direction: "warp" | "weft" | null;
  declare readings: FabricTestReadings;
  declare derived: CreationOptional<FabricTestDerived>;
  declare testedBy: string | null;
  declare testedOn: string;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare tester?: NonAttribute<User | null>;
}

FabricTest.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    fabricId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    direction: { type: DataTypes.STRING(5), allowNull: true },
    readings: { type: DataTypes.JSONB, allowNull: false },
    derived: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    testedBy: { type: DataTypes.UUID, allowNull: true },
    testedOn: { type: DataTypes.DATEONLY, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "fabric_tests", modelName: "FabricTest", underscored: true },
);
