import { Op } from "sequelize";
import { sequelize } from "../db.js";
import { config } from "../config.js";
import { Invitation, Membership, Production, User } from "../models/index.js";
import type { InviteMemberInput, UpdateMemberInput } from "@shared/schemas/members.js";
import type { AcceptInvitationInput, InvitationPreviewDto } from "@shared/schemas/auth.js";
import { Limits } from "@shared/constants.js";
import { ConflictError, NotFoundError, ValidationError } from "../errors.js";
import { hashPassword, hashToken, newToken } from "../auth/passwords.js";
import { invitationEmail } from "../emails/invitation.email.js";
import { sendMail } from "../lib/mailer.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

/** Members of the actor's production, by name. */
export async function listMembers(actor: Actor): Promise<Membership[]> {
  return Membership.findAll({
    where: { productionId: actor.productionId },
    include: [{ model: User, as: "user" }],
    order: [[{ model: User, as: "user" }, "name", "ASC"]],
  });
}

/** Open and past invitations of the production, newest first. */
export async function listInvitations(actor: Actor): Promise<Invitation[]> {
  return Invitation.findAll({ where: { productionId: actor.productionId }, order: [["createdAt", "DESC"]] });
}

/**
 * Invites someone by e-mail with a role. A pending invitation for the same address is replaced.
 * The e-mail goes out after commit; a failed send is logged and the invitation stays valid.
 */
export async function inviteMember(actor: Actor, input: InviteMemberInput): Promise<Invitation> {
  const { token, tokenHash } = newToken();
  const invitation = await sequelize.transaction(async (transaction) => {
    const existingUser = await User.findOne({ where: { email: input.email }, transaction });
    if (existingUser) {
      const member = await Membership.findOne({ where: { productionId: actor.productionId, userId: existingUser.id }, transaction });
      if (member) throw ConflictError("email: already a member of this production", { email: "is already a member of this production" });
    }
    await Invitation.update(
      { revokedAt: new Date() },
      { where: { productionId: actor.productionId, email: input.email, acceptedAt: null, revokedAt: null }, transaction },
    );
    const created = await Invitation.create(
      {
        productionId: actor.productionId,
        email: input.email,
        role: input.role,
        tokenHash,
        invitedBy: actor.user.id,
        expiresAt: new Date(Date.now() + Limits.invitationDays * 86_400_000),
        acceptedAt: null,
        revokedAt: null,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "member.invite",
        entityType: "invitation",
        entityId: created.id,
        after: { email: input.email, role: input.role },
      },
      transaction,
    );
    return created;
  });
  const production = await Production.findByPk(actor.productionId);
  const mail = invitationEmail({
    productionTitle: production?.title ?? "a production",
    role: input.role,
    inviterName: actor.user.name,
    url: `${config.APP_URL}/invitations/${token}`,
    days: Limits.invitationDays,
  });
  await sendMail({ to: input.email, ...mail }, { kind: "invitation", productionId: actor.productionId });
  return invitation;
}

/** Withdraws a pending invitation. */
export async function revokeInvitation(actor: Actor, invitationId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const inv = await Invitation.findOne({
      where: { id: invitationId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!inv) throw NotFoundError("Invitation not found.");
    if (inv.acceptedAt) throw ConflictError("That invitation was already accepted.");
    await inv.update({ revokedAt: new Date() }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "member.invitation_revoke",
        entityType: "invitation",
        entityId: inv.id,
      },
      transaction,
    );
  });
}

async function assertNotLastSupervisor(productionId: string, membership: Membership, transaction: import("sequelize").Transaction) {
  if (membership.role !== "supervisor") return;
  const supervisors = await Membership.count({ where: { productionId, role: "supervisor", id: { [Op.ne]: membership.id } }, transaction });
  if (supervisors === 0)
    throw ConflictError("A production needs at least one supervisor; make someone else supervisor first.", { role: "last supervisor" });
}

