import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** A scene of the script; story_order is also the stage running order. */
export class Scene extends Model<InferAttributes<Scene>, InferCreationAttributes<Scene>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare number: string;
  declare setName: string | null;
  declare intExt: "INT" | "EXT" | "INT/EXT" | null;
  declare timeOfDay: string | null;
  declare storyDay: number | null;
  declare storyOrder: number;
  declare lengthEighths: number | null;
  /** numeric(6,2): pg returns a string; the presenter turns it into a number. */
  declare runningMinutes: string | number | null;
  declare synopsis: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Scene.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    number: { type: DataTypes.STRING(12), allowNull: false },
    setName: { type: DataTypes.STRING(200), allowNull: true },
    intExt: { type: DataTypes.STRING(7), allowNull: true, validate: { isIn: [["INT", "EXT", "INT/EXT"]] } },
    timeOfDay: { type: DataTypes.STRING(20), allowNull: true },
    storyDay: { type: DataTypes.INTEGER, allowNull: true },
    storyOrder: { type: DataTypes.INTEGER, allowNull: false },
    lengthEighths: { type: DataTypes.INTEGER, allowNull: true, validate: { min: 0 } },
    runningMinutes: { type: DataTypes.DECIMAL(6, 2), allowNull: true },
    synopsis: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "scenes", modelName: "Scene" },
);
