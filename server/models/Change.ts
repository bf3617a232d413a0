import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { ChangeItem } from "./ChangeItem.js";

export type ChangeApproval = "draft" | "proposed" | "approved";

/** One numbered costume change of one character. */
export class Change extends Model<InferAttributes<Change>, InferCreationAttributes<Change>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare characterId: string;
  declare number: number;
  declare description: string | null;
  declare storyDayFrom: number | null;
  declare storyDayTo: number | null;
  declare approval: CreationOptional<ChangeApproval>;
  declare approvedBy: string | null;
  declare approvedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare items?: NonAttribute<ChangeItem[]>;
}

Change.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    characterId: { type: DataTypes.UUID, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false, validate: { min: 1 } },
    description: { type: DataTypes.TEXT, allowNull: true },
    storyDayFrom: { type: DataTypes.INTEGER, allowNull: true },
    storyDayTo: { type: DataTypes.INTEGER, allowNull: true },
    approval: {
      type: DataTypes.STRING(10),
      allowNull: false,
      defaultValue: "draft",
      validate: { isIn: [["draft", "proposed", "approved"]] },
    },
    approvedBy: { type: DataTypes.UUID, allowNull: true },
    approvedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "changes", modelName: "Change" },
);
