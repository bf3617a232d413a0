import type { Migration } from "../migrator.js";

/** Users, sessions, password resets and the sign-in throttle. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS citext;
    CREATE TABLE users (
      id uuid PRIMARY KEY,
      email citext NOT NULL UNIQUE,
      name varchar(120) NOT NULL,
      password_hash varchar(255),
      is_active boolean NOT NULL DEFAULT true,
      last_production_id uuid,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE session (
      sid varchar NOT NULL PRIMARY KEY,
      sess json NOT NULL,
      expire timestamp(6) NOT NULL
    );
    CREATE INDEX session_expire_idx ON session (expire);
    CREATE TABLE password_resets (
      id uuid PRIMARY KEY,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash char(64) NOT NULL UNIQUE,
      expires_at timestamptz NOT NULL,
      used_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE rate_limit_hits (
      key varchar(300) PRIMARY KEY,
      hits integer NOT NULL,
      reset_at timestamptz NOT NULL
    );
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE rate_limit_hits; DROP TABLE password_resets; DROP TABLE session; DROP TABLE users;`);
};
