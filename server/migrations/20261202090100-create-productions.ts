import type { Migration } from "../migrator.js";

/** Productions, memberships (one role per user per production), invitations, audit trail, dev outbox. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TABLE productions (
      id uuid PRIMARY KEY,
      title varchar(200) NOT NULL,
      kind varchar(10) NOT NULL CHECK (kind IN ('film','series','stage')),
      starts_on date,
      ends_on date,
      units varchar(2) NOT NULL DEFAULT 'cm' CHECK (units IN ('cm','in')),
      settings jsonb NOT NULL DEFAULT '{}'::jsonb,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (ends_on IS NULL OR starts_on IS NULL OR ends_on >= starts_on)
    );
    CREATE TABLE memberships (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role varchar(20) NOT NULL CHECK (role IN ('supervisor','designer','set_costumer','cutter','vfx')),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (production_id, user_id)
    );
    CREATE INDEX memberships_user_idx ON memberships (user_id);
    CREATE TABLE invitations (
      id uuid PRIMARY KEY,
      production_id uuid NOT NULL REFERENCES productions(id) ON DELETE CASCADE,
      email citext NOT NULL,
      role varchar(20) NOT NULL CHECK (role IN ('supervisor','designer','set_costumer','cutter','vfx')),
      token_hash char(64) NOT NULL UNIQUE,
      invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      revoked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX invitations_production_idx ON invitations (production_id);
    CREATE TABLE audit_events (
      id uuid PRIMARY KEY,
      production_id uuid REFERENCES productions(id) ON DELETE CASCADE,
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      action varchar(60) NOT NULL,
      entity_type varchar(40) NOT NULL,
      entity_id uuid,
      before jsonb,
      after jsonb,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX audit_events_production_idx ON audit_events (production_id, created_at DESC);
    CREATE TABLE outbox_messages (
      id uuid PRIMARY KEY,
      recipients text NOT NULL,
      sender text,
      subject text NOT NULL DEFAULT '',
      text_body text,
      html_body text,
      attachments jsonb NOT NULL DEFAULT '[]'::jsonb,
      received_at timestamptz NOT NULL DEFAULT now()
    );
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(
    `DROP TABLE outbox_messages; DROP TABLE audit_events; DROP TABLE invitations; DROP TABLE memberships; DROP TABLE productions;`,
  );
};
