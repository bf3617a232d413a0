import { User } from "./User.js";
import { Production } from "./Production.js";
import { Membership } from "./Membership.js";
import { Invitation } from "./Invitation.js";
import { PasswordReset } from "./PasswordReset.js";
import { AuditEvent } from "./AuditEvent.js";
import { OutboxMessage } from "./OutboxMessage.js";
// Workroom feature.
import { Fitting } from "./Fitting.js";
import { AlterationTicket } from "./AlterationTicket.js";
import { WorkroomCapacity } from "./WorkroomCapacity.js";
import { WorkroomEmailJob } from "./WorkroomEmailJob.js";

// Associations, grouped by owner.
Membership.belongsTo(User, { as: "user", foreignKey: "userId" });
Membership.belongsTo(Production, { as: "production", foreignKey: "productionId" });
User.hasMany(Membership, { as: "memberships", foreignKey: "userId" });
Production.hasMany(Membership, { as: "memberships", foreignKey: "productionId" });
Invitation.belongsTo(Production, { as: "production", foreignKey: "productionId" });
PasswordReset.belongsTo(User, { as: "user", foreignKey: "userId" });
// Workroom feature (tables it owns; garments, performers and changes are read with SQL until their models merge).
AlterationTicket.belongsTo(Fitting, { as: "fitting", foreignKey: "fittingId" });
Fitting.hasMany(AlterationTicket, { as: "tickets", foreignKey: "fittingId" });
AlterationTicket.belongsTo(User, { as: "assignee", foreignKey: "assigneeId" });
WorkroomCapacity.belongsTo(User, { as: "user", foreignKey: "userId" });

export { User, Production, Membership, Invitation, PasswordReset, AuditEvent, OutboxMessage };
export { Fitting, AlterationTicket, WorkroomCapacity, WorkroomEmailJob };
