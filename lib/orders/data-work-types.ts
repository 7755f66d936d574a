import "@/lib/server-only";
import type { Knex } from "knex";
import type { Position } from "@/lib/rules/types";
import type { WorkTypeView } from "@/lib/orders/model";

/** Work types with their crew templates (positions in sort order). */
export async function listWorkTypes(db: Knex | Knex.Transaction, organisationId: number): Promise<WorkTypeView[]> {
  const types = await db("work_types").where({ organisation_id: organisationId }).orderBy("name");
  if (types.length === 0) return [];
  const positions = await db("work_type_positions")
    .whereIn(
      "work_type_id",
      types.map((t) => t.id),
    )
    .orderBy(["work_type_id", "sort", "id"]);
  return types.map((t) => ({
    id: Number(t.id),
    code: String(t.code),
    name: String(t.name),
    ruleType: String(t.rule_type),
    minCrew: Number(t.min_crew),
    digs: Boolean(t.digs),
    positions: positions.filter((p) => p.work_type_id === t.id).map((p) => p.position as Position),
  }));
}

export async function getWorkType(db: Knex | Knex.Transaction, organisationId: number, id: number): Promise<WorkTypeView | null> {
  const all = await listWorkTypes(db, organisationId);
  return all.find((t) => t.id === id) ?? null;
}

/** Replaces one work type's template (name, minimum crew, digs, positions). */
export async function saveTemplate(
  trx: Knex.Transaction,
  id: number,
  t: { name: string; minCrew: number; digs: boolean; positions: Position[] },
) {
  await trx("work_types").where({ id }).update({ name: t.name, min_crew: t.minCrew, digs: t.digs });
  await trx("work_type_positions").where({ work_type_id: id }).delete();
  await trx("work_type_positions").insert(t.positions.map((position, sort) => ({ work_type_id: id, position, sort })));
}
