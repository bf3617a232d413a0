import type { Migration } from "../migrator.js";

/**
 * Reports: garments gain a weekly hire rate (rented) and a wrap plan (keep or sell, owned garments);
 * report runs hold the progress and file of long exports (every continuity book in one ZIP).
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE garments
      ADD COLUMN rental_cost_per_week_cents integer CHECK (rental_cost_per_week_cents IS NULL OR rental_cost_per_week_cents >= 0),
      ADD COLUMN wrap_disposition varchar(4) CHECK (wrap_disposition IS NULL OR wrap_disposition IN ('keep','sell'));
    CREATE TABLE report_runs (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      kind varchar(30) NOT NULL CHECK (kind IN ('continuity_books')),
      status varchar(8) NOT NULL DEFAULT 'queued' CHECK (status IN ('queued','running','done','failed')),
      done integer NOT NULL DEFAULT 0 CHECK (done >= 0),
      total integer NOT NULL DEFAULT 0 CHECK (total >= 0),
      options jsonb NOT NULL DEFAULT '{}'::jsonb,
      storage_key varchar(300),
      bytes bigint,
      error text,
      requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
      finished_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX report_runs_production_idx ON report_runs (production_id, created_at DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE report_runs;
    ALTER TABLE garments DROP COLUMN wrap_disposition, DROP COLUMN rental_cost_per_week_cents;
  `);
};
