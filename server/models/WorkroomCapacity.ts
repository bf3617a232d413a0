import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import type { User } from "./User.js";
import { sequelize } from "../db.js";
import type { Weekday } from "@shared/domain/workroom.js";

/** One workroom member's hours per weekday and days off in one production. */
export class WorkroomCapacity extends Model<InferAttributes<WorkroomCapacity>, InferCreationAttributes<WorkroomCapacity>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare userId: string;
  declare hoursPerWeekday: Record<Weekday, number>;
  declare daysOff: CreationOptional<string[]>;
  declare user?: NonAttribute<User>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

WorkroomCapacity.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    userId: { type: DataTypes.UUID, allowNull: false },
    hoursPerWeekday: { type: DataTypes.JSONB, allowNull: false },
    daysOff: { type: DataTypes.ARRAY(DataTypes.DATEONLY), allowNull: false, defaultValue: [] },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "workroom_capacity", modelName: "WorkroomCapacity" },
);
