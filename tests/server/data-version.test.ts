// productions.data_version: bumped at commit by triggers on every production-owned table, so app
// servers can tell whether what they computed from a production is still current.
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { sequelize } from "../../server/db.js";
import { migrate } from "../../server/migrator.js";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { Garment, Production, Scene } from "../../server/models/index.js";
import { buildGarment, buildMember, buildScene } from "../factories.js";
import { resetDb, signedInAgent } from "../setup/http.js";
import { buildFilmScenario, snagFixtures } from "../setup/snag-fixtures.js";
import type { SnagListDto } from "../../shared/schemas/snags.js";

async function versionOf(productionId: string): Promise<string> {
  const [row] = await sequelize.query<{ v: string }>(`SELECT data_version::text AS v FROM productions WHERE id = :id`, {
    replacements: { id: productionId },
    type: QueryTypes.SELECT,
  });
  return row!.v;
}

beforeEach(async () => {
  await resetDb();
});

afterEach(() => {
  clock.reset();
});

describe("production-owned tables", () => {
  it("every table with a production_id column has the three data-version triggers", async () => {
    // A table listed here would not clear cached snags on any server when written to
    // (track_all_production_data() in server/migrator.ts should have tracked it).
    const missing = await sequelize.query<{ table: string; has: number }>(
      `SELECT c.relname AS table, count(t.tgname)::int AS has
         FROM pg_class c
         JOIN pg_namespace n ON n.oid = c.relnamespace AND n.nspname = 'public'
         LEFT JOIN pg_trigger t ON t.tgrelid = c.oid AND t.tgname IN ('production_data_inserted', 'production_data_updated', 'production_data_deleted')
        WHERE c.relkind = 'r' AND c.relname <> 'production_data_changes'
          AND EXISTS (SELECT 1 FROM pg_attribute a WHERE a.attrelid = c.oid AND a.attname = 'production_id' AND NOT a.attisdropped)
        GROUP BY c.relname
       HAVING count(t.tgname) < 3
        ORDER BY c.relname`,
      { type: QueryTypes.SELECT },
    );

    expect(missing).toEqual([]);
  });

  it("tracks the workroom's progress and the report runs (tables added after the triggers)", async () => {
    const tracked = await sequelize.query<{ table: string }>(
      `SELECT DISTINCT c.relname AS table FROM pg_trigger t JOIN pg_class c ON c.oid = t.tgrelid
        WHERE t.tgname = 'production_data_inserted' AND c.relname IN ('work_progress', 'report_runs', 'garments') ORDER BY 1`,
      { type: QueryTypes.SELECT },
    );

    expect(tracked.map((r) => r.table)).toEqual(["garments", "report_runs", "work_progress"]);
  });

  it("a production-owned table added later is tracked when migrations next run", async () => {
    await sequelize.query(`CREATE TABLE untracked_probe (id serial PRIMARY KEY, production_id uuid)`);
    const triggersOnProbe = async () =>
      (
        await sequelize.query<{ n: number }>(
          `SELECT count(*)::int AS n FROM pg_trigger t JOIN pg_class c ON c.oid = t.tgrelid WHERE c.relname = 'untracked_probe' AND t.tgname LIKE 'production_data_%'`,
          { type: QueryTypes.SELECT },
        )
      )[0]!.n;
    try {
      expect(await triggersOnProbe()).toBe(0);

      await migrate(sequelize);

      expect(await triggersOnProbe()).toBe(3);
    } finally {
      await sequelize.query(`DROP TABLE untracked_probe`);
    }
  });
});

