import type { Migration } from "../migrator.js";

/** Cast, scenes, shoot days / performances, changes and appearances: the breakdown. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE performers (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      name varchar(160) NOT NULL,
      email citext,
      phone varchar(40),
      agent_contact varchar(300),
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX performers_production_idx ON performers (production_id);
    CREATE TABLE characters (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      name varchar(160) NOT NULL,
      performer_id uuid REFERENCES performers(id) ON DELETE SET NULL,
      sort_order integer NOT NULL DEFAULT 0,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, name)
    );
    CREATE TABLE character_doubles (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      character_id uuid NOT NULL REFERENCES characters(id) ON DELETE CASCADE,
      performer_id uuid NOT NULL REFERENCES performers(id) ON DELETE CASCADE,
      kind varchar(12) NOT NULL CHECK (kind IN ('stunt','photo','understudy')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (character_id, performer_id, kind)
    );
    CREATE TABLE scenes (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      number varchar(12) NOT NULL,
      set_name varchar(200),
      int_ext varchar(7) CHECK (int_ext IN ('INT','EXT','INT/EXT')),
      time_of_day varchar(20),
      story_day integer,
      story_order integer NOT NULL,
      length_eighths integer CHECK (length_eighths IS NULL OR length_eighths >= 0),
      running_minutes numeric(6,2) CHECK (running_minutes IS NULL OR running_minutes >= 0),
      synopsis text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, number)
    );
    CREATE INDEX scenes_story_idx ON scenes (production_id, story_order);
    CREATE TABLE shoot_days (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      day_number integer NOT NULL,
      date date NOT NULL,
      kind varchar(12) NOT NULL DEFAULT 'shoot' CHECK (kind IN ('shoot','performance')),
      starts_at time,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, day_number)
    );
    CREATE INDEX shoot_days_date_idx ON shoot_days (production_id, date);
    CREATE TABLE shoot_day_scenes (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      shoot_day_id uuid NOT NULL REFERENCES shoot_days(id) ON DELETE CASCADE,
      scene_id uuid NOT NULL REFERENCES scenes(id) ON DELETE CASCADE,
      position integer NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (shoot_day_id, scene_id)
    );
    CREATE INDEX shoot_day_scenes_scene_idx ON shoot_day_scenes (scene_id);
    CREATE TABLE changes (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      character_id uuid NOT NULL REFERENCES characters(id) ON DELETE CASCADE,
      number integer NOT NULL CHECK (number > 0),
      description text,
      story_day_from integer,
      story_day_to integer,
      approval varchar(10) NOT NULL DEFAULT 'draft' CHECK (approval IN ('draft','proposed','approved')),
      approved_by uuid REFERENCES users(id) ON DELETE SET NULL,
      approved_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (character_id, number)
    );
    CREATE TABLE appearances (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      scene_id uuid NOT NULL REFERENCES scenes(id) ON DELETE CASCADE,
      character_id uuid NOT NULL REFERENCES characters(id) ON DELETE CASCADE,
      change_id uuid REFERENCES changes(id) ON DELETE SET NULL,
      distress_stage integer NOT NULL DEFAULT 0 CHECK (distress_stage >= 0 AND distress_stage <= 10),
      wet boolean NOT NULL DEFAULT false,
      stunt boolean NOT NULL DEFAULT false,
      blood boolean NOT NULL DEFAULT false,
      vfx_shot boolean NOT NULL DEFAULT false,
      change_here boolean NOT NULL DEFAULT false,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (scene_id, character_id)
    );
    CREATE INDEX appearances_character_idx ON appearances (character_id);
    CREATE INDEX appearances_change_idx ON appearances (change_id);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `DROP TABLE appearances; DROP TABLE changes; DROP TABLE shoot_day_scenes; DROP TABLE shoot_days; DROP TABLE scenes; DROP TABLE character_doubles; DROP TABLE characters; DROP TABLE performers;`,
  );
};
