import { User } from "./User.js";
import { Production } from "./Production.js";
import { Membership } from "./Membership.js";
import { Invitation } from "./Invitation.js";
import { PasswordReset } from "./PasswordReset.js";
import { AuditEvent } from "./AuditEvent.js";
import { OutboxMessage } from "./OutboxMessage.js";
// Digital doubles
import { Panel } from "./Panel.js";
import { Seam } from "./Seam.js";
import { Marker } from "./Marker.js";
import { Packet } from "./Packet.js";
import { PacketRecipient } from "./PacketRecipient.js";

// Associations, grouped by owner.
Membership.belongsTo(User, { as: "user", foreignKey: "userId" });
Membership.belongsTo(Production, { as: "production", foreignKey: "productionId" });
User.hasMany(Membership, { as: "memberships", foreignKey: "userId" });
Production.hasMany(Membership, { as: "memberships", foreignKey: "productionId" });
Invitation.belongsTo(Production, { as: "production", foreignKey: "productionId" });
PasswordReset.belongsTo(User, { as: "user", foreignKey: "userId" });
// Digital doubles
Seam.belongsTo(Panel, { as: "panelA", foreignKey: "panelAId" });
Seam.belongsTo(Panel, { as: "panelB", foreignKey: "panelBId" });
Packet.hasMany(PacketRecipient, { as: "recipients", foreignKey: "packetId" });
PacketRecipient.belongsTo(Packet, { as: "packet", foreignKey: "packetId" });
PacketRecipient.belongsTo(User, { as: "user", foreignKey: "userId" });

export { User, Production, Membership, Invitation, PasswordReset, AuditEvent, OutboxMessage, Panel, Seam, Marker, Packet, PacketRecipient };
