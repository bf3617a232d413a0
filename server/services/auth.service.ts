import { sequelize } from "../db.js";
import { config } from "../config.js";
import { PasswordReset, User } from "../models/index.js";
import { Limits } from "@shared/constants.js";
import { NotFoundError } from "../errors.js";
import { hashPassword, hashToken, newToken } from "../auth/passwords.js";
import { passwordResetEmail } from "../emails/password-reset.email.js";
import { sendMail } from "../lib/mailer.js";
import type { ResetPasswordInput } from "@shared/schemas/auth.js";

/**
 * Sends a single-use, expiring reset link when the address has an account. Answers the same either
 * way so addresses cannot be probed.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await User.findOne({ where: { email } });
  if (!user || !user.isActive) return;
  const { token, tokenHash } = newToken();
  await PasswordReset.create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + Limits.passwordResetMinutes * 60_000), usedAt: null });
  const mail = passwordResetEmail({ name: user.name, url: `${config.APP_URL}/reset-password/${token}`, minutes: Limits.passwordResetMinutes });
  await sendMail({ to: user.email, ...mail });
}

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
    await sequelize.query(`DELETE FROM session WHERE sess->'passport'->>'user' = :userId`, { replacements: { userId: user.id }, transaction });
    return user;
  });
}
