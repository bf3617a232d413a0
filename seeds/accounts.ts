import type { Transaction } from "sequelize";
import { Membership, Production, User } from "../server/models/index.js";
import { hashPassword } from "../server/auth/passwords.js";
import type { Role } from "../shared/permissions.js";
import { demoId } from "./ids.js";
import { DEMO_TIME_ZONE, demoDaysFromToday } from "./calendar.js";

export const DEMO_PASSWORD = "seamscene-demo";

/** One invented account per role (demo data only). */
export const demoAccounts: Array<{ key: string; name: string; email: string; role: Role; password: string }> = [
  { key: "supervisor", name: "Wren Halloway", email: "supervisor@seamscene.test", role: "supervisor", password: DEMO_PASSWORD },
  { key: "designer", name: "Isolde Marchetti", email: "designer@seamscene.test", role: "designer", password: DEMO_PASSWORD },
  { key: "set_costumer", name: "Tobias Quell", email: "setcostumer@seamscene.test", role: "set_costumer", password: DEMO_PASSWORD },
  { key: "cutter", name: "Agnes Pellow", email: "cutter@seamscene.test", role: "cutter", password: DEMO_PASSWORD },
  { key: "vfx", name: "Dara Okonkwo-Lind", email: "vfx@seamscene.test", role: "vfx", password: DEMO_PASSWORD },
];

export const SALTMARSH_ID = demoId("production:saltmarsh-hollow");
export const GLASS_ORCHARD_ID = demoId("production:glass-orchard");
export const userId = (key: string) => demoId(`user:${key}`);

/** Users, the two demo productions and memberships. */
export async function seedAccounts(transaction: Transaction): Promise<void> {
  const hash = await hashPassword(DEMO_PASSWORD);
  for (const a of demoAccounts) {
    await User.upsert(
      { id: userId(a.key), email: a.email, name: a.name, passwordHash: hash, isActive: true, lastProductionId: SALTMARSH_ID },
      { transaction },
    );
  }
  await Production.upsert(
    {
      id: SALTMARSH_ID,
      title: "Saltmarsh Hollow",
      kind: "film",
      startsOn: demoDaysFromToday(-9),
      endsOn: demoDaysFromToday(58),
      units: "cm",
      settings: { timeZone: DEMO_TIME_ZONE, bufferWorkingDays: 1, reminderHour: 18, seamToleranceMm: 3, currency: "GBP", paperSize: "A4" },
      createdBy: userId("supervisor"),
    },
    { transaction },
  );
  await Production.upsert(
    {
      id: GLASS_ORCHARD_ID,
      title: "The Glass Orchard",
      kind: "stage",
      startsOn: demoDaysFromToday(-2),
      endsOn: demoDaysFromToday(74),
      units: "in",
      settings: {
        timeZone: DEMO_TIME_ZONE,
        quickChangeThresholdMin: 2,
        bufferWorkingDays: 1,
        reminderHour: 17,
        currency: "GBP",
        paperSize: "A4",
      },
      createdBy: userId("supervisor"),
    },
    { transaction },
  );
  for (const a of demoAccounts) {
    await Membership.upsert(
      { id: demoId(`membership:saltmarsh:${a.key}`), productionId: SALTMARSH_ID, userId: userId(a.key), role: a.role },
      { transaction },
    );
  }
  // The stage show has a smaller team: supervisor, designer and the set costumer as dresser.
  for (const key of ["supervisor", "designer", "set_costumer"]) {
    const a = demoAccounts.find((x) => x.key === key)!;
    await Membership.upsert(
      { id: demoId(`membership:glass:${key}`), productionId: GLASS_ORCHARD_ID, userId: userId(key), role: a.role },
      { transaction },
    );
  }
}
