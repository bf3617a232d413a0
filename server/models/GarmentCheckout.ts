import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { CheckoutToKind } from "@shared/schemas/garments.js";
import type { User } from "./User.js";
import type { ShootDay } from "./ShootDay.js";
import type { Scene } from "./Scene.js";
import type { Garment } from "./Garment.js";

/** A garment given to a member or performer for a shoot day / scene, due back on a date; open until returned. */
export class GarmentCheckout extends Model<InferAttributes<GarmentCheckout>, InferCreationAttributes<GarmentCheckout>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare garmentId: string;
  declare toKind: CheckoutToKind;
  declare toUserId: string | null;
  declare toPerformerId: string | null;
  declare toName: string;
  declare shootDayId: string | null;
  declare sceneId: string | null;
  declare dueBackOn: string;
  declare note: string | null;
  declare checkedOutAt: Date;
  declare checkedOutBy: string | null;
  declare returnedAt: Date | null;
  declare returnedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare shootDay?: NonAttribute<ShootDay | null>;
  declare scene?: NonAttribute<Scene | null>;
  declare checkedOutByUser?: NonAttribute<User | null>;
  declare garment?: NonAttribute<Garment | null>;
}

GarmentCheckout.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    garmentId: { type: DataTypes.UUID, allowNull: false },
    toKind: { type: DataTypes.STRING(9), allowNull: false },
    toUserId: { type: DataTypes.UUID, allowNull: true },
    toPerformerId: { type: DataTypes.UUID, allowNull: true },
    toName: { type: DataTypes.STRING(160), allowNull: false },
    shootDayId: { type: DataTypes.UUID, allowNull: true },
    sceneId: { type: DataTypes.UUID, allowNull: true },
    dueBackOn: { type: DataTypes.DATEONLY, allowNull: false },
    note: { type: DataTypes.TEXT, allowNull: true },
    checkedOutAt: { type: DataTypes.DATE, allowNull: false },
    checkedOutBy: { type: DataTypes.UUID, allowNull: true },
    returnedAt: { type: DataTypes.DATE, allowNull: true },
    returnedBy: { type: DataTypes.UUID, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "garment_checkouts", modelName: "GarmentCheckout", underscored: true },
);
