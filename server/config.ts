import os from "node:os";
import { z } from "zod";

/** Environment, parsed once. Nothing else in server/ reads process.env. */
const envSchema = z.object({
  NODE_ENV: z.enum(["development", "test", "production"]).default("development"),
  HOST: z.string().default("127.0.0.1"),
  PORT: z.coerce.number().int().default(3000),
  /** Public address used in e-mailed links. */
  APP_URL: z.string().url().default("http://127.0.0.1:3000"),
  DATABASE_URL: z.string().min(1).default("postgres://seamscene@127.0.0.1:5433/seamscene"),
  /** Signs session and CSRF cookies. Required in production (a long random value); a fixed one in development. */
  SESSION_SECRET: z.string().min(16, "must be at least 16 characters").optional(),
  /**
   * Trust the first proxy's X-Forwarded-* headers (HTTPS terminated in front of the app). Unset: trusted
   * when APP_URL is https and the app listens on loopback only, so the proxy is the only client.
   */
  TRUST_PROXY: z.stringbool().optional(),
  /** Secure cookies (sent over HTTPS only). Unset: on when APP_URL is https. */
  SECURE_COOKIES: z.stringbool().optional(),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_SECURE: z.stringbool().default(false),
  MAIL_FROM: z.string().default("Seamscene <no-reply@seamscene.invalid>"),
  /** Show the development outbox (messages caught by the local SMTP fake). */
  DEV_OUTBOX: z.stringbool().default(true),
  /** Private working folder (mode 0700): upload temp files, backup and restore staging. */
  DATA_DIR: z.string().default(".data"),
  STORAGE_DRIVER: z.enum(["disk", "s3"]).default("disk"),
  STORAGE_DIR: z.string().default(".data/storage"),
  S3_ENDPOINT: z.string().optional(),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().default("seamscene"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  /** Workroom: the department's local time zone (evening reminders, "today", calendar invitations' display). */
  TIME_ZONE: z.string().default("Europe/London"),
  /**
   * Starts the server's business clock at this date or date-time (ISO); time runs on from it. For tests
   * and reproducible demos only: sessions and tokens keep the real time. Unset = the wall clock.
   */
  CLOCK_AT: z.string().optional(),
  /** Workroom: start the PostgreSQL job queue (reminders, invitation e-mails) inside the server process. */
  JOBS_ENABLED: z.stringbool().default(true),
  LOG_LEVEL: z.enum(["fatal", "error", "warn", "info", "debug", "trace", "silent"]).default("info"),
  /**
   * Worker threads for CPU-heavy work (DXF reading, outline checks, packet ZIP and PDF building), so
   * requests keep being answered meanwhile. Default: one fewer than the machine's cores, 1 to 4.
   */
  WORKER_THREADS: z.coerce
    .number()
    .int()
    .min(1)
    .max(16)
    .default(Math.max(1, Math.min(4, os.availableParallelism() - 1))),
  /** Failed sign-ins allowed per client address and account in the window before requests are refused. */
  LOGIN_MAX_FAILURES: z.coerce.number().int().positive().default(10),
  /** Failed sign-ins allowed per client address across all accounts in the window (guessing many accounts). */
  LOGIN_MAX_FAILURES_PER_CLIENT: z.coerce.number().int().positive().default(50),
  /** Password hashes computed at once; the rest wait, so file reads keep libuv threads (see server/auth/passwords.ts). */
  HASH_CONCURRENCY: z.coerce.number().int().min(1).max(64).optional(),
  /** libuv's thread pool size, read by Node itself at the first file or crypto call; set by `npm start`. */
  UV_THREADPOOL_SIZE: z.coerce.number().int().min(1).max(1024).default(4),
});

/** The development default; refused in production. */
const DEVELOPMENT_SESSION_SECRET = "seamscene-development-session-secret";
const LOOPBACK_HOSTS = new Set(["127.0.0.1", "::1", "localhost"]);

/** Settings after defaults that depend on each other (APP_URL's scheme, production mode). */
export type Config = Omit<z.infer<typeof envSchema>, "SESSION_SECRET" | "TRUST_PROXY" | "SECURE_COOKIES"> & {
  SESSION_SECRET: string;
  TRUST_PROXY: boolean;
  SECURE_COOKIES: boolean;
  /** Strict-Transport-Security header (HTTPS only). */
  HSTS: boolean;
};

/** A setting the app refuses to start with; the message names the variable. */
export class ConfigError extends Error {}

/**
 * Parses and checks the environment. In production a real SESSION_SECRET is required, and an https
 * APP_URL means Secure cookies and HSTS.
 * @throws ConfigError listing each bad variable by name
 */
export function parseConfig(env: Record<string, string | undefined>): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    throw new ConfigError(`Configuration error:\n${parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n")}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === "production";
  const https = new URL(e.APP_URL).protocol === "https:";
  const problems: string[] = [];
  if (production) {
    if (
      !e.SESSION_SECRET ||
      e.SESSION_SECRET === DEVELOPMENT_SESSION_SECRET ||
      e.SESSION_SECRET.length < 32 ||
      new Set(e.SESSION_SECRET).size < 8
    ) {
      problems.push(
        "SESSION_SECRET: set a long random secret in production (at least 32 characters, e.g. the output of `openssl rand -base64 48`); the development default is public.",
      );
    }
    if (https && e.SECURE_COOKIES === false) problems.push("SECURE_COOKIES: cannot be false when APP_URL is https in production.");
  }
  if (problems.length) throw new ConfigError(`Configuration error:\n  ${problems.join("\n  ")}`);
  const secureCookies = e.SECURE_COOKIES ?? https;
  return {
    ...e,
    SESSION_SECRET: e.SESSION_SECRET ?? DEVELOPMENT_SESSION_SECRET,
    SECURE_COOKIES: secureCookies,
    TRUST_PROXY: e.TRUST_PROXY ?? (https && LOOPBACK_HOSTS.has(e.HOST)),
    HSTS: secureCookies && https,
    // The outbox shows caught development mail; a production server has none.
    DEV_OUTBOX: e.DEV_OUTBOX && !production,
  };
}

function loadConfig(): Config {
  try {
    return parseConfig(process.env);
  } catch (err) {
    if (!(err instanceof ConfigError)) throw err;
    // A plain message, no stack: this is the operator's to fix.
    console.error(err.message);
    process.exit(1);
  }
}

export const config: Config = loadConfig();
export const isProduction = config.NODE_ENV === "production";
/** Whether the development outbox exists (never in production). */
export const outboxEnabled = (): boolean => config.DEV_OUTBOX;