/** Changes a member's role (never leaving the production without a supervisor). */
export async function updateMemberRole(actor: Actor, membershipId: string, input: UpdateMemberInput): Promise<Membership> {
  return sequelize.transaction(async (transaction) => {
    const m = await Membership.findOne({
      where: { id: membershipId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!m) throw NotFoundError("Member not found.");
    if (input.role !== "supervisor") await assertNotLastSupervisor(actor.productionId, m, transaction);
    const before = { role: m.role };
    await m.update({ role: input.role }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "member.role_change",
        entityType: "membership",
        entityId: m.id,
        before,
        after: { role: input.role },
      },
      transaction,
    );
    await m.reload({ include: [{ model: User, as: "user" }], transaction });
    return m;
  });
}

/** Removes a member from the production (their account stays). */
export async function removeMember(actor: Actor, membershipId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const m = await Membership.findOne({
      where: { id: membershipId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!m) throw NotFoundError("Member not found.");
    await assertNotLastSupervisor(actor.productionId, m, transaction);
    await m.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "member.remove",
        entityType: "membership",
        entityId: m.id,
        before: { userId: m.userId, role: m.role },
      },
      transaction,
    );
  });
}

async function findUsableInvitation(token: string, transaction?: import("sequelize").Transaction) {
  // Row lock without the join: PostgreSQL refuses FOR UPDATE on the nullable side of an outer join.
  const inv = await Invitation.findOne({
    where: { tokenHash: hashToken(token) },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!inv || inv.revokedAt || inv.acceptedAt || inv.expiresAt < new Date()) {
    throw NotFoundError("This invitation link is not valid any more. Ask the supervisor for a new one.");
  }
  inv.production = (await Production.findByPk(inv.productionId, { transaction })) ?? undefined;
  return inv;
}

/** What an invitation link offers, before accepting. */
export async function previewInvitation(token: string): Promise<InvitationPreviewDto> {
  const inv = await findUsableInvitation(token);
  const user = await User.findOne({ where: { email: inv.email } });
  return { email: inv.email, role: inv.role, productionTitle: inv.production?.title ?? "", accountExists: Boolean(user?.passwordHash) };
}

/**
 * Accepts an invitation once. A new invitee chooses a name and password; an existing user must be
 * signed in as the invited address. Returns the user to sign in and the production joined.
 */
export async function acceptInvitation(
  input: AcceptInvitationInput,
  signedIn: User | undefined,
): Promise<{ user: User; productionId: string }> {
  return sequelize.transaction(async (transaction) => {
    const inv = await findUsableInvitation(input.token, transaction);
    let user = await User.findOne({ where: { email: inv.email }, transaction });
    if (user?.passwordHash) {
      if (!signedIn || signedIn.id !== user.id) {
        throw ConflictError("An account with this e-mail exists: sign in as that account, then open the link again.", {
          email: "sign in first",
        });
      }
    } else {
      if (!input.password) throw ValidationError("password: choose a password", { password: "choose a password" });
      if (!input.name && !user) throw ValidationError("name: is required", { name: "is required" });
      const passwordHash = await hashPassword(input.password);
      if (user) await user.update({ passwordHash, name: input.name ?? user.name }, { transaction });
      else user = await User.create({ email: inv.email, name: input.name!, passwordHash, lastProductionId: null }, { transaction });
    }
    const existing = await Membership.findOne({ where: { productionId: inv.productionId, userId: user.id }, transaction });
    if (!existing) await Membership.create({ productionId: inv.productionId, userId: user.id, role: inv.role }, { transaction });
    await inv.update({ acceptedAt: new Date() }, { transaction });
    await user.update({ lastProductionId: inv.productionId }, { transaction });
    await recordAudit(
      {
        productionId: inv.productionId,
        actorId: user.id,
        action: "member.join",
        entityType: "invitation",
        entityId: inv.id,
        after: { role: inv.role },
      },
      transaction,
    );
    return { user, productionId: inv.productionId };
  });
}
