import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";
import type { ReportRunKind, ReportRunStatus } from "@shared/schemas/reports.js";

/** A long export (every continuity book in one ZIP): its progress, then its stored file. */
export class ReportRun extends Model<InferAttributes<ReportRun>, InferCreationAttributes<ReportRun>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare kind: ReportRunKind;
  declare status: CreationOptional<ReportRunStatus>;
  /** Items finished (books written) of `total`. */
  declare done: CreationOptional<number>;
  declare total: CreationOptional<number>;
  declare options: CreationOptional<Record<string, unknown>>;
  declare storageKey: string | null;
  declare bytes: number | null;
  declare error: string | null;
  declare requestedBy: string | null;
  declare finishedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ReportRun.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    kind: { type: DataTypes.STRING(30), allowNull: false },
    status: { type: DataTypes.STRING(8), allowNull: false, defaultValue: "queued" },
    done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    total: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    options: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    storageKey: { type: DataTypes.STRING(300), allowNull: true },
    // bigint comes back from pg as a string; files here stay far below 2^53 bytes.
    bytes: {
      type: DataTypes.BIGINT,
      allowNull: true,
      get() {
        const v = this.getDataValue("bytes");
        return v === null || v === undefined ? null : Number(v);
      },
    },
    error: { type: DataTypes.TEXT, allowNull: true },
    requestedBy: { type: DataTypes.UUID, allowNull: true },
    finishedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "report_runs", modelName: "ReportRun" },
);
