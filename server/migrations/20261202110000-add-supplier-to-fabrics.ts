import type { Migration } from "../migrator.js";

/** Fabrics: who supplied the cloth (for reorders); garments: index for rental due-date filters. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE fabrics ADD COLUMN supplier varchar(160);
    CREATE INDEX garments_rental_due_idx ON garments (production_id, rental_due_on) WHERE source = 'rented';
    CREATE INDEX garments_group_idx ON garments (multiples_group_id);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX garments_group_idx;
    DROP INDEX garments_rental_due_idx;
    ALTER TABLE fabrics DROP COLUMN supplier;
  `);
};
