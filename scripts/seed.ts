/**
 * `npm run seed`: loads or refreshes the demo data (idempotent: fixed ids, upserts), anchored to today.
 * `npm run seed -- --today 2027-03-01` anchors it to another day (reproducible screenshots and tests).
 */
import { parseArgs } from "node:util";
import { prepareLocalEnv } from "./lib/local-env.js";

async function main() {
  const { values } = parseArgs({ options: { today: { type: "string" } }, allowPositionals: false });
  if (values.today !== undefined && !/^\d{4}-\d{2}-\d{2}$/.test(values.today)) throw new Error(`--today takes a date like 2027-03-01, not "${values.today}"`);
  const local = await prepareLocalEnv();
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  await migrate(sequelize);
  const { seedDemo } = await import("../seeds/index.js");
  const { demoToday } = await import("../seeds/calendar.js");
  await seedDemo({ today: values.today });
  console.log(`Demo data loaded, anchored to ${demoToday()} (shoot day 3 is that day or the next working day).`);
  await sequelize.close();
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
