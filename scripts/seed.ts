/** `npm run seed`: loads or refreshes the demo data (idempotent: fixed ids, upserts). */
import { prepareLocalEnv } from "./lib/local-env.js";

async function main() {
  const local = await prepareLocalEnv();
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  await migrate(sequelize);
  const { seedDemo } = await import("../seeds/index.js");
  await seedDemo();
  console.log("Demo data loaded.");
  await sequelize.close();
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
