/**
 * Demo data: an invented 1920s coastal-village feature, "Saltmarsh Hollow", and a small stage
 * show, "The Glass Orchard". Fixed ids and upserts make it idempotent. Each feature adds a step.
 */
import type { Transaction } from "sequelize";
import { sequelize } from "../server/db.js";
import { User } from "../server/models/index.js";
import { seedAccounts, demoAccounts } from "./accounts.js";
import { seedBreakdown } from "./breakdown.js";
import { seedBreakdownLinks } from "./breakdown-links.js";
import { seedWardrobe } from "./wardrobe.js";
import { seedWorkroom } from "./workroom.js";
import { seedDoubles } from "./doubles.js";
import { anchorDemo, DEMO_TIME_ZONE } from "./calendar.js";
import { clock } from "../server/lib/clock.js";

export { demoAccounts };

/** Steps run in order, in one transaction. */
const steps: Array<{ name: string; run: (t: Transaction) => Promise<void> }> = [
  { name: "accounts and productions", run: seedAccounts },
  // Breakdown feature: cast, scenes, shoot days, changes, appearances.
  { name: "breakdown", run: seedBreakdown },
  // Wardrobe feature: fabrics and tests, garments and multiples groups, measurement sets (after breakdown).
  { name: "wardrobe", run: seedWardrobe },
  // Breakdown feature (after wardrobe): change items → garments, continuity entries and photos.
  { name: "breakdown links", run: seedBreakdownLinks },
  // Workroom feature: fittings, capacity, alteration tickets (after wardrobe and breakdown links).
  { name: "workroom", run: seedWorkroom },
  // Digital doubles (last): panels and seams for Elias's change, a marker, a published packet.
  { name: "doubles: panels, seams, marker, packet", run: seedDoubles },
];

export interface SeedOptions {
  /** The day the demo is anchored to (yyyy-MM-dd); default: today on the server's clock in the demo's zone. */
  today?: string;
}

/** Loads every demo step (idempotent), with every date relative to the anchor day (seeds/calendar.ts). */
export async function seedDemo(options: SeedOptions = {}): Promise<void> {
  anchorDemo(options.today ?? clock.today(DEMO_TIME_ZONE));
  await sequelize.transaction(async (transaction) => {
    for (const step of steps) await step.run(transaction);
  });
}

/** Loads the demo data when the database has no users yet. Returns whether it did. */
export async function seedIfEmpty(options: SeedOptions = {}): Promise<boolean> {
  if ((await User.count()) > 0) return false;
  await seedDemo(options);
  return true;
}
