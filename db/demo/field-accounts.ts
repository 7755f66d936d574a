// Sign-ins for the rest of WO-26-0101's crew, so each can acknowledge the job briefing from
// their own phone (db/seeds/02_field_users.ts creates them). Fictional people, local demo
// only; never use these outside a demo. The crew lead, Marcus Whitfield (CP-1001), is in
// db/demo/accounts.ts.

export interface FieldAccount {
  role: "lineworker";
  email: string;
  password: string;
  name: string;
  /** The worker this sign-in is linked to. */
  workerNo: string;
  /** Their position on WO-26-0101 tomorrow. */
  position: string;
}

export const FIELD_PASSWORD = "lineworker-26";

export const FIELD_ACCOUNTS: readonly FieldAccount[] = [
  { role: "lineworker", email: "priya.raman@cedarprairie.example", password: FIELD_PASSWORD, name: "Priya Raman", workerNo: "CP-1008", position: "climber" },
  { role: "lineworker", email: "kayla.sorensen@cedarprairie.example", password: FIELD_PASSWORD, name: "Kayla Sorensen", workerNo: "CP-1013", position: "observer" },
  { role: "lineworker", email: "luis.carrasco@cedarprairie.example", password: FIELD_PASSWORD, name: "Luis Carrasco", workerNo: "CP-1021", position: "ground" },
];
