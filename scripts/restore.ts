/** `npm run restore FILE`: restores a backup into an empty database and storage (see scripts/lib/backup.ts). */
import path from "node:path";
import { prepareLocalEnv } from "./lib/local-env.js";
import { restoreBackup } from "./lib/backup.js";

async function main() {
  const file = process.argv[2];
  if (!file) throw new Error("Usage: npm run restore FILE   (a .tar written by npm run backup)");
  const local = await prepareLocalEnv();
  const { config } = await import("../server/config.js");
  const { getStorage } = await import("../server/lib/storage.js");
  const manifest = await restoreBackup(
    { databaseUrl: config.DATABASE_URL, storage: getStorage(), workDir: path.resolve(config.DATA_DIR, "tmp"), log: console.log },
    path.resolve(file),
  );
  console.log(
    `Restored the backup of ${manifest.createdAt}: database and ${manifest.files.length} stored files (${config.STORAGE_DRIVER}).`,
  );
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
