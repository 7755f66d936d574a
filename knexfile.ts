import type { Knex } from "knex";

// One configuration, read from the environment that scripts/start and scripts/test set.
// Times are stored in UTC (DATETIME); DATE columns come back as 'YYYY-MM-DD' strings.
export function dbConfig(overrides: Partial<Record<"database", string>> = {}): Knex.Config {
  return {
    client: "mysql2",
    connection: {
      host: process.env.DB_HOST ?? "127.0.0.1",
      port: Number(process.env.DB_PORT ?? 3307),
      user: process.env.DB_USER ?? "gaffline",
      password: process.env.DB_PASSWORD ?? "gaffline-local",
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
