// The crew-check input's equipment, gear and field-figure fields (CREW-CHECK.md, "Equipment,
// gear and field figures"), all optional: the schemas input.ts merges into its own, and the
// conversion of the parsed values. Invalid values are errors naming the path, like the rest of
// the input (a class that does not exist, a negative weight, zero parts of line, an angle
// outside 1-90 degrees).

import { z } from "zod";
import { TABLE_R5_TOP_M } from "./approach";
import { EQUIPMENT_KINDS, GEAR_CLASSES, GEAR_KINDS, LICENCES, type Equipment, type EquipmentAssignment, type GearItem, type Lift, type SiteFields } from "./equipment-types";
import { withLiftDefaults } from "./lift";

/** Built with input.ts's own date schema, so a bad date reads the same everywhere. */
export function equipmentSchemas(isoDate: z.ZodType<string>) {
  const gearItem = z.object({
    kind: z.enum(GEAR_KINDS),
    class: z.enum(GEAR_CLASSES),
    testedOn: isoDate.nullable(),
  });
  const equipment = z.object({
    id: z.string().min(1),
    name: z.string().optional(),
    kind: z.enum(EQUIPMENT_KINDS),
    insulated: z.boolean().default(false),
    dielectricTestedOn: isoDate.nullable().default(null),
    licence: z.enum(LICENCES).nullable().default(null),
  });
  const wll = z.number().positive().nullable().default(null);
  const lift = z.object({
    loadLb: z.number().positive(),
    partsOfLine: z.number().int().min(1),
    sheaves: z.number().int().min(0).optional(),
    frictionPerSheave: z.number().min(0).max(1).default(0.1),
    blockWllLb: wll,
    lineWllLb: wll,
    slingWllLb: wll,
    slingLegs: z.number().int().min(1).default(1),
    slingAngleDeg: z.number().min(1).max(90).default(90),
  });
  return {
    /** Merged into a worker: absent = gear not tracked. */
    worker: { gear: z.array(gearItem).optional() },
    /** Merged into a work order. */
    workOrder: {
      // Table R-5 ends at 6,000 m; sites below sea level take the first row.
      altitudeM: z.number().max(TABLE_R5_TOP_M).default(0),
      phases: z.number().int().min(1).max(3).default(3),
      systemKv: z.number().positive().nullable().default(null),
      lift: lift.nullable().default(null),
    },
    /** Merged into the day: absent = equipment not tracked. */
    day: {
      equipment: z.array(equipment).optional(),
      equipmentAssignments: z.array(z.object({ workOrderId: z.string(), equipmentId: z.string() })).optional(),
    },
  };
}

type Parsed<T> = T extends z.ZodType ? z.output<T> : never;
type Schemas = ReturnType<typeof equipmentSchemas>;

export function toGear(gear: Parsed<Schemas["worker"]["gear"]>): { gear?: GearItem[] } {
  return gear ? { gear: gear.map((g) => ({ kind: g.kind, class: g.class, testedOn: g.testedOn })) } : {};
}

export function toSiteFields(o: {
  altitudeM: number;
  phases: number;
  systemKv: number | null;
  lift: (Omit<Lift, "sheaves"> & { sheaves?: number }) | null;
}): Required<SiteFields> {
  return { altitudeM: o.altitudeM, phases: o.phases, systemKv: o.systemKv, lift: o.lift ? withLiftDefaults(o.lift) : null };
}

/** The day's equipment and assignments, checking ids and references; errors name the path. */
export function toEquipment(
  input: { equipment?: Parsed<Schemas["day"]["equipment"]>; equipmentAssignments?: Parsed<Schemas["day"]["equipmentAssignments"]> },
  orderIds: ReadonlySet<string>,
  errors: string[],
): { equipment?: Equipment[]; equipmentAssignments?: EquipmentAssignment[] } {
  const ids = new Set<string>();
  const equipment = input.equipment?.map((e, i): Equipment => {
    if (ids.has(e.id)) errors.push(`equipment[${i}].id: duplicate equipment id ${JSON.stringify(e.id)}`);
    ids.add(e.id);
    return {
      id: e.id,
      name: e.name && e.name.trim() !== "" ? e.name : e.id,
      kind: e.kind,
      insulated: e.insulated,
      dielectricTestedOn: e.dielectricTestedOn,
      licence: e.licence,
    };
  });
  const assignments = input.equipmentAssignments?.map((a, i): EquipmentAssignment => {
    if (!orderIds.has(a.workOrderId)) {
      errors.push(`equipmentAssignments[${i}].workOrderId: unknown work order ${JSON.stringify(a.workOrderId)}`);
    }
    if (!ids.has(a.equipmentId)) {
      errors.push(`equipmentAssignments[${i}].equipmentId: unknown equipment ${JSON.stringify(a.equipmentId)}`);
    }
    return { workOrderId: a.workOrderId, equipmentId: a.equipmentId };
  });
  const out: { equipment?: Equipment[]; equipmentAssignments?: EquipmentAssignment[] } = {};
  if (equipment) {
    out.equipment = equipment;
    out.equipmentAssignments = assignments ?? [];
  } else if (assignments) {
    out.equipmentAssignments = assignments;
  }
  return out;
}
