import { sequelize } from "../db.js";
import { config } from "../config.js";
import { PasswordReset, User } from "../models/index.js";
import { Limits } from "@shared/constants.js";
import { NotFoundError } from "../errors.js";
import { hashPassword, hashToken, newToken } from "../auth/passwords.js";
import { passwordResetEmail } from "../emails/password-reset.email.js";
import { sendMailOrThrow } from "../lib/mailer.js";
import { defineJob, enqueue } from "../lib/jobs.js";
import type { ResetPasswordInput } from "@shared/schemas/auth.js";

export const PASSWORD_RESET_JOB = "password-reset-mail";

/**
 * Asks for a reset link. The request only queues the address: whether it has an account is decided
 * in the job, so the answer takes the same work (and time) for every address and none can be probed.
 * @param email already normalised (trimmed, lower case) by the request schema
 */
export async function requestPasswordReset(email: string): Promise<void> {
  await enqueue(PASSWORD_RESET_JOB, { email }, { inlineInBackground: true });
}

/** Job handler: sends a single-use, expiring reset link when the address has an active account. */
export async function sendPasswordReset(data: { email: string }): Promise<void> {
  const user = await User.findOne({ where: { email: data.email } });
  if (!user || !user.isActive) return;
  const { token, tokenHash } = newToken();
  await PasswordReset.create({
    userId: user.id,
    tokenHash,
    expiresAt: new Date(Date.now() + Limits.passwordResetMinutes * 60_000),
    usedAt: null,
  });
  const mail = passwordResetEmail({
    name: user.name,
    url: `${config.APP_URL}/reset-password/${token}`,
    minutes: Limits.passwordResetMinutes,
  });
  // Account mail: no production, so it never shows in any outbox.
  await sendMailOrThrow({ to: user.email, ...mail }, { kind: "password_reset", productionId: null });
}

defineJob<{ email: string }>(PASSWORD_RESET_JOB, { retryLimit: 3, retryDelay: 30, retryBackoff: true }, sendPasswordReset);

/** Sets a new password with a reset token; the token works once. */
export async function resetPassword(input: ResetPasswordInput): Promise<User> {
  return sequelize.transaction(async (transaction) => {
    const reset = await PasswordReset.findOne({ where: { tokenHash: hashToken(input.token) }, transaction, lock: transaction.LOCK.UPDATE });
    if (!reset || reset.usedAt || reset.expiresAt < new Date()) {
      throw NotFoundError("This reset link is not valid any more. Ask for a new one.");
    }
    const user = await User.findByPk(reset.userId, { transaction, rejectOnEmpty: true });
    await user.update({ passwordHash: await hashPassword(input.password) }, { transaction });
    await reset.update({ usedAt: new Date() }, { transaction });
    // Every other outstanding link for this account stops working too.
    await PasswordReset.update({ usedAt: new Date() }, { where: { userId: user.id, usedAt: null }, transaction });
    // Sign the account out everywhere else.
    await sequelize.query(`DELETE FROM session WHERE sess->'passport'->>'user' = :userId`, {
      replacements: { userId: user.id },
      transaction,
    });
    return user;
  });
}
