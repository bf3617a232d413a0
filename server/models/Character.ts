import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { Performer } from "./Performer.js";
import type { CharacterDouble } from "./CharacterDouble.js";

/** A role in the script, played by a performer. */
export class Character extends Model<InferAttributes<Character>, InferCreationAttributes<Character>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare name: string;
  declare performerId: string | null;
  declare sortOrder: CreationOptional<number>;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare performer?: NonAttribute<Performer | null>;
  declare doubles?: NonAttribute<CharacterDouble[]>;
}

Character.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false, validate: { len: [1, 160] } },
    performerId: { type: DataTypes.UUID, allowNull: true },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "characters", modelName: "Character" },
);
