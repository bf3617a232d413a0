import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** A character in a scene wearing a change, with the state the scene requires. */
export class Appearance extends Model<InferAttributes<Appearance>, InferCreationAttributes<Appearance>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare sceneId: string;
  declare characterId: string;
  declare changeId: string | null;
  declare distressStage: CreationOptional<number>;
  declare wet: CreationOptional<boolean>;
  declare stunt: CreationOptional<boolean>;
  declare blood: CreationOptional<boolean>;
  declare vfxShot: CreationOptional<boolean>;
  declare changeHere: CreationOptional<boolean>;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Appearance.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    sceneId: { type: DataTypes.UUID, allowNull: false },
    characterId: { type: DataTypes.UUID, allowNull: false },
    changeId: { type: DataTypes.UUID, allowNull: true },
    distressStage: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0, validate: { min: 0, max: 10 } },
    wet: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    stunt: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    blood: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    vfxShot: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    changeHere: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "appearances", modelName: "Appearance" },
);
