import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { Scene } from "./Scene.js";

/** One scene scheduled on a shoot day, at a position in the day's order. */
export class ShootDayScene extends Model<InferAttributes<ShootDayScene>, InferCreationAttributes<ShootDayScene>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare shootDayId: string;
  declare sceneId: string;
  declare position: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare scene?: NonAttribute<Scene>;
}

ShootDayScene.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    shootDayId: { type: DataTypes.UUID, allowNull: false },
    sceneId: { type: DataTypes.UUID, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "shoot_day_scenes", modelName: "ShootDayScene" },
);
