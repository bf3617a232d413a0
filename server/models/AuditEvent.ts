import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** Who changed what, when, before and after. Written in the same transaction as the change. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare productionId: string | null;
  declare actorId: string | null;
  declare action: string;
  declare entityType: string;
  declare entityId: string | null;
  declare before: unknown;
  declare after: unknown;
  declare createdAt: CreationOptional<Date>;
}

AuditEvent.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: true },
    actorId: { type: DataTypes.UUID, allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    entityType: { type: DataTypes.STRING(40), allowNull: false },
    entityId: { type: DataTypes.UUID, allowNull: true },
    before: { type: DataTypes.JSONB, allowNull: true },
    after: { type: DataTypes.JSONB, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "audit_events", modelName: "AuditEvent", updatedAt: false },
);
