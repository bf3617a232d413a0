import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { ProductionKind, ProductionSettings, Units } from "@shared/schemas/productions.js";

/** A film, series or stage production; every department record belongs to one. */
export class Production extends Model<InferAttributes<Production>, InferCreationAttributes<Production>> {
  declare id: CreationOptional<string>;
  declare title: string;
  declare kind: ProductionKind;
  declare startsOn: string | null;
  declare endsOn: string | null;
  declare units: CreationOptional<Units>;
  declare settings: CreationOptional<ProductionSettings>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Production.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    title: { type: DataTypes.STRING(200), allowNull: false },
    kind: { type: DataTypes.STRING(10), allowNull: false, validate: { isIn: [["film", "series", "stage"]] } },
    startsOn: { type: DataTypes.DATEONLY, allowNull: true },
    endsOn: { type: DataTypes.DATEONLY, allowNull: true },
    units: { type: DataTypes.STRING(2), allowNull: false, defaultValue: "cm" },
    settings: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "productions", modelName: "Production" },
);
