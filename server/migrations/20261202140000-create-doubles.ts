import type { Migration } from "../migrator.js";

/**
 * Digital doubles: flat pattern panels, seams between panel runs, cached yardage markers, and
 * versioned handoff packets with their recipients. A published packet is frozen by a trigger, so
 * not even a stray UPDATE can change what a recipient already downloaded (deleting the whole
 * production or change still cascades).
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE panels (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      garment_id uuid NOT NULL REFERENCES garments(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      outline jsonb NOT NULL,
      grainline jsonb,
      notches jsonb NOT NULL DEFAULT '[]'::jsonb,
      seam_allowance_mm numeric(5,1) NOT NULL DEFAULT 10 CHECK (seam_allowance_mm >= 0 AND seam_allowance_mm <= 100),
      cut_count integer NOT NULL DEFAULT 1 CHECK (cut_count >= 1 AND cut_count <= 99),
      mirrored boolean NOT NULL DEFAULT false,
      grain_mode varchar(8) NOT NULL DEFAULT 'straight' CHECK (grain_mode IN ('straight','bias','free')),
      fabric_id uuid REFERENCES fabrics(id) ON DELETE SET NULL,
      source varchar(6) NOT NULL DEFAULT 'drawn' CHECK (source IN ('drawn','dxf')),
      sort_order integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX panels_garment_idx ON panels (garment_id, sort_order);
    CREATE INDEX panels_production_idx ON panels (production_id);
    CREATE TABLE seams (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      name varchar(120) NOT NULL,
      panel_a_id uuid NOT NULL REFERENCES panels(id) ON DELETE CASCADE,
      a_from jsonb NOT NULL,
      a_to jsonb NOT NULL,
      a_direction varchar(8) NOT NULL DEFAULT 'forward' CHECK (a_direction IN ('forward','backward')),
      panel_b_id uuid NOT NULL REFERENCES panels(id) ON DELETE CASCADE,
      b_from jsonb NOT NULL,
      b_to jsonb NOT NULL,
      b_direction varchar(8) NOT NULL DEFAULT 'forward' CHECK (b_direction IN ('forward','backward')),
      tolerance_mm numeric(5,1) CHECK (tolerance_mm IS NULL OR tolerance_mm >= 0),
      eased boolean NOT NULL DEFAULT false,
      ease_min_mm numeric(6,1),
      ease_max_mm numeric(6,1),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (NOT eased OR (ease_min_mm IS NOT NULL AND ease_max_mm IS NOT NULL AND ease_min_mm <= ease_max_mm))
    );
    CREATE INDEX seams_panel_a_idx ON seams (panel_a_id);
    CREATE INDEX seams_panel_b_idx ON seams (panel_b_id);
    CREATE TABLE markers (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      scope varchar(7) NOT NULL CHECK (scope IN ('garment','change')),
      scope_id uuid NOT NULL,
      multiples integer NOT NULL DEFAULT 1 CHECK (multiples >= 1 AND multiples <= 20),
      input_hash char(64) NOT NULL,
      result jsonb NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, scope, scope_id, multiples)
    );
    CREATE TABLE packets (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      character_id uuid NOT NULL REFERENCES characters(id) ON DELETE CASCADE,
      change_id uuid NOT NULL REFERENCES changes(id) ON DELETE CASCADE,
      version integer CHECK (version IS NULL OR version >= 1),
      status varchar(9) NOT NULL DEFAULT 'draft' CHECK (status IN ('draft','published')),
      selection jsonb NOT NULL DEFAULT '{}'::jsonb,
      include_measurements boolean NOT NULL DEFAULT false,
      notes text,
      contents jsonb,
      prepared_by uuid REFERENCES users(id) ON DELETE SET NULL,
      published_by uuid REFERENCES users(id) ON DELETE SET NULL,
      published_at timestamptz,
      zip_sha256 char(64),
      zip_bytes bigint,
      zip_storage_key varchar(300),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (change_id, version),
      CHECK (status = 'draft' OR (version IS NOT NULL AND contents IS NOT NULL AND published_at IS NOT NULL AND zip_sha256 IS NOT NULL AND zip_storage_key IS NOT NULL))
    );
    CREATE INDEX packets_change_idx ON packets (production_id, change_id);
    -- One open draft per change at a time.
    CREATE UNIQUE INDEX packets_one_draft_idx ON packets (change_id) WHERE status = 'draft';
    CREATE TABLE packet_recipients (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      packet_id uuid NOT NULL REFERENCES packets(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      notified_at timestamptz,
      downloaded_at timestamptz,
      received_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (packet_id, user_id)
    );
    CREATE INDEX packet_recipients_user_idx ON packet_recipients (user_id);

    CREATE FUNCTION packets_freeze_published() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF OLD.status = 'published' AND (
        NEW.status IS DISTINCT FROM OLD.status OR NEW.version IS DISTINCT FROM OLD.version OR
        NEW.contents IS DISTINCT FROM OLD.contents OR NEW.selection IS DISTINCT FROM OLD.selection OR
        NEW.include_measurements IS DISTINCT FROM OLD.include_measurements OR
        NEW.zip_sha256 IS DISTINCT FROM OLD.zip_sha256 OR NEW.zip_storage_key IS DISTINCT FROM OLD.zip_storage_key OR
        NEW.zip_bytes IS DISTINCT FROM OLD.zip_bytes OR NEW.published_at IS DISTINCT FROM OLD.published_at OR
        NEW.published_by IS DISTINCT FROM OLD.published_by OR NEW.change_id IS DISTINCT FROM OLD.change_id
      ) THEN
        RAISE EXCEPTION 'a published packet version cannot change' USING ERRCODE = 'check_violation';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER packets_freeze_published BEFORE UPDATE ON packets
      FOR EACH ROW EXECUTE FUNCTION packets_freeze_published();
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE packet_recipients; DROP TABLE packets; DROP FUNCTION packets_freeze_published();
    DROP TABLE markers; DROP TABLE seams; DROP TABLE panels;
  `);
};
