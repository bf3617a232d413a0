import { z } from "zod";
import { nameSchema } from "./common.js";
import { Limits } from "../constants.js";
import type { Role } from "../permissions.js";

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: "must be an e-mail address" }));
export const passwordSchema = z
  .string()
  .min(Limits.passwordMin, `must be at least ${Limits.passwordMin} characters`)
  .max(Limits.passwordMax, `must be at most ${Limits.passwordMax} characters`);

export const loginInputSchema = z.object({
  email: emailSchema,
  password: z.string().min(1, "is required").max(Limits.passwordMax),
});
export type LoginInput = z.infer<typeof loginInputSchema>;

export const requestPasswordResetInputSchema = z.object({ email: emailSchema });
export type RequestPasswordResetInput = z.infer<typeof requestPasswordResetInputSchema>;

export const resetPasswordInputSchema = z.object({
  token: z.string().min(20).max(200),
  password: passwordSchema,
});
export type ResetPasswordInput = z.infer<typeof resetPasswordInputSchema>;

export const acceptInvitationInputSchema = z.object({
  token: z.string().min(20).max(200),
  /** Required when the invitee has no account yet. */
  name: nameSchema(120).optional(),
  password: passwordSchema.optional(),
});
export type AcceptInvitationInput = z.infer<typeof acceptInvitationInputSchema>;

export interface MembershipSummaryDto {
  productionId: string;
  title: string;
  kind: "film" | "series" | "stage";
  role: Role;
}

export interface MeDto {
  id: string;
  email: string;
  name: string;
  lastProductionId: string | null;
  memberships: MembershipSummaryDto[];
}

export interface InvitationPreviewDto {
  email: string;
  role: Role;
  productionTitle: string;
  /** True when an account with this e-mail exists (sign in instead of choosing a password). */
  accountExists: boolean;
}
