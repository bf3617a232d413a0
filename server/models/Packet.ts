import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { PacketContents, PacketSelection } from "@shared/schemas/packets.js";
import type { PacketRecipient } from "./PacketRecipient.js";

/**
 * A handoff packet for one character's change: a draft while being prepared, then an immutable,
 * numbered version whose contents snapshot and ZIP never change (enforced by a database trigger).
 */
export class Packet extends Model<InferAttributes<Packet>, InferCreationAttributes<Packet>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare characterId: string;
  declare changeId: string;
  declare version: number | null;
  declare status: "draft" | "published";
  declare selection: PacketSelection;
  declare includeMeasurements: boolean;
  declare notes: string | null;
  declare contents: PacketContents | null;
  declare preparedBy: string | null;
  declare publishedBy: string | null;
  declare publishedAt: Date | null;
  declare zipSha256: string | null;
  declare zipBytes: number | null;
  declare zipStorageKey: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare recipients?: NonAttribute<PacketRecipient[]>;
}

Packet.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    characterId: { type: DataTypes.UUID, allowNull: false },
    changeId: { type: DataTypes.UUID, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: true },
    status: { type: DataTypes.STRING(9), allowNull: false, defaultValue: "draft" },
    selection: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    includeMeasurements: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: true },
    contents: { type: DataTypes.JSONB, allowNull: true },
    preparedBy: { type: DataTypes.UUID, allowNull: true },
    publishedBy: { type: DataTypes.UUID, allowNull: true },
    publishedAt: { type: DataTypes.DATE, allowNull: true },
    zipSha256: { type: DataTypes.CHAR(64), allowNull: true },
    zipBytes: {
      type: DataTypes.BIGINT,
      allowNull: true,
      get(this: Packet) {
        const v = this.getDataValue("zipBytes");
        return v === null || v === undefined ? null : Number(v);
      },
    },
    zipStorageKey: { type: DataTypes.STRING(300), allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "packets", modelName: "Packet" },
);
