import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import type { User } from "./User.js";
import { sequelize } from "../db.js";
import type { AlterationTask, TicketStatus } from "@shared/schemas/workroom.js";

// numeric columns come back from pg as strings; expose numbers.
const numeric = (name: string) => ({
  type: DataTypes.DECIMAL(6, 2),
  get(this: Model) {
    const v = this.getDataValue(name) as string | number | null;
    return v === null || v === undefined ? null : Number(v);
  },
});

/** Work on one garment: tasks, estimate, assignee and status; the due date is derived from the schedule. */
export class AlterationTicket extends Model<InferAttributes<AlterationTicket>, InferCreationAttributes<AlterationTicket>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare garmentId: string;
  declare fittingId: string | null;
  declare tasks: AlterationTask[];
  declare estimateHours: number;
  declare remainingHours: number | null;
  declare assigneeId: string | null;
  declare status: CreationOptional<TicketStatus>;
  declare raisedOn: string;
  declare raisedBy: string | null;
  declare garmentStatusBefore: string | null;
  declare doneAt: CreationOptional<Date | null>;
  declare checkedAt: CreationOptional<Date | null>;
  declare checkedBy: CreationOptional<string | null>;
  declare notes: string | null;
  declare assignee?: NonAttribute<User>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

AlterationTicket.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    garmentId: { type: DataTypes.UUID, allowNull: false },
    fittingId: { type: DataTypes.UUID, allowNull: true },
    tasks: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    estimateHours: { ...numeric("estimateHours"), allowNull: false },
    remainingHours: { ...numeric("remainingHours"), allowNull: true },
    assigneeId: { type: DataTypes.UUID, allowNull: true },
    status: {
      type: DataTypes.STRING(12),
      allowNull: false,
      defaultValue: "waiting",
      validate: { isIn: [["waiting", "in_progress", "done", "checked"]] },
    },
    raisedOn: { type: DataTypes.DATEONLY, allowNull: false },
    raisedBy: { type: DataTypes.UUID, allowNull: true },
    garmentStatusBefore: { type: DataTypes.STRING(10), allowNull: true },
    doneAt: { type: DataTypes.DATE, allowNull: true },
    checkedAt: { type: DataTypes.DATE, allowNull: true },
    checkedBy: { type: DataTypes.UUID, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "alteration_tickets", modelName: "AlterationTicket" },
);
