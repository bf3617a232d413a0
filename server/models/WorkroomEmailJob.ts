import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { EmailJobStatus } from "@shared/schemas/workroom.js";
import type { OutgoingMail } from "../lib/mailer.js";

export type WorkroomEmailKind = "fitting_invite" | "fitting_update" | "fitting_cancel" | "evening_reminder";

/** One workroom e-mail (fitting invitation or evening reminder): its rendered content and delivery state. */
export class WorkroomEmailJob extends Model<InferAttributes<WorkroomEmailJob>, InferCreationAttributes<WorkroomEmailJob>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare kind: WorkroomEmailKind;
  /** Unique per production: the same invitation or reminder is never queued twice. */
  declare dedupeKey: string;
  declare recipient: string;
  declare subject: string;
  declare payload: OutgoingMail;
  declare status: CreationOptional<EmailJobStatus>;
  declare attempts: CreationOptional<number>;
  declare lastError: CreationOptional<string | null>;
  declare sentAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

WorkroomEmailJob.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    dedupeKey: { type: DataTypes.STRING(200), allowNull: false },
    recipient: { type: DataTypes.STRING(320), allowNull: false },
    subject: { type: DataTypes.STRING(300), allowNull: false },
    payload: { type: DataTypes.JSONB, allowNull: false },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "pending" },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastError: { type: DataTypes.TEXT, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "workroom_email_jobs", modelName: "WorkroomEmailJob" },
);
