import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute } from "sequelize";
import { sequelize } from "../db.js";
import type { Role } from "@shared/permissions.js";
import type { Production } from "./Production.js";

/** An e-mailed invitation to join a production with a role; the token is stored hashed. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare productionId: string;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedBy: string | null;
  declare expiresAt: Date;
  declare acceptedAt: Date | null;
  declare revokedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare production?: NonAttribute<Production>;
}

Invitation.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    productionId: { type: DataTypes.UUID, allowNull: false },
    email: { type: DataTypes.CITEXT, allowNull: false },
    role: { type: DataTypes.STRING(20), allowNull: false },
    tokenHash: { type: DataTypes.CHAR(64), allowNull: false },
    invitedBy: { type: DataTypes.UUID, allowNull: true },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    acceptedAt: { type: DataTypes.DATE, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "invitations", modelName: "Invitation" },
);
