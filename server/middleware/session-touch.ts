import type { RequestHandler } from "express";

/** How often a signed-in session's expiry moves forward (and its row is re-saved). */
export const SESSION_TOUCH_INTERVAL_MS = 5 * 60_000;

declare module "express-session" {
  interface SessionData {
    /** When the session's expiry was last moved forward (ms since epoch). */
    touchedAt?: number;
  }
}

/**
 * Sliding expiry without a database write per request: the store's own touch is off, and a signed-in
 * session is marked changed at most every few minutes, which re-saves it with a fresh expiry and
 * re-sends the cookie. Between touches a request only reads the session.
 */
export const touchSessionNowAndThen: RequestHandler = (req, _res, next) => {
  const s = req.session as (typeof req.session & { passport?: { user?: unknown } }) | undefined;
  if (s?.passport?.user !== undefined && Date.now() - (s.touchedAt ?? 0) >= SESSION_TOUCH_INTERVAL_MS) s.touchedAt = Date.now();
  next();
};
