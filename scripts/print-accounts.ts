import { DEMO_ACCOUNTS } from "../db/demo/accounts";

for (const a of DEMO_ACCOUNTS) {
  console.log(`    ${a.role.padEnd(11)} ${a.email.padEnd(40)} ${a.password}`);
}
