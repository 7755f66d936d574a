import { DEMO_ACCOUNTS } from "../db/demo/accounts";
import { FIELD_ACCOUNTS } from "../db/demo/field-accounts";

for (const a of [...DEMO_ACCOUNTS, ...FIELD_ACCOUNTS]) {
  console.log(`    ${a.role.padEnd(11)} ${a.email.padEnd(40)} ${a.password}`);
}
