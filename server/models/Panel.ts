import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

type Pt = [number, number];

/** A flat pattern piece of a garment: sew-line outline (mm, y up), grainline, notches, allowance, cut count. */
export class Panel extends Model<InferAttributes<Panel>, InferCreationAttributes<Panel>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare garmentId: string;
  declare name: string;
  declare outline: Pt[];
  declare grainline: [Pt, Pt] | null;
  declare notches: { point: Pt; edge: number }[];
  declare seamAllowanceMm: number;
  declare cutCount: number;
  declare mirrored: boolean;
  declare grainMode: "straight" | "bias" | "free";
  declare fabricId: string | null;
  declare source: CreationOptional<"drawn" | "dxf">;
  declare sortOrder: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Panel.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    garmentId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
    outline: { type: DataTypes.JSONB, allowNull: false },
    grainline: { type: DataTypes.JSONB, allowNull: true },
    notches: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    // numeric comes back from pg as a string; the getter keeps the attribute a number.
    seamAllowanceMm: {
      type: DataTypes.DECIMAL(5, 1),
      allowNull: false,
      defaultValue: 10,
      get(this: Panel) {
        return Number(this.getDataValue("seamAllowanceMm"));
      },
    },
    cutCount: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1, validate: { min: 1, max: 99 } },
    mirrored: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    grainMode: {
      type: DataTypes.STRING(8),
      allowNull: false,
      defaultValue: "straight",
      validate: { isIn: [["straight", "bias", "free"]] },
    },
    fabricId: { type: DataTypes.UUID, allowNull: true },
    source: { type: DataTypes.STRING(6), allowNull: false, defaultValue: "drawn" },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "panels", modelName: "Panel" },
);
