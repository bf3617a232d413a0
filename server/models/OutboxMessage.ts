import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "../db.js";

/** A message caught by the local SMTP fake (development and tests only). */
export class OutboxMessage extends Model<InferAttributes<OutboxMessage>, InferCreationAttributes<OutboxMessage>> {
  declare id: CreationOptional<string>;
  declare recipients: string;
  declare sender: string | null;
  declare subject: string;
  declare textBody: string | null;
  declare htmlBody: string | null;
  declare attachments: CreationOptional<Array<{ filename: string | null; contentType: string; size: number; content?: string }>>;
  declare receivedAt: CreationOptional<Date>;
  /** The production the mail was sent for; null for account mail (password resets) and older rows. */
  declare productionId: string | null;
  /** Why it was sent (server/lib/mailer.ts MailKind). */
  declare mailKind: string | null;
  /** Lower-cased addresses from the SMTP envelope: everyone who received it, Bcc included. */
  declare deliveredTo: CreationOptional<string[]>;
}

OutboxMessage.init(
  {
    id: { type: DataTypes.UUID, defaultValue: DataTypes.UUIDV4, primaryKey: true },
    recipients: { type: DataTypes.TEXT, allowNull: false },
    sender: { type: DataTypes.TEXT, allowNull: true },
    subject: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    textBody: { type: DataTypes.TEXT, allowNull: true },
    htmlBody: { type: DataTypes.TEXT, allowNull: true },
    attachments: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    receivedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    productionId: { type: DataTypes.UUID, allowNull: true },
    mailKind: { type: DataTypes.STRING(40), allowNull: true },
    deliveredTo: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
  },
  { sequelize, tableName: "outbox_messages", modelName: "OutboxMessage", timestamps: false },
);
