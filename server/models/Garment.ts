import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { FinishedPoint, FitIntentValue, GarmentSource, GarmentStatus, WrapDisposition } from "@shared/schemas/garments.js";
import type { Fabric } from "./Fabric.js";
import type { MultiplesGroup } from "./MultiplesGroup.js";

/** A physical garment with a printed tag code; copies of one design share a multiples group. */
export class Garment extends Model<InferAttributes<Garment>, InferCreationAttributes<Garment>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare tagCode: string;
  declare name: string;
  declare category: string;
  declare sizeLabel: string | null;
  declare fitIntent: CreationOptional<FitIntentValue>;
  declare finishedMeasurements: CreationOptional<Partial<Record<FinishedPoint, number>>>;
  declare fabricId: string | null;
  declare colour: string | null;
  declare source: GarmentSource;
  declare vendor: string | null;
  declare costCents: number | null;
  declare rentalDueOn: string | null;
  /** Rented: the hire house's weekly rate, in cents of the production's currency. */
  declare rentalCostPerWeekCents: CreationOptional<number | null>;
  /** Owned garments: what happens at wrap (rented ones always go back). Null = not decided yet. */
  declare wrapDisposition: CreationOptional<WrapDisposition | null>;
  declare locationRack: string | null;
  declare locationBin: string | null;
  declare status: CreationOptional<GarmentStatus>;
  declare distressStage: CreationOptional<number>;
  declare multiplesGroupId: string | null;
  declare copyNumber: number | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare fabric?: NonAttribute<Fabric | null>;
  declare multiplesGroup?: NonAttribute<MultiplesGroup | null>;
}

Garment.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    tagCode: { type: DataTypes.STRING(16), allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    category: { type: DataTypes.STRING(40), allowNull: false },
    sizeLabel: { type: DataTypes.STRING(40), allowNull: true },
    fitIntent: { type: DataTypes.STRING(8), allowNull: false, defaultValue: "regular" },
    finishedMeasurements: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    fabricId: { type: DataTypes.UUID, allowNull: true },
    colour: { type: DataTypes.STRING(80), allowNull: true },
    source: { type: DataTypes.STRING(8), allowNull: false },
    vendor: { type: DataTypes.STRING(160), allowNull: true },
    costCents: { type: DataTypes.INTEGER, allowNull: true },
    rentalDueOn: { type: DataTypes.DATEONLY, allowNull: true },
    rentalCostPerWeekCents: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
    wrapDisposition: { type: DataTypes.STRING(4), allowNull: true, defaultValue: null, validate: { isIn: [["keep", "sell"]] } },
    locationRack: { type: DataTypes.STRING(40), allowNull: true },
    locationBin: { type: DataTypes.STRING(40), allowNull: true },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "in_stock" },
    distressStage: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    multiplesGroupId: { type: DataTypes.UUID, allowNull: true },
    copyNumber: { type: DataTypes.INTEGER, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "garments", modelName: "Garment", underscored: true },
);
