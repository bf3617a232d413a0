import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { FittingStatus } from "@shared/schemas/workroom.js";

/** A booked fitting of one performer (usually for one change); carries its calendar uid and sequence. */
export class Fitting extends Model<InferAttributes<Fitting>, InferCreationAttributes<Fitting>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare performerId: string;
  declare changeId: string | null;
  declare startsAt: Date;
  declare durationMinutes: number;
  declare room: string | null;
  declare attendeeIds: CreationOptional<string[]>;
  declare notes: string | null;
  declare outcome: CreationOptional<string | null>;
  declare status: CreationOptional<FittingStatus>;
  declare icsUid: string;
  declare icsSequence: CreationOptional<number>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Fitting.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    performerId: { type: DataTypes.UUID, allowNull: false },
    changeId: { type: DataTypes.UUID, allowNull: true },
    startsAt: { type: DataTypes.DATE, allowNull: false },
    durationMinutes: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 5, max: 480 } },
    room: { type: DataTypes.STRING(120), allowNull: true },
    attendeeIds: { type: DataTypes.ARRAY(DataTypes.UUID), allowNull: false, defaultValue: [] },
    notes: { type: DataTypes.TEXT, allowNull: true },
    outcome: { type: DataTypes.TEXT, allowNull: true },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "booked", validate: { isIn: [["booked", "done", "cancelled"]] } },
    icsUid: { type: DataTypes.STRING(120), allowNull: false },
    icsSequence: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "fittings", modelName: "Fitting" },
);
