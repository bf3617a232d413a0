import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** A real person in the cast (performer, stunt or photo double, understudy): personal data. */
export class Performer extends Model<InferAttributes<Performer>, InferCreationAttributes<Performer>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare name: string;
  declare email: string | null;
  declare phone: string | null;
  declare agentContact: string | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Performer.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false, validate: { len: [1, 160] } },
    email: { type: DataTypes.STRING, allowNull: true },
    phone: { type: DataTypes.STRING(40), allowNull: true },
    agentContact: { type: DataTypes.STRING(300), allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "performers", modelName: "Performer" },
);
