import "@/lib/server-only";
import type { Knex } from "knex";

export interface Yard {
  id: number;
  organisationId: number;
  code: string;
  name: string;
  timezone: string;
  address: string | null;
  dispatcherPhone: string | null;
}

const toYard = (r: Record<string, unknown>): Yard => ({
  id: Number(r.id),
  organisationId: Number(r.organisation_id),
  code: String(r.code),
  name: String(r.name),
  timezone: String(r.timezone),
  address: (r.address as string) ?? null,
  dispatcherPhone: (r.dispatcher_phone as string) ?? null,
});

export async function listYards(db: Knex, organisationId: number): Promise<Yard[]> {
  const rows = await db("yards").where({ organisation_id: organisationId }).orderBy("code");
  return rows.map(toYard);
}

/** The yard by code, or the user's home yard, or the first yard. */
export async function pickYard(db: Knex, organisationId: number, code?: string | null, homeYardId?: number | null) {
  const yards = await listYards(db, organisationId);
  const yard =
    (code && yards.find((y) => y.code.toLowerCase() === code.toLowerCase())) ||
    (homeYardId && yards.find((y) => y.id === homeYardId)) ||
    yards[0];
  return { yard: yard ?? null, yards };
}

/** Yards as choices for a form (id, code, name), by name. */
export async function yardChoices(db: Knex, organisationId: number): Promise<{ id: number; code: string; name: string }[]> {
  const rows = await db("yards").where({ organisation_id: organisationId }).orderBy("name").select("id", "code", "name");
  return rows.map((y) => ({ id: Number(y.id), code: String(y.code), name: String(y.name) }));
}

/** The organisation's first yard (by id): its clock is the one organisation-wide pages show. */
export async function firstYard(db: Knex, organisationId: number): Promise<{ timezone: string; name: string } | null> {
  const y = await db("yards").where({ organisation_id: organisationId }).orderBy("id").first("timezone", "name");
  return y ? { timezone: String(y.timezone), name: String(y.name) } : null;
}

/** A yard's name by its code (any case) in the organisation, or undefined. */
export async function yardNameByCode(db: Knex, organisationId: number, code: string): Promise<{ name: string } | undefined> {
  return db("yards").where({ organisation_id: organisationId }).whereRaw("LOWER(code) = ?", [code.toLowerCase()]).first("name");
}

/** A yard's name by id, or undefined (for the yard-scope refusal). */
export async function yardNameById(db: Knex, yardId: number): Promise<{ name: string } | undefined> {
  return db("yards").where({ id: yardId }).first("name");
}

/** A yard's elevation in metres (0 when unknown), for the approach distance's altitude factor. */
export async function yardElevationM(db: Knex, yardId: number): Promise<number> {
  const yard = await db("yards").where({ id: yardId }).first("elevation_m");
  return Number(yard?.elevation_m ?? 0);
}
