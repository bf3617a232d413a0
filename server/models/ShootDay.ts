import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { ShootDayScene } from "./ShootDayScene.js";

/** A dated shoot day (film/series) or a performance (stage, with a curtain time). */
export class ShootDay extends Model<InferAttributes<ShootDay>, InferCreationAttributes<ShootDay>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare dayNumber: number;
  declare date: string;
  declare kind: CreationOptional<"shoot" | "performance">;
  declare startsAt: string | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare dayScenes?: NonAttribute<ShootDayScene[]>;
}

ShootDay.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    dayNumber: { type: DataTypes.INTEGER, allowNull: false },
    date: { type: DataTypes.DATEONLY, allowNull: false },
    kind: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "shoot", validate: { isIn: [["shoot", "performance"]] } },
    startsAt: { type: DataTypes.TIME, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "shoot_days", modelName: "ShootDay" },
);
