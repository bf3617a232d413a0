/**
 * `npm run seed`: loads or refreshes the demo data (idempotent: fixed ids, upserts), anchored to today.
 * `npm run seed -- --today 2027-03-01` anchors it to another day (reproducible screenshots and tests).
 * `npm run seed -- --scale 10` also adds "Tidewater Reach", a production 10× a typical feature's size
 * (4,000 scenes, 900 shoot days, 30,000 garments; seeds/scaled.ts), anchored to the same day.
 */
import { parseArgs } from "node:util";
import { prepareLocalEnv } from "./lib/local-env.js";

async function main() {
  const { values } = parseArgs({ options: { today: { type: "string" }, scale: { type: "string" } }, allowPositionals: false });
  if (values.today !== undefined && !/^\d{4}-\d{2}-\d{2}$/.test(values.today))
    throw new Error(`--today takes a date like 2027-03-01, not "${values.today}"`);
  const scale = values.scale === undefined ? undefined : Number(values.scale);
  if (scale !== undefined && !(Number.isInteger(scale) && scale >= 1 && scale <= 20))
    throw new Error(`--scale takes a whole number from 1 to 20, not "${values.scale}"`);
  const local = await prepareLocalEnv();
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  await migrate(sequelize);
  const { seedDemo } = await import("../seeds/index.js");
  const { demoToday } = await import("../seeds/calendar.js");
  await seedDemo({ today: values.today });
  console.log(`Demo data loaded, anchored to ${demoToday()} (shoot day 3 is that day or the next working day).`);
  if (scale !== undefined) {
    const { seedScaledProduction } = await import("../seeds/scaled.js");
    const started = performance.now();
    const { counts } = await seedScaledProduction(scale);
    console.log(
      `Tidewater Reach (×${scale}) loaded in ${((performance.now() - started) / 1000).toFixed(1)} s: ${Object.entries(counts)
        .map(([k, n]) => `${n} ${k}`)
        .join(", ")}.`,
    );
  }
  await sequelize.close();
  local.pg?.stop();
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
