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
  SESSION_SECRET: z.string().min(16).default("seamscene-development-session-secret"),
  /** Set when the app is served over HTTPS (cookies become Secure). */
  TRUST_PROXY: z.stringbool().default(false),
  SECURE_COOKIES: z.stringbool().default(false),
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
  WORKER_THREADS: z.coerce.number().int().min(1).max(16).default(Math.max(1, Math.min(4, os.availableParallelism() - 1))),
  /** Failed sign-ins allowed per address and account in the window before requests are refused. */
  LOGIN_MAX_FAILURES: z.coerce.number().int().positive().default(10),
});

export type Config = z.infer<typeof envSchema>;

export const config: Config = envSchema.parse(process.env);
export const isProduction = config.NODE_ENV === "production";
