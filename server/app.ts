import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import express, { type Express, type RequestHandler } from "express";
import helmet from "helmet";
import compression from "compression";
import session from "express-session";
import connectPgSimple from "connect-pg-simple";
import pg from "pg";
import cookieParser from "cookie-parser";
import { csrfSync } from "csrf-sync";
import { config, isProduction } from "./config.js";
import { logger } from "./lib/logger.js";
import { loggablePath, requestLog } from "./middleware/request-log.js";
import { passport } from "./auth/passport.js";
import { buildApiRouter } from "./routes/index.js";
import { apiNotFound, errorHandler } from "./middleware/error-handler.js";
import { HttpError } from "./errors.js";
import { touchSessionNowAndThen } from "./middleware/session-touch.js";
import { closeWorkerPool } from "./lib/worker-pool.js";
import { healthRouter } from "./routes/health.routes.js";

const rootDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

let sessionPool: pg.Pool | undefined;
const CSRF_COOKIE = "seamscene.csrf";

/**
 * The session store's own pool. An idle client whose server goes away emits "error" on the pool;
 * without a listener that would end the process, so it is logged and the pool opens new clients later.
 */
function createSessionPool(): pg.Pool {
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 5, connectionTimeoutMillis: 5000 });
  pool.on("error", (err) =>
    logger.warn({ err: { message: err.message, code: (err as { code?: string }).code } }, "session store connection lost"),
  );
  return pool;
}

/**
 * express-session saves or touches the session while the answer is being written, and reports a
 * failure (the database went away) by calling `next` a second time. By then the answer is out and
 * Express's request pipeline has finished, so that call would end in Express's default handler,
 * which prints the error and cuts the keep-alive connection under the next request. Log it instead.
 */
function lateErrorsLogged(mw: RequestHandler): RequestHandler {
  return (req, res, next) =>
    mw(req, res, (err?: unknown) => {
      if (err && res.headersSent) {
        logger.warn(
          { method: req.method, path: loggablePath(req.originalUrl), reason: (err as Error)?.message },
          "session store failed after the response was sent",
        );
        return;
      }
      next(err);
    });
}

/** Builds the Express app. Never listens (server/index.ts does), so tests use it with supertest. */
export function createApp(): Express {
  const app = express();
  app.disable("x-powered-by");
  if (config.TRUST_PROXY) app.set("trust proxy", 1);

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          imgSrc: ["'self'", "data:", "blob:"],
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'", "data:"],
          connectSrc: ["'self'"],
          upgradeInsecureRequests: config.HSTS ? [] : null,
        },
      },
      // HTTPS only for a year once seen over https (APP_URL https); never on plain http.
      strictTransportSecurity: config.HSTS ? { maxAge: 31_536_000, includeSubDomains: false } : false,
    }),
  );
  // gzip or brotli for JSON, CSV and the client's text assets (images and ZIPs are left as they are).
  app.use(compression({ threshold: 1024 }));
  app.use("/api", requestLog);

  app.use(express.json({ limit: "2mb" }));

  app.use("/api", healthRouter);

  sessionPool ??= createSessionPool();
  const PgStore = connectPgSimple(session);
  app.use(
    lateErrorsLogged(
      session({
        name: "seamscene.sid",
        // No touch per request: touchSessionNowAndThen moves the expiry at most every few minutes.
        store: new PgStore({
          pool: sessionPool,
          tableName: "session",
          createTableIfMissing: false,
          pruneSessionInterval: isProduction ? 900 : false,
          disableTouch: true,
          errorLog: (...args: unknown[]) => logger.warn({ detail: args.map(String).join(" ") }, "session store error"),
        }),
        secret: config.SESSION_SECRET,
        resave: false,
        saveUninitialized: false,
        rolling: false,
        cookie: { httpOnly: true, sameSite: "lax", secure: config.SECURE_COOKIES, maxAge: 14 * 86_400_000 },
      }),
    ),
  );
  app.use(touchSessionNowAndThen);
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(cookieParser(config.SESSION_SECRET));

  // Signed-out visitors get no session row (saveUninitialized: false): their CSRF token lives in a
  // signed, HttpOnly cookie instead. Signed-in people keep it in their session.
  const csrfCookie = { httpOnly: true, sameSite: "lax", secure: config.SECURE_COOKIES, signed: true, path: "/api" } as const;
  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.headers["x-csrf-token"] as string | undefined,
    getTokenFromState: (req) => (req.user ? req.session.csrfToken : (req.signedCookies?.[CSRF_COOKIE] as string | undefined) || undefined),
    storeTokenInState: (req, token) => {
      if (req.user) req.session.csrfToken = token;
      else if (token) req.res?.cookie(CSRF_COOKIE, token, csrfCookie);
      else req.res?.clearCookie(CSRF_COOKIE, csrfCookie);
    },
    errorConfig: { statusCode: 403, message: "csrf token invalid", code: "EBADCSRFTOKEN" },
  });
  app.get("/api/auth/csrf", (req, res) => {
    res.json({ token: generateToken(req, true) });
  });
  app.use("/api", (req, res, next) => {
    csrfSynchronisedProtection(req, res, (err?: unknown) => {
      if (err) return next(new HttpError(403, "csrf_invalid", "The security token is missing or expired; reload the page and try again."));
      next();
    });
  });

  app.use("/api", buildApiRouter());
  app.use("/api", apiNotFound);

  serveBuiltClient(app, path.join(rootDir, "dist"));

  app.use(errorHandler);
  return app;
}

/** Vite writes only content-hashed file names under dist/assets (index-3fA9_x2Q.js, fonts, maps). */
function isHashedAsset(distDir: string, filePath: string): boolean {
  return path.relative(distDir, filePath).startsWith(`assets${path.sep}`);
}

/**
 * The built client, with index.html for every other GET (client-side routes). Hashed assets are
 * cached for a year; index.html and other files are revalidated so a new release shows at once.
 */
export function serveBuiltClient(app: Express, distDir: string): void {
  if (!fs.existsSync(path.join(distDir, "index.html"))) return;
  app.use(
    express.static(distDir, {
      index: false,
      setHeaders: (res, filePath) => {
        res.setHeader("Cache-Control", isHashedAsset(distDir, filePath) ? "public, max-age=31536000, immutable" : "no-cache");
      },
    }),
  );
  app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(distDir, "index.html"), { headers: { "Cache-Control": "no-cache" } }));
}

/** Closes the session store's pool and the worker threads (tests and shutdown). */
export async function closeAppResources(): Promise<void> {
  await sessionPool?.end();
  sessionPool = undefined;
  await closeWorkerPool();
}
