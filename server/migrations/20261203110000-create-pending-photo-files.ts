import type { Migration } from "../migrator.js";

/**
 * Photo files being written before their row exists: the start-up sweep keeps the files of uploads
 * still in progress (on any server) and removes those whose writer died.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE pending_photo_files (
      id uuid PRIMARY KEY,
      content_hash varchar(64) NOT NULL,
      host varchar(255) NOT NULL,
      pid integer NOT NULL,
      instance varchar(16) NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX pending_photo_files_hash_idx ON pending_photo_files (content_hash);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE pending_photo_files;`);
};
