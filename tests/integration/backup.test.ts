import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createHash } from "node:crypto";
import knex, { type Knex } from "knex";
import { afterAll, describe, expect, it } from "vitest";
import { dbConfig } from "@/knexfile";

// A quiet copy of the demo (no app writes to it), dumped with scripts/backup and loaded with
// scripts/restore into another database: every table must come back with the same row count
// and the same content checksum (SHA-256 over every row, in key order). InnoDB's own CHECKSUM
// TABLE is not used: it also reads the physical record layout, which a reload may change.
const SRC = `${process.env.DB_NAME ?? "gaffline_test"}_bk_src`;
const DST = `${process.env.DB_NAME ?? "gaffline_test"}_bk_dst`;
const root = join(__dirname, "..", "..");
const dir = mkdtempSync(join(tmpdir(), "gaffline-backup-"));
const env = { ...process.env };

function sh(cmd: string, args: string[], extra: Record<string, string> = {}) {
  return execFileSync(cmd, args, { cwd: root, env: { ...env, ...extra }, encoding: "utf8", stdio: ["ignore", "pipe", "pipe"] });
}

async function tableStats(db: Knex) {
  const tables = (await db.raw("SHOW TABLES"))[0].map((r: Record<string, string>) => Object.values(r)[0]).sort();
  const out: Record<string, { rows: number; checksum: string }> = {};
  for (const t of tables) {
    const [[c]] = await db.raw("SELECT COUNT(*) AS n FROM ??", [t]);
    const [cols] = await db.raw("SHOW COLUMNS FROM ??", [t]);
    const order = cols.map((_: unknown, i: number) => i + 1).join(", ");
    const [rows] = await db.raw(`SELECT * FROM ?? ORDER BY ${order}`, [t]);
    const hash = createHash("sha256");
    for (const r of rows) hash.update(JSON.stringify(r, (_k, v) => (Buffer.isBuffer(v) ? v.toString("hex") : v)) + "\n");
    out[t] = { rows: Number(c.n), checksum: hash.digest("hex") };
  }
  return out;
}

let src: Knex | undefined;
let dst: Knex | undefined;
afterAll(async () => {
  await src?.destroy();
  await dst?.destroy();
  rmSync(dir, { recursive: true, force: true });
  if (!process.env.KEEP_BACKUP_DBS) sh("bash", ["-c", `source scripts/lib/common.sh; mariadb_root -e 'DROP DATABASE IF EXISTS \`${SRC}\`; DROP DATABASE IF EXISTS \`${DST}\`'`]);
});

describe("scripts/backup and scripts/restore", () => {
  it("a round trip restores identical row counts and checksums per table", async () => {
    sh("bash", ["-c", `source scripts/lib/common.sh; mariadb_root -e 'DROP DATABASE IF EXISTS \`${SRC}\`'; create_database ${SRC}`]);
    sh("node", ["--import", "tsx", "scripts/db.ts", "migrate"], { DB_NAME: SRC });
    sh("node", ["--import", "tsx", "scripts/db.ts", "seed"], { DB_NAME: SRC });
    const file = join(dir, "dump.sql.gz");
    sh("scripts/backup", [file], { DB_NAME: SRC });
    sh("scripts/restore", [file, DST]);
    src = knex(dbConfig({ database: SRC }));
    dst = knex(dbConfig({ database: DST }));
    const a = await tableStats(src);
    const b = await tableStats(dst);
    expect(Object.keys(a).length).toBeGreaterThan(20);
    expect(a.workers.rows).toBeGreaterThan(0);
    expect(b).toEqual(a);
  }, 120_000);
});
