import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { Performer } from "./Performer.js";

export type DoubleKind = "stunt" | "photo" | "understudy";

/** A performer who stands in for a character: stunt or photo double, or (stage) understudy. */
export class CharacterDouble extends Model<InferAttributes<CharacterDouble>, InferCreationAttributes<CharacterDouble>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare characterId: string;
  declare performerId: string;
  declare kind: DoubleKind;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare performer?: NonAttribute<Performer>;
}

CharacterDouble.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    characterId: { type: DataTypes.UUID, allowNull: false },
    performerId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.STRING(12), allowNull: false, validate: { isIn: [["stunt", "photo", "understudy"]] } },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "character_doubles", modelName: "CharacterDouble" },
);
