import type { Migration } from "../migrator.js";

/**
 * Check-outs: which garment went to whom (a member or a performer), for which shoot day / performance
 * and scene, and when it is due back. One open check-out per garment; returned rows stay as history.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE garment_checkouts (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      garment_id uuid NOT NULL REFERENCES garments(id) ON DELETE CASCADE,
      to_kind varchar(9) NOT NULL CHECK (to_kind IN ('member','performer')),
      to_user_id uuid REFERENCES users(id) ON DELETE SET NULL,
      to_performer_id uuid REFERENCES performers(id) ON DELETE SET NULL,
      -- The name as it was when the garment went out, so the record reads the same after someone leaves.
      to_name varchar(160) NOT NULL,
      shoot_day_id uuid REFERENCES shoot_days(id) ON DELETE SET NULL,
      scene_id uuid REFERENCES scenes(id) ON DELETE SET NULL,
      due_back_on date NOT NULL,
      note text,
      checked_out_at timestamptz NOT NULL,
      checked_out_by uuid REFERENCES users(id) ON DELETE SET NULL,
      returned_at timestamptz,
      returned_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (to_kind <> 'member' OR to_performer_id IS NULL),
      CHECK (to_kind <> 'performer' OR to_user_id IS NULL)
    );
    CREATE UNIQUE INDEX garment_checkouts_open_idx ON garment_checkouts (garment_id) WHERE returned_at IS NULL;
    CREATE INDEX garment_checkouts_due_idx ON garment_checkouts (production_id, due_back_on) WHERE returned_at IS NULL;
    CREATE INDEX garment_checkouts_garment_idx ON garment_checkouts (garment_id, checked_out_at);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP TABLE garment_checkouts;`);
};
