import path from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import { Umzug, SequelizeStorage } from "umzug";
import type { QueryInterface, Sequelize } from "sequelize";

export type Migration = (params: { context: QueryInterface }) => Promise<void>;

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), "migrations");

/** Builds the migrator over server/migrations (timestamped files, each with up and down). */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: {
      glob: ["*.ts", { cwd: migrationsDir, ignore: ["*.d.ts"] }],
      resolve: ({ name, path: file, context }) => {
        const load = () => import(pathToFileURL(file!).href) as Promise<{ up: Migration; down: Migration }>;
        return {
          name: name.replace(/\.ts$/, ""),
          up: async () => (await load()).up({ context }),
          down: async () => (await load()).down({ context }),
        };
      },
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: "schema_migrations" }),
    logger: undefined,
  });
}

/** Applies every pending migration. */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up();
  // Every production-owned table bumps its production's data version (migration 20261203190000),
  // including tables whose migrations ran after that one or never asked for it.
  const [[tracking]] = (await sequelize.query(`SELECT to_regprocedure('track_all_production_data()') IS NOT NULL AS present`)) as [
    Array<{ present: boolean }>,
    unknown,
  ];
  if (tracking?.present) await sequelize.query(`SELECT track_all_production_data()`);
  return done.map((m) => m.name);
}
