// Database tasks for the scripts: migrate, seed (demo scenario), reset (drop everything).
import knex from "knex";
import { dbConfig } from "../knexfile";

async function main() {
  const task = process.argv[2];
  const db = knex(dbConfig());
  try {
    if (task === "migrate") {
      const [batch, names] = await db.migrate.latest();
      console.log(names.length ? `migrated (batch ${batch}): ${names.join(", ")}` : "schema up to date");
    } else if (task === "seed") {
      const [names] = await db.seed.run();
      console.log(`seeded: ${names.map((n: string) => n.split("/").pop()).join(", ")}`);
    } else if (task === "reset") {
      await db.migrate.rollback(undefined, true);
      const [, names] = await db.migrate.latest();
      console.log(`reset: ${names.length} migrations`);
    } else {
      console.error("usage: db.ts migrate|seed|reset");
      process.exitCode = 2;
    }
  } finally {
    await db.destroy();
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
