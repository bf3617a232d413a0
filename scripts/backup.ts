/** `npm run backup [-- --out FILE]`: database and stored files in one archive (see scripts/lib/backup.ts). */
import path from "node:path";
import { prepareLocalEnv } from "./lib/local-env.js";
import { createBackup } from "./lib/backup.js";

async function main() {
  const outArg = process.argv.indexOf("--out");
  const local = await prepareLocalEnv();
  const { config } = await import("../server/config.js");
  const { getStorage } = await import("../server/lib/storage.js");
  const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\..*$/, "").replace("T", "-");
  const out = path.resolve(
    outArg > 0 && process.argv[outArg + 1] ? process.argv[outArg + 1]! : path.join(config.DATA_DIR, "backups", `seamscene-${stamp}.tar`),
  );
  const manifest = await createBackup(
    { databaseUrl: config.DATABASE_URL, storage: getStorage(), workDir: path.resolve(config.DATA_DIR, "tmp"), log: console.log },
    out,
  );
  console.log(
    `Backup written: ${out}\n  database ${manifest.database.bytes} bytes, ${manifest.files.length} stored files, schema ${manifest.schema ?? "unknown"}`,
  );
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
