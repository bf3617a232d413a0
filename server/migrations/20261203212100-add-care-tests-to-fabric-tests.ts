import type { Migration } from "../migrator.js";

/** Fabric tests a workroom runs before cutting: shrinkage, colour fastness and flame-retardancy records. */
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE fabric_tests DROP CONSTRAINT fabric_tests_kind_check;
    ALTER TABLE fabric_tests ALTER COLUMN kind TYPE varchar(20);
    ALTER TABLE fabric_tests ADD CONSTRAINT fabric_tests_kind_check
      CHECK (kind IN ('mass','cantilever','strip','thickness','shear','friction','shrinkage','colourfastness','flame_retardancy'));
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DELETE FROM fabric_tests WHERE kind IN ('shrinkage','colourfastness','flame_retardancy');
    ALTER TABLE fabric_tests DROP CONSTRAINT fabric_tests_kind_check;
    ALTER TABLE fabric_tests ALTER COLUMN kind TYPE varchar(12);
    ALTER TABLE fabric_tests ADD CONSTRAINT fabric_tests_kind_check CHECK (kind IN ('mass','cantilever','strip','thickness','shear','friction'));
  `);
};
