import type { Server } from "node:http";
import { config } from "./config.js";
import { createApp, closeAppResources } from "./app.js";
import { sequelize } from "./db.js";
import { migrate } from "./migrator.js";
import { logger } from "./lib/logger.js";
import { startJobs, stopJobs } from "./lib/jobs.js";
import { sweepStorage } from "./services/storage-sweep.service.js";

/** Migrates, then listens; closes cleanly on SIGINT/SIGTERM. */
export async function startServer(): Promise<Server> {
  await migrate(sequelize);
  const app = createApp();
  const server = app.listen(config.PORT, config.HOST);
  await new Promise<void>((resolve, reject) => {
    server.once("listening", () => resolve());
    server.once("error", reject);
  });
  // The job queue (workroom invitations and reminders); a failure to start it must not stop the app.
  await startJobs().catch((err) => logger.error({ err }, "job queue did not start; e-mails are sent inline"));
  // What a killed predecessor left behind (temp files, files without rows), in the background.
  void sweepStorage().catch((err: unknown) => logger.error({ err }, "storage sweep failed"));
  const shutdown = async () => {
    logger.info("shutting down");
    server.close();
    await stopJobs();
    await closeAppResources();
    await sequelize.close();
  };
  process.once("SIGTERM", () => void shutdown().then(() => process.exit(0)));
  process.once("SIGINT", () => void shutdown().then(() => process.exit(0)));
  return server;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  startServer().then(
    () => logger.info(`Seamscene listening on http://${config.HOST}:${config.PORT}`),
    (err) => {
      logger.error({ err }, "failed to start");
      process.exit(1);
    },
  );
}
