/** `npm run db:migrate`: applies pending migrations. */
import { prepareLocalEnv } from "./lib/local-env.js";

async function main() {
  const local = await prepareLocalEnv();
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  const done = await migrate(sequelize);
  console.log(done.length ? `Applied: ${done.join(", ")}` : "No pending migrations.");
  await sequelize.close();
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
