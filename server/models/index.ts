import { User } from "./User.js";
import { Production } from "./Production.js";
import { Membership } from "./Membership.js";
import { Invitation } from "./Invitation.js";
import { PasswordReset } from "./PasswordReset.js";
import { AuditEvent } from "./AuditEvent.js";
import { OutboxMessage } from "./OutboxMessage.js";
import { SnagDismissal } from "./SnagDismissal.js";

// Associations, grouped by owner.
Membership.belongsTo(User, { as: "user", foreignKey: "userId" });
Membership.belongsTo(Production, { as: "production", foreignKey: "productionId" });
User.hasMany(Membership, { as: "memberships", foreignKey: "userId" });
Production.hasMany(Membership, { as: "memberships", foreignKey: "productionId" });
Invitation.belongsTo(Production, { as: "production", foreignKey: "productionId" });
PasswordReset.belongsTo(User, { as: "user", foreignKey: "userId" });
// Snags
SnagDismissal.belongsTo(User, { as: "dismisser", foreignKey: "dismissedBy" });

export { User, Production, Membership, Invitation, PasswordReset, AuditEvent, OutboxMessage, SnagDismissal };
