import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { GarmentStatus } from "@shared/schemas/garments.js";
import type { User } from "./User.js";

/** One move of a garment: who, when, from which status/location to which, and why. */
export class GarmentStatusEvent extends Model<InferAttributes<GarmentStatusEvent>, InferCreationAttributes<GarmentStatusEvent>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare garmentId: string;
  declare fromStatus: GarmentStatus | null;
  declare toStatus: GarmentStatus;
  declare fromLocation: string | null;
  declare toLocation: string | null;
  declare note: string | null;
  declare actorId: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare actor?: NonAttribute<User | null>;
}

GarmentStatusEvent.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    garmentId: { type: DataTypes.UUID, allowNull: false },
    fromStatus: { type: DataTypes.STRING(10), allowNull: true },
    toStatus: { type: DataTypes.STRING(10), allowNull: false },
    fromLocation: { type: DataTypes.STRING(90), allowNull: true },
    toLocation: { type: DataTypes.STRING(90), allowNull: true },
    note: { type: DataTypes.TEXT, allowNull: true },
    actorId: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "garment_status_events", modelName: "GarmentStatusEvent", underscored: true },
);
