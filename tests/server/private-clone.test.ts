/**
 * A real `git clone` under a private (0700) folder, as under /root, run as root: the checkout's
 * `.data/pg` is out of the postgres user's reach, so the cluster lives under its home instead, the
 * output says where, migrations apply, and nothing of the user's is changed or removed.
 * (The clone is of the committed HEAD; node_modules is linked from this checkout to skip npm ci.)
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { pgCtl } from "../../scripts/lib/postgres.js";
import { childEnv, freePort, spawnTsx } from "../setup/processes.js";

const isRoot = process.getuid?.() === 0;
const hasGit = spawnSync("git", ["rev-parse", "--is-inside-work-tree"], { encoding: "utf8" }).stdout.trim() === "true";
let home: string | undefined;
let relocated: string | undefined;

afterAll(() => {
  if (relocated) {
    pgCtl(relocated, ["-m", "immediate", "stop"], { allowFail: true });
    fs.rmSync(relocated, { recursive: true, force: true }); // made by this test's run
  }
  if (home) fs.rmSync(home, { recursive: true, force: true });
});

describe("a clone under a private folder", () => {
  it.runIf(isRoot && hasGit)(
    "starts its database where the postgres user can reach it and says where",
    async () => {
      home = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-private-home-"));
      expect(fs.statSync(home).mode & 0o777).toBe(0o700);
      const checkout = path.join(home, "seamscene");
      const clone = spawnSync("git", ["clone", "-q", "--local", process.cwd(), checkout], { encoding: "utf8" });
      expect(clone.status, clone.stderr).toBe(0);
      fs.symlinkSync(path.resolve("node_modules"), path.join(checkout, "node_modules"));

      const port = await freePort();
      const env = childEnv({ DATABASE_URL: "", PGDATA_DIR: "", PGPORT: String(port), NODE_ENV: "development" });
      delete env.PGDATA_DIR;
      // `npm run db:migrate` in the clone: prepares the private cluster as `npm start` does, then migrates.
      const run = spawnTsx(["scripts/migrate.ts"], env, checkout);
      const code = await run.exited;
      const out = run.output();
      relocated = /PostgreSQL keeps its data in (\S+):/.exec(out)?.[1];
      expect(code, out).toBe(0);
      expect(out).toMatch(/Applied: \d{14}-/);
      expect(relocated).toBeDefined();
      expect(relocated!.startsWith(home)).toBe(false);
      expect(out).toContain(path.join(checkout, ".data", "pg"));
      expect(fs.existsSync(path.join(relocated!, "PG_VERSION"))).toBe(true);
      // The user's folders are as they were: still private, no cluster written into the checkout.
      expect(fs.statSync(home).mode & 0o777).toBe(0o700);
      expect(fs.existsSync(path.join(checkout, ".data", "pg"))).toBe(false);
      expect(
        spawnSync("git", ["status", "--porcelain"], { cwd: checkout, encoding: "utf8" })
          .stdout.split("\n")
          .filter((l) => l && !l.includes("node_modules")),
      ).toEqual([]);

      // A second start finds the same cluster (and its data).
      const again = spawnTsx(["scripts/migrate.ts"], env, checkout);
      expect(await again.exited, again.output()).toBe(0);
      expect(again.output()).toContain(relocated!);
      expect(again.output()).toMatch(/No pending migrations/);
    },
    240_000,
  );
});
