import type { Migration } from "../migrator.js";

/**
 * Progress of long work done in the worker pool (building a packet's files and ZIP), so the screen that
 * started it can show how far it is, whichever app server it asks. Rows live only while the work runs.
 * No foreign key to the subject: the publishing transaction holds the packet row locked, and a key
 * check from the progress writer would wait for it.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE work_progress (
      subject_id uuid NOT NULL,
      kind varchar(40) NOT NULL,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      stage varchar(40) NOT NULL,
      done integer NOT NULL CHECK (done >= 0),
      total integer NOT NULL CHECK (total >= 0),
      updated_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (subject_id, kind)
    );
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE work_progress;`);
};
