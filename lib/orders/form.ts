// Turning an order as shown into the values its edit form (and PATCH merging) starts from. Pure.
import type { OrderEditValues } from "@/lib/orders/schema";
import type { OrderView } from "./model";

export function editValuesFromView(o: OrderView): OrderEditValues {
  return {
    title: o.title,
    yardId: o.yardId,
    workTypeId: o.workTypeId,
    address: o.address,
    structureNo: o.structureNo,
    start: o.startLocal,
    end: o.endLocal,
    energized: o.energized,
    voltageKv: o.voltageKv,
    nearEnergizedKv: o.nearEnergizedKv,
    phases: o.phases,
    systemKv: o.systemKv,
    altitudeM: o.altitudeM,
    shifts: o.shifts.map((s) => ({ start: s.startLocal, end: s.endLocal })),
    emergency: o.emergency,
    crewException: (o.crewException as OrderEditValues["crewException"]) ?? null,
    minCrew: o.minCrew,
    positions: o.seats.map((s) => ({ id: s.id, position: s.position })),
    priority: o.priority,
    notes: o.notes,
    status: o.status,
    holdReason: o.holdReason,
    driverLicence: o.driverLicence,
    locateTicket: o.locateTicket,
    locateValidThrough: o.locateValidThrough,
    actualStart: o.actualStartLocal,
    actualEnd: o.actualEndLocal,
    version: o.version,
  };
}
