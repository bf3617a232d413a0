import { Sequelize } from "sequelize";
import pg from "pg";
import { config } from "./config.js";

// DATE columns come back as "YYYY-MM-DD" strings; shoot days are calendar days, not instants.
pg.types.setTypeParser(1082, (value: string) => value);

/** The one Sequelize instance. Every production-owned row carries production_id. */
export const sequelize = new Sequelize(config.DATABASE_URL, {
  dialect: "postgres",
  logging: false,
  define: { underscored: true, timestamps: true },
  pool: { max: 10, idle: 10_000 },
  // A connection attempt to a database that is down fails after 5 s instead of hanging the request.
  dialectOptions: { connectionTimeoutMillis: 5000 },
});
