import type { Knex } from "knex";
import bcrypt from "bcryptjs";
import { FIELD_ACCOUNTS } from "../demo/field-accounts";

// Lineworker sign-ins for WO-26-0101's climber, observer and ground hand (after 01_demo.ts,
// which empties every table and writes the workers). Each user is linked to the worker of the
// same e-mail and takes that worker's yard as home yard. Idempotent: a second run updates.

export async function seed(knex: Knex): Promise<void> {
  for (const a of FIELD_ACCOUNTS) {
    const worker = await knex("workers").where({ employee_no: a.workerNo }).first("id", "organisation_id", "yard_id", "email");
    if (!worker) throw new Error(`02_field_users: no worker ${a.workerNo} (run 01_demo first)`);
    if (worker.email && worker.email.toLowerCase() !== a.email) {
      throw new Error(`02_field_users: ${a.workerNo}'s e-mail is ${worker.email}, not ${a.email}`);
    }
    const row = {
      organisation_id: worker.organisation_id,
      email: a.email,
      name: a.name,
      role: a.role,
      password_hash: await bcrypt.hash(a.password, 10),
      worker_id: worker.id,
      home_yard_id: worker.yard_id,
      active: true,
    };
    await knex("users").insert(row).onConflict("email").merge(["name", "role", "password_hash", "worker_id", "home_yard_id", "active"]);
  }
}
