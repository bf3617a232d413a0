import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { Panel } from "./Panel.js";

/** A run end: a vertex index or a position along an edge. */
export type StoredRunEnd = number | { edge: number; t: number };

const num = (name: string) => ({
  type: DataTypes.DECIMAL(6, 1),
  allowNull: true,
  get(this: Model) {
    const v = this.getDataValue(name);
    return v === null || v === undefined ? null : Number(v);
  },
});

/** Two panel runs sewn together, with a plain tolerance or an allowed ease range. */
export class Seam extends Model<InferAttributes<Seam>, InferCreationAttributes<Seam>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare name: string;
  declare panelAId: string;
  declare aFrom: StoredRunEnd;
  declare aTo: StoredRunEnd;
  declare aDirection: "forward" | "backward";
  declare panelBId: string;
  declare bFrom: StoredRunEnd;
  declare bTo: StoredRunEnd;
  declare bDirection: "forward" | "backward";
  declare toleranceMm: number | null;
  declare eased: boolean;
  declare easeMinMm: number | null;
  declare easeMaxMm: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare panelA?: NonAttribute<Panel>;
  declare panelB?: NonAttribute<Panel>;
}

Seam.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    panelAId: { type: DataTypes.UUID, allowNull: false },
    aFrom: { type: DataTypes.JSONB, allowNull: false },
    aTo: { type: DataTypes.JSONB, allowNull: false },
    aDirection: { type: DataTypes.STRING(8), allowNull: false, defaultValue: "forward" },
    panelBId: { type: DataTypes.UUID, allowNull: false },
    bFrom: { type: DataTypes.JSONB, allowNull: false },
    bTo: { type: DataTypes.JSONB, allowNull: false },
    bDirection: { type: DataTypes.STRING(8), allowNull: false, defaultValue: "forward" },
    toleranceMm: num("toleranceMm"),
    eased: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    easeMinMm: num("easeMinMm"),
    easeMaxMm: num("easeMaxMm"),
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "seams", modelName: "Seam" },
);
