import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { FabricConstruction } from "@shared/schemas/fabrics.js";
import type { FabricTest } from "./FabricTest.js";

/** A cloth in the department's library: content, construction, width, weight, stretch. */
export class Fabric extends Model<InferAttributes<Fabric>, InferCreationAttributes<Fabric>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare name: string;
  declare supplier: string | null;
  declare fibreContent: Array<{ fibre: string; percent: number }>;
  declare construction: FabricConstruction;
  declare widthMm: number | null;
  declare massPerAreaGsm: number | null;
  declare thicknessMm: number | null;
  declare stretchWarpPct: number | null;
  declare stretchWeftPct: number | null;
  declare colour: string | null;
  declare careNotes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare tests?: NonAttribute<FabricTest[]>;
}

// numeric columns come back from pg as strings; read them as numbers.
const num = (name: string) => ({
  get(this: Model) {
    const v = this.getDataValue(name) as string | number | null;
    return v === null || v === undefined ? null : Number(v);
  },
});

Fabric.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    supplier: { type: DataTypes.STRING(160), allowNull: true },
    fibreContent: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    construction: { type: DataTypes.STRING(6), allowNull: false, validate: { isIn: [["woven", "knit"]] } },
    widthMm: { type: DataTypes.INTEGER, allowNull: true },
    massPerAreaGsm: { type: DataTypes.DECIMAL(8, 2), allowNull: true, ...num("massPerAreaGsm") },
    thicknessMm: { type: DataTypes.DECIMAL(6, 3), allowNull: true, ...num("thicknessMm") },
    stretchWarpPct: { type: DataTypes.DECIMAL(5, 1), allowNull: true, ...num("stretchWarpPct") },
    stretchWeftPct: { type: DataTypes.DECIMAL(5, 1), allowNull: true, ...num("stretchWeftPct") },
    colour: { type: DataTypes.STRING(80), allowNull: true },
    careNotes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "fabrics", modelName: "Fabric", underscored: true },
);
