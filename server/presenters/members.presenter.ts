import type { InvitationDto, MemberDto, OutboxMessageDto } from "@shared/schemas/members.js";
import type { Invitation, Membership, OutboxMessage } from "../models/index.js";

export function presentMember(m: Membership): MemberDto {
  return {
    id: m.id,
    userId: m.userId,
    name: m.user?.name ?? "",
    email: m.user?.email ?? "",
    role: m.role,
    joinedAt: m.createdAt.toISOString(),
  };
}

export function invitationStatus(i: Invitation, now = new Date()): InvitationDto["status"] {
  if (i.acceptedAt) return "accepted";
  if (i.revokedAt) return "revoked";
  if (i.expiresAt < now) return "expired";
  return "pending";
}

export function presentInvitation(i: Invitation): InvitationDto {
  return {
    id: i.id,
    email: i.email,
    role: i.role,
    expiresAt: i.expiresAt.toISOString(),
    createdAt: i.createdAt.toISOString(),
    status: invitationStatus(i),
  };
}

export function presentOutboxMessage(m: OutboxMessage): OutboxMessageDto {
  return {
    id: m.id,
    recipients: m.recipients,
    subject: m.subject,
    textBody: m.textBody,
    htmlBody: m.htmlBody,
    attachments: (m.attachments ?? []).map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.size })),
    receivedAt: m.receivedAt.toISOString(),
  };
}
