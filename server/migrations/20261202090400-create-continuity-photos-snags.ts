import type { Migration } from "../migrator.js";

/** Photos (any owner), continuity entries with the garment copies worn, and snag dismissals. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE photos (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      owner_type varchar(30) NOT NULL,
      owner_id uuid NOT NULL,
      view varchar(10) NOT NULL DEFAULT 'other' CHECK (view IN ('front','back','left','right','detail','other')),
      caption varchar(300),
      content_hash char(64) NOT NULL,
      original_name varchar(255),
      width integer NOT NULL,
      height integer NOT NULL,
      bytes integer NOT NULL,
      variants jsonb NOT NULL DEFAULT '{}'::jsonb,
      uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (owner_type, owner_id, content_hash)
    );
    CREATE INDEX photos_owner_idx ON photos (owner_type, owner_id);
    CREATE INDEX photos_hash_idx ON photos (content_hash);
    CREATE TABLE continuity_entries (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      shoot_day_id uuid REFERENCES shoot_days(id) ON DELETE SET NULL,
      scene_id uuid NOT NULL REFERENCES scenes(id) ON DELETE CASCADE,
      character_id uuid NOT NULL REFERENCES characters(id) ON DELETE CASCADE,
      distress_stage integer CHECK (distress_stage IS NULL OR (distress_stage >= 0 AND distress_stage <= 10)),
      notes text,
      logged_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX continuity_entries_character_idx ON continuity_entries (character_id, scene_id);
    CREATE TABLE continuity_entry_garments (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      continuity_entry_id uuid NOT NULL REFERENCES continuity_entries(id) ON DELETE CASCADE,
      garment_id uuid NOT NULL REFERENCES garments(id) ON DELETE CASCADE,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (continuity_entry_id, garment_id)
    );
    CREATE TABLE snag_dismissals (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      snag_key varchar(300) NOT NULL,
      evidence_hash varchar(64) NOT NULL,
      reason text NOT NULL,
      dismissed_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, snag_key)
    );
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `DROP TABLE snag_dismissals; DROP TABLE continuity_entry_garments; DROP TABLE continuity_entries; DROP TABLE photos;`,
  );
};
