import { readFileSync } from "node:fs";
import path from "node:path";
import type { Knex } from "knex";

/**
 * The database password: from the environment, else the one scripts/lib/common.sh generated for
 * this installation into .data/db-password (none is written in the repository).
 */
export function dbPassword(): string | undefined {
  if (process.env.DB_PASSWORD) return process.env.DB_PASSWORD;
  try {
    return readFileSync(path.join(process.cwd(), ".data", "db-password"), "utf8").trim();
  } catch {
    return undefined;
  }
}

// One configuration, read from the environment that scripts/start and scripts/test set.
// Times are stored in UTC (DATETIME); DATE columns come back as 'YYYY-MM-DD' strings.
export function dbConfig(overrides: Partial<Record<"database", string>> = {}): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      host: process.env.DB_HOST ?? "127.0.0.1",
      port: Number(process.env.DB_PORT ?? 3307),
      user: process.env.DB_USER ?? "gaffline",
      password: dbPassword(),
      database: overrides.database ?? process.env.DB_NAME ?? "gaffline",
      timezone: "Z",
      // mysql2 accepts a list of column types here; knex's typing only knows the boolean form.
      dateStrings: ["DATE"] as unknown as boolean,
      charset: "utf8mb4",
      supportBigNumbers: true,
      connectTimeout: 3000,
    },
    pool: { min: 0, max: Number(process.env.DB_POOL ?? 10), acquireTimeoutMillis: 4000 },
    acquireConnectionTimeout: 4000,
    migrations: {
      directory: "./db/migrations",
      extension: "ts",
      loadExtensions: [".ts"],
      tableName: "knex_migrations",
    },
    seeds: { directory: "./db/seeds", extension: "ts", loadExtensions: [".ts"] },
  };
}

const config: Knex.Config = dbConfig();
export default config;
