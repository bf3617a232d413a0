import type { Migration } from "../migrator.js";

/** Fabrics and their tests, garments, multiples groups, status history, change items, measurements. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE fabrics (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      name varchar(160) NOT NULL,
      fibre_content jsonb NOT NULL DEFAULT '[]'::jsonb,
      construction varchar(6) NOT NULL CHECK (construction IN ('woven','knit')),
      width_mm integer CHECK (width_mm IS NULL OR width_mm > 0),
      mass_per_area_gsm numeric(8,2) CHECK (mass_per_area_gsm IS NULL OR mass_per_area_gsm > 0),
      thickness_mm numeric(6,3) CHECK (thickness_mm IS NULL OR thickness_mm > 0),
      stretch_warp_pct numeric(5,1) CHECK (stretch_warp_pct IS NULL OR stretch_warp_pct >= 0),
      stretch_weft_pct numeric(5,1) CHECK (stretch_weft_pct IS NULL OR stretch_weft_pct >= 0),
      colour varchar(80),
      care_notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX fabrics_production_idx ON fabrics (production_id);
    CREATE TABLE fabric_tests (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      fabric_id uuid NOT NULL REFERENCES fabrics(id) ON DELETE CASCADE,
      kind varchar(12) NOT NULL CHECK (kind IN ('mass','cantilever','strip','thickness','shear','friction')),
      direction varchar(5) CHECK (direction IS NULL OR direction IN ('warp','weft','bias')),
      readings jsonb NOT NULL,
      derived jsonb NOT NULL DEFAULT '{}'::jsonb,
      tested_by uuid REFERENCES users(id) ON DELETE SET NULL,
      tested_on date NOT NULL,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX fabric_tests_fabric_idx ON fabric_tests (fabric_id);
    CREATE TABLE multiples_groups (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      name varchar(160) NOT NULL,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE TABLE garments (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      tag_code varchar(16) NOT NULL,
      name varchar(160) NOT NULL,
      category varchar(40) NOT NULL,
      size_label varchar(40),
      fit_intent varchar(8) NOT NULL DEFAULT 'regular' CHECK (fit_intent IN ('fitted','regular','loose')),
      finished_measurements jsonb NOT NULL DEFAULT '{}'::jsonb,
      fabric_id uuid REFERENCES fabrics(id) ON DELETE SET NULL,
      colour varchar(80),
      source varchar(8) NOT NULL CHECK (source IN ('built','bought','rented')),
      vendor varchar(160),
      cost_cents integer CHECK (cost_cents IS NULL OR cost_cents >= 0),
      rental_due_on date,
      location_rack varchar(40),
      location_bin varchar(40),
      status varchar(10) NOT NULL DEFAULT 'in_stock' CHECK (status IN ('in_stock','fitting','workroom','on_set','cleaning','returned','lost')),
      distress_stage integer NOT NULL DEFAULT 0 CHECK (distress_stage >= 0 AND distress_stage <= 10),
      multiples_group_id uuid REFERENCES multiples_groups(id) ON DELETE SET NULL,
      copy_number integer CHECK (copy_number IS NULL OR copy_number > 0),
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, tag_code),
      UNIQUE (multiples_group_id, copy_number)
    );
    CREATE INDEX garments_production_idx ON garments (production_id, status);
    CREATE TABLE garment_status_events (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      garment_id uuid NOT NULL REFERENCES garments(id) ON DELETE CASCADE,
      from_status varchar(10),
      to_status varchar(10) NOT NULL,
      from_location varchar(90),
      to_location varchar(90),
      note text,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX garment_status_events_garment_idx ON garment_status_events (garment_id, created_at);
    CREATE TABLE change_items (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      change_id uuid NOT NULL REFERENCES changes(id) ON DELETE CASCADE,
      label varchar(120) NOT NULL,
      garment_id uuid REFERENCES garments(id) ON DELETE SET NULL,
      multiples_group_id uuid REFERENCES multiples_groups(id) ON DELETE SET NULL,
      sort_order integer NOT NULL DEFAULT 0,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (garment_id IS NULL OR multiples_group_id IS NULL)
    );
    CREATE INDEX change_items_change_idx ON change_items (change_id);
    CREATE TABLE measurement_sets (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      performer_id uuid NOT NULL REFERENCES performers(id) ON DELETE CASCADE,
      taken_on date NOT NULL,
      taken_by uuid REFERENCES users(id) ON DELETE SET NULL,
      values_mm jsonb NOT NULL,
      entered_unit varchar(2) NOT NULL DEFAULT 'cm' CHECK (entered_unit IN ('cm','in')),
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX measurement_sets_performer_idx ON measurement_sets (performer_id, taken_on DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `DROP TABLE measurement_sets; DROP TABLE change_items; DROP TABLE garment_status_events; DROP TABLE garments; DROP TABLE multiples_groups; DROP TABLE fabric_tests; DROP TABLE fabrics;`,
  );
};
