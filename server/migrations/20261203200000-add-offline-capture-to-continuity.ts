import type { Migration } from "../migrator.js";

/**
 * Continuity captured without a signal: the device's id for each entry (stored once per production,
 * however often it is sent), a fingerprint of what was sent (a repeat must match it), what the phone
 * showed at capture, and review marks. Scene and character may be empty: an entry whose scene or
 * character was deleted while it waited on a phone is kept and marked, never dropped.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE continuity_entries
      ALTER COLUMN scene_id DROP NOT NULL,
      ALTER COLUMN character_id DROP NOT NULL,
      ADD COLUMN client_id uuid,
      ADD COLUMN request_hash char(64),
      ADD COLUMN captured_as jsonb,
      ADD COLUMN review_reasons jsonb NOT NULL DEFAULT '[]'::jsonb,
      ADD COLUMN review_resolved_at timestamptz,
      ADD COLUMN review_resolved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      ADD CONSTRAINT continuity_entries_client_id_key UNIQUE (production_id, client_id);
    CREATE INDEX continuity_entries_review_open_idx ON continuity_entries (production_id)
      WHERE review_reasons <> '[]'::jsonb AND review_resolved_at IS NULL;
  `);
};

/** Entries without a scene or character cannot go back under NOT NULL; they are removed. */
export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DELETE FROM continuity_entries WHERE scene_id IS NULL OR character_id IS NULL;
    DROP INDEX continuity_entries_review_open_idx;
    ALTER TABLE continuity_entries
      DROP CONSTRAINT continuity_entries_client_id_key,
      DROP COLUMN review_resolved_by,
      DROP COLUMN review_resolved_at,
      DROP COLUMN review_reasons,
      DROP COLUMN captured_as,
      DROP COLUMN request_hash,
      DROP COLUMN client_id,
      ALTER COLUMN scene_id SET NOT NULL,
      ALTER COLUMN character_id SET NOT NULL;
  `);
};
