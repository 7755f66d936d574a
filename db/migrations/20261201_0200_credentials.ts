import type { Knex } from "knex";

// Credentials desk (issue 6):
// - status gains 'rejected' (HR turns down a renewal a lineworker uploaded; the row is kept).
// - `slot` is a stored generated column with a unique key, so a worker holds at most one
//   current and at most one pending record of each qualification type, whatever number of
//   app instances write at once. A concurrent second renewal fails on the key (409), it
//   never leaves two current rows.
// - `import_ref` names the CSV import that wrote a row (traceable, and lets the import link
//   its own rows without relying on consecutive auto-increment ids, which Galera does not give).
// - `note`: HR's reason when rejecting, or a remark on an imported row.

export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "ALTER TABLE credentials MODIFY status ENUM('current','superseded','pending','rejected') NOT NULL DEFAULT 'current'",
  );
  await knex.raw(
    "ALTER TABLE credentials " +
      "ADD COLUMN slot VARCHAR(40) AS (IF(status IN ('current','pending'), CONCAT(status, ':', worker_id, ':', qualification_type_id), NULL)) PERSISTENT, " +
      "ADD COLUMN import_ref VARCHAR(40) NULL, " +
      "ADD COLUMN note VARCHAR(500) NULL, " +
      "ADD UNIQUE KEY credentials_slot_unique (slot), " +
      "ADD KEY credentials_import_ref_index (import_ref)",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    "ALTER TABLE credentials DROP KEY credentials_slot_unique, DROP KEY credentials_import_ref_index, " +
      "DROP COLUMN slot, DROP COLUMN import_ref, DROP COLUMN note",
  );
  await knex.raw("UPDATE credentials SET status = 'superseded' WHERE status = 'rejected'");
  await knex.raw(
    "ALTER TABLE credentials MODIFY status ENUM('current','superseded','pending') NOT NULL DEFAULT 'current'",
  );
}
