import { Router } from "express";
import { rateLimit, ipKeyGenerator } from "express-rate-limit";
import { passport } from "../auth/passport.js";
import { config } from "../config.js";
import {
  loginInputSchema,
  requestPasswordResetInputSchema,
  resetPasswordInputSchema,
  acceptInvitationInputSchema,
} from "@shared/schemas/auth.js";
import { AuthenticationError, HttpError } from "../errors.js";
import { listProductionsForUser } from "../services/productions.service.js";
import { requestPasswordReset, resetPassword } from "../services/auth.service.js";
import { acceptInvitation, previewInvitation } from "../services/members.service.js";
import { presentMe } from "../presenters/auth.presenter.js";
import { PostgresRateLimitStore } from "../lib/rate-limit-store.js";
import type { User } from "../models/User.js";
import type { Request, RequestHandler } from "express";
import type { LoginInput } from "@shared/schemas/auth.js";

export const authRouter = Router();

const tooMany = (message: string) => (_req: Request, _res: unknown, next: (err: unknown) => void) =>
  next(new HttpError(429, "too_many_requests", message));

// The e-mail is normalised once (trim, lower case: emailSchema) before both limiters and the sign-in
// read it, so " Designer@…" counts against the same account as "designer@…".
const parseLogin: RequestHandler = (req, _res, next) => {
  req.body = loginInputSchema.parse(req.body);
  next();
};

// Failed sign-ins per client address + account; successes do not count.
const accountLoginLimiter = rateLimit({
  windowMs: 15 * 60_000,
  limit: () => config.LOGIN_MAX_FAILURES,
  skipSuccessfulRequests: true,
  standardHeaders: "draft-8",
  legacyHeaders: false,
  keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? "")}|${(req.body as LoginInput).email}`,
  store: new PostgresRateLimitStore("login"),
  handler: tooMany("Too many failed sign-ins. Wait 15 minutes or reset your password."),
});

// Failed sign-ins per client address across every account (one client guessing many accounts).
const clientLoginLimiter = rateLimit({
  windowMs: 15 * 60_000,
  limit: () => config.LOGIN_MAX_FAILURES_PER_CLIENT,
  skipSuccessfulRequests: true,
  standardHeaders: "draft-8",
  legacyHeaders: false,
  keyGenerator: (req) => ipKeyGenerator(req.ip ?? ""),
  store: new PostgresRateLimitStore("login-client"),
  handler: tooMany("Too many failed sign-ins from this network. Wait 15 minutes and try again."),
});

const resetLimiter = rateLimit({
  windowMs: 60 * 60_000,
  limit: 5,
  standardHeaders: "draft-8",
  legacyHeaders: false,
  store: new PostgresRateLimitStore("reset"),
  handler: tooMany("Too many reset requests from this address. Try again in an hour."),
});

function logIn(req: Request, user: User): Promise<void> {
  return new Promise((resolve, reject) => req.login(user, (err) => (err ? reject(err) : resolve())));
}

async function meResponse(user: User) {
  return presentMe(user, await listProductionsForUser(user));
}

authRouter.post("/login", parseLogin, clientLoginLimiter, accountLoginLimiter, async (req, res, next) => {
  passport.authenticate("local", async (err: unknown, user: User | false) => {
    try {
      if (err) return next(err);
      if (!user) return next(new HttpError(401, "invalid_credentials", "That e-mail and password do not match an account."));
      await logIn(req, user);
      res.json({ data: await meResponse(user) });
    } catch (e) {
      next(e);
    }
  })(req, res, next);
});

authRouter.post("/logout", (req, res, next) => {
  req.logout((err) => {
    if (err) return next(err);
    req.session.destroy(() => {
      res.clearCookie("seamscene.sid");
      res.status(204).end();
    });
  });
});

authRouter.get("/me", async (req, res) => {
  if (!req.user) throw AuthenticationError();
  res.json({ data: await meResponse(req.user) });
});

authRouter.post("/password-reset", resetLimiter, async (req, res) => {
  const input = requestPasswordResetInputSchema.parse(req.body);
  await requestPasswordReset(input.email);
  res.status(202).json({ data: { message: "If that address has an account, a reset link is on its way." } });
});

authRouter.post("/password-reset/confirm", resetLimiter, async (req, res) => {
  const input = resetPasswordInputSchema.parse(req.body);
  const user = await resetPassword(input);
  await logIn(req, user);
  res.json({ data: await meResponse(user) });
});

export const invitationsPublicRouter = Router();

invitationsPublicRouter.get("/:token", async (req, res) => {
  res.json({ data: await previewInvitation(String(req.params.token)) });
});

invitationsPublicRouter.post("/accept", async (req, res) => {
  const input = acceptInvitationInputSchema.parse(req.body);
  const { user, productionId } = await acceptInvitation(input, req.user ?? undefined);
  if (!req.user || req.user.id !== user.id) await logIn(req, user);
  res.json({ data: { productionId, me: await meResponse(user) } });
});
