import { z } from "zod";
import { roles, type Role } from "../permissions.js";
import { emailSchema } from "./auth.js";

export const inviteMemberInputSchema = z.object({
  email: emailSchema,
  role: z.enum(roles, { message: "must be one of: " + roles.join(", ") }),
});
export type InviteMemberInput = z.infer<typeof inviteMemberInputSchema>;

export const updateMemberInputSchema = z.object({ role: z.enum(roles) });
export type UpdateMemberInput = z.infer<typeof updateMemberInputSchema>;

export interface MemberDto {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  createdAt: string;
  status: "pending" | "accepted" | "revoked" | "expired";
}

export interface OutboxMessageDto {
  id: string;
  recipients: string;
  subject: string;
  textBody: string | null;
  htmlBody: string | null;
  attachments: Array<{ filename: string | null; contentType: string; size: number }>;
  receivedAt: string;
}
