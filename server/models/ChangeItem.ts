import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** One piece of a change (jacket, shirt, boots…), pointing at a garment or a multiples group. */
export class ChangeItem extends Model<InferAttributes<ChangeItem>, InferCreationAttributes<ChangeItem>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare changeId: string;
  declare label: string;
  declare garmentId: string | null;
  declare multiplesGroupId: string | null;
  declare sortOrder: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ChangeItem.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    changeId: { type: DataTypes.UUID, allowNull: false },
    label: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
    garmentId: { type: DataTypes.UUID, allowNull: true },
    multiplesGroupId: { type: DataTypes.UUID, allowNull: true },
    sortOrder: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "change_items", modelName: "ChangeItem" },
);
