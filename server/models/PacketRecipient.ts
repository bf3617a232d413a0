import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { User } from "./User.js";

/** A vfx user a packet version was published to: when they were told, downloaded it and marked it received. */
export class PacketRecipient extends Model<InferAttributes<PacketRecipient>, InferCreationAttributes<PacketRecipient>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare packetId: string;
  declare userId: string;
  declare notifiedAt: Date | null;
  declare downloadedAt: Date | null;
  declare receivedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare user?: NonAttribute<User>;
}

PacketRecipient.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    packetId: { type: DataTypes.UUID, allowNull: false },
    userId: { type: DataTypes.UUID, allowNull: false },
    notifiedAt: { type: DataTypes.DATE, allowNull: true },
    downloadedAt: { type: DataTypes.DATE, allowNull: true },
    receivedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "packet_recipients", modelName: "PacketRecipient" },
);
