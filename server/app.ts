import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import express, { type Express, type RequestHandler } from "express";
import helmet from "helmet";
import session from "express-session";
import connectPgSimple from "connect-pg-simple";
import pg from "pg";
import { pinoHttp } from "pino-http";
import { csrfSync } from "csrf-sync";
import { config, isProduction } from "./config.js";
import { logger } from "./lib/logger.js";
import { passport } from "./auth/passport.js";
import { buildApiRouter } from "./routes/index.js";
import { apiNotFound, errorHandler } from "./middleware/error-handler.js";
import { HttpError } from "./errors.js";
import { closeWorkerPool } from "./lib/worker-pool.js";
import { healthRouter } from "./routes/health.routes.js";

const rootDir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

let sessionPool: pg.Pool | undefined;

/**
 * The session store's own pool. An idle client whose server goes away emits "error" on the pool;
 * without a listener that would end the process, so it is logged and the pool opens new clients later.
 */
function createSessionPool(): pg.Pool {
  const pool = new pg.Pool({ connectionString: config.DATABASE_URL, max: 5, connectionTimeoutMillis: 5000 });
  pool.on("error", (err) => logger.warn({ err: { message: err.message, code: (err as { code?: string }).code } }, "session store connection lost"));
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
        logger.warn({ url: req.originalUrl, reason: (err as Error)?.message }, "session store failed after the response was sent");
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
          upgradeInsecureRequests: config.SECURE_COOKIES ? [] : null,
        },
      },
      strictTransportSecurity: config.SECURE_COOKIES,
    }),
  );
  if (config.NODE_ENV !== "test") app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith("/api") } }));

  app.use(express.json({ limit: "2mb" }));

  app.use("/api", healthRouter);

  sessionPool ??= createSessionPool();
  const PgStore = connectPgSimple(session);
  app.use(
    lateErrorsLogged(session({
      name: "seamscene.sid",
      store: new PgStore({
        pool: sessionPool,
        tableName: "session",
        createTableIfMissing: false,
        pruneSessionInterval: isProduction ? 900 : false,
        errorLog: (...args: unknown[]) => logger.warn({ detail: args.map(String).join(" ") }, "session store error"),
      }),
      secret: config.SESSION_SECRET,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: "lax", secure: config.SECURE_COOKIES, maxAge: 14 * 86_400_000 },
    })),
  );
  app.use(passport.initialize());
  app.use(passport.session());

  const { csrfSynchronisedProtection, generateToken } = csrfSync({
    getTokenFromRequest: (req) => req.headers["x-csrf-token"] as string | undefined,
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

  // The built client, with index.html for every other GET (client-side routes).
  const distDir = path.join(rootDir, "dist");
  if (fs.existsSync(path.join(distDir, "index.html"))) {
    app.use(express.static(distDir, { index: false, maxAge: "1h" }));
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(distDir, "index.html")));
  }

  app.use(errorHandler);
  return app;
}

/** Closes the session store's pool and the worker threads (tests and shutdown). */
export async function closeAppResources(): Promise<void> {
  await sessionPool?.end();
  sessionPool = undefined;
  await closeWorkerPool();
}