describe("productions.data_version", () => {
  it("changes when a write commits, not before, and only for the production written to", async () => {
    const { production } = await buildMember("supervisor");
    const { production: other } = await buildMember("supervisor");
    const before = await versionOf(production.id);
    const otherBefore = await versionOf(other.id);

    await sequelize.transaction(async (transaction) => {
      await Scene.create({ productionId: production.id, number: "1", storyOrder: 1 }, { transaction });
      // Read on another connection: nothing is visible before the commit.
      expect(await versionOf(production.id)).toBe(before);
    });

    const after = await versionOf(production.id);
    expect(after).not.toBe(before);
    expect(await versionOf(other.id)).toBe(otherBefore);
  });

  it("stays when the transaction rolls back", async () => {
    const { production } = await buildMember("supervisor");
    const before = await versionOf(production.id);

    await expect(
      sequelize.transaction(async (transaction) => {
        await Scene.create({ productionId: production.id, number: "1", storyOrder: 1 }, { transaction });
        throw new Error("abandon");
      }),
    ).rejects.toThrow("abandon");

    expect(await versionOf(production.id)).toBe(before);
  });

  it("changes on update and delete, on a settings change, and through cascades", async () => {
    const { production } = await buildMember("supervisor");
    const scene = await buildScene({ production });
    const seen = new Set([await versionOf(production.id)]);
    const step = async (write: () => Promise<unknown>) => {
      await write();
      const v = await versionOf(production.id);
      expect(seen.has(v)).toBe(false);
      seen.add(v);
    };

    await step(() => Scene.update({ synopsis: "Storm" }, { where: { id: scene.id } }));
    await step(() => Production.update({ settings: { quickChangeThresholdMin: 2 } }, { where: { id: production.id } }));
    await step(() => buildGarment({ production }));
    await step(() => Garment.destroy({ where: { productionId: production.id } }));
    await step(() => Scene.destroy({ where: { id: scene.id } }));
  });

  it("lets two writers of one production lock rows in opposite orders without a deadlock", async () => {
    const { production } = await buildMember("supervisor");
    const garment = await buildGarment({ production });
    // A writes first (its statement trigger has run), B then locks and changes the garment, and A
    // wants the same garment. Had A's write locked the production row until its commit, B's write
    // would wait for A while A waits for B.
    const a = await sequelize.transaction();
    const b = await sequelize.transaction();
    try {
      await Scene.create({ productionId: production.id, number: "7", storyOrder: 7 }, { transaction: a });
      await Garment.findByPk(garment.id, { transaction: b, lock: b.LOCK.UPDATE });
      await Garment.update({ notes: "B" }, { where: { id: garment.id }, transaction: b });
      const aWaits = Garment.update({ notes: "A" }, { where: { id: garment.id }, transaction: a });
      await b.commit();
      await aWaits;
      await a.commit();
    } catch (err) {
      await a.rollback().catch(() => undefined);
      await b.rollback().catch(() => undefined);
      throw err;
    }

    expect((await Garment.findByPk(garment.id))!.notes).toBe("A");
  });
});

describe("snags kept per data version", () => {
  it("answers from memory while nothing changed and recomputes after any committed write", async () => {
    const { user, production } = await buildMember("supervisor");
    const sc = await buildFilmScenario(snagFixtures(production.id));
    const agent = await signedInAgent(createApp(), user.email);
    clock.set("2027-01-10", { frozen: true });
    const list = async () =>
      ((await agent.get(`/api/productions/${production.id}/snags`).expect(200)).body.data as SnagListDto).snags.map((s) => s.key);
    const first = await list();
    const fitKey = `fit:${sc.garments.jacket}:${sc.performers.pWren}`;
    expect(first).toContain(fitKey);

    // The jacket's measurements are cleared behind the triggers' back: the list must still be the remembered one.
    await sequelize.query(`ALTER TABLE garments DISABLE TRIGGER USER`);
    try {
      await sequelize.query(`UPDATE garments SET finished_measurements = '{}'::jsonb WHERE id = :id`, {
        replacements: { id: sc.garments.jacket },
      });
    } finally {
      await sequelize.query(`ALTER TABLE garments ENABLE TRIGGER USER`);
    }
    expect(await list()).toEqual(first);

    // Any write to the production (as another server would make it) makes the next read recompute.
    await Scene.update({ synopsis: "Changed elsewhere" }, { where: { id: sc.scenes.s1 } });
    expect(await list()).not.toContain(fitKey);
  });
});
