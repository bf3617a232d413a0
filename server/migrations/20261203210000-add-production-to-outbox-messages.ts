import type { Migration } from "../migrator.js";

/**
 * Development outbox: each caught message records the production it was sent for, the kind of mail
 * and the addresses it was delivered to, so a production's outbox shows only its own members' mail.
 * Older rows have no production and stop showing anywhere.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE outbox_messages
      ADD COLUMN production_id uuid,
      ADD COLUMN mail_kind varchar(40),
      ADD COLUMN delivered_to text[] NOT NULL DEFAULT '{}';
    CREATE INDEX outbox_messages_production_idx ON outbox_messages (production_id, received_at DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX outbox_messages_production_idx;
    ALTER TABLE outbox_messages DROP COLUMN delivered_to, DROP COLUMN mail_kind, DROP COLUMN production_id;
  `);
};
