import type { Migration } from "../migrator.js";

/** Workroom: fittings, alteration tickets, people's capacity, and the log of workroom e-mails (sends and failures). */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE fittings (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      performer_id uuid NOT NULL REFERENCES performers(id) ON DELETE CASCADE,
      change_id uuid REFERENCES changes(id) ON DELETE SET NULL,
      starts_at timestamptz NOT NULL,
      duration_minutes integer NOT NULL CHECK (duration_minutes BETWEEN 5 AND 480),
      room varchar(120),
      attendee_ids uuid[] NOT NULL DEFAULT '{}',
      notes text,
      outcome text,
      status varchar(10) NOT NULL DEFAULT 'booked' CHECK (status IN ('booked','done','cancelled')),
      ics_uid varchar(120) NOT NULL UNIQUE,
      ics_sequence integer NOT NULL DEFAULT 0 CHECK (ics_sequence >= 0),
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX fittings_production_starts_idx ON fittings (production_id, starts_at);
    CREATE INDEX fittings_performer_idx ON fittings (performer_id);
    CREATE TABLE alteration_tickets (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      garment_id uuid NOT NULL REFERENCES garments(id) ON DELETE CASCADE,
      fitting_id uuid REFERENCES fittings(id) ON DELETE SET NULL,
      tasks jsonb NOT NULL DEFAULT '[]'::jsonb,
      estimate_hours numeric(6,2) NOT NULL CHECK (estimate_hours > 0 AND estimate_hours <= 500),
      remaining_hours numeric(6,2) CHECK (remaining_hours IS NULL OR (remaining_hours >= 0 AND remaining_hours <= 500)),
      assignee_id uuid REFERENCES users(id) ON DELETE SET NULL,
      status varchar(12) NOT NULL DEFAULT 'waiting' CHECK (status IN ('waiting','in_progress','done','checked')),
      raised_on date NOT NULL,
      raised_by uuid REFERENCES users(id) ON DELETE SET NULL,
      garment_status_before varchar(10),
      done_at timestamptz,
      checked_at timestamptz,
      checked_by uuid REFERENCES users(id) ON DELETE SET NULL,
      notes text,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX alteration_tickets_production_idx ON alteration_tickets (production_id, status);
    CREATE INDEX alteration_tickets_garment_idx ON alteration_tickets (garment_id);
    CREATE TABLE workroom_capacity (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      hours_per_weekday jsonb NOT NULL,
      days_off date[] NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, user_id)
    );
    CREATE TABLE workroom_email_jobs (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      kind varchar(20) NOT NULL CHECK (kind IN ('fitting_invite','fitting_update','fitting_cancel','evening_reminder')),
      dedupe_key varchar(200) NOT NULL,
      recipient varchar(320) NOT NULL,
      subject varchar(300) NOT NULL,
      payload jsonb NOT NULL,
      status varchar(10) NOT NULL DEFAULT 'pending' CHECK (status IN ('pending','sent','retrying','failed')),
      attempts integer NOT NULL DEFAULT 0,
      last_error text,
      sent_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, dedupe_key)
    );
    CREATE INDEX workroom_email_jobs_status_idx ON workroom_email_jobs (production_id, status, created_at DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `DROP TABLE workroom_email_jobs; DROP TABLE workroom_capacity; DROP TABLE alteration_tickets; DROP TABLE fittings;`,
  );
};
