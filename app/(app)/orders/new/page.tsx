import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { PageHeader } from "@/components/status";
import { listWorkTypes } from "@/lib/orders/data-work-types";
import { listYards } from "@/lib/yards/data";
import { addDays, todayIn } from "@/lib/time/days";
import { isIsoDate } from "@/lib/rules/time";
import { OrderForm, type OrderFormShape } from "../order-form";

export const metadata = { title: "New work order" };

export default async function NewOrderPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const user = await requirePageRole("dispatcher", "supervisor");
  const sp = await searchParams;
  const conn = db();
  const [yards, workTypes] = await Promise.all([listYards(conn, user.organisationId), listWorkTypes(conn, user.organisationId)]);
  const yard = yards.find((y) => y.code === sp.yard) ?? yards.find((y) => y.id === user.homeYardId) ?? yards[0];
  const type = workTypes.find((t) => t.code === "pole_climb") ?? workTypes[0];
  const day = sp.date && isIsoDate(sp.date) ? sp.date : addDays(todayIn(yard.timezone), 1);
  const initial: OrderFormShape = {
    title: "",
    yardId: yard.id,
    workTypeId: type.id,
    address: "",
    structureNo: "",
    start: `${day}T07:00`,
    end: `${day}T15:30`,
    energized: true,
    voltageKv: 12.47,
    nearEnergizedKv: null,
    phases: 3,
    systemKv: null,
    shifts: [],
    emergency: false,
    crewException: null,
    minCrew: type.minCrew,
    positions: type.positions.map((position) => ({ position })),
    priority: 3,
    notes: "",
    status: "planned",
    holdReason: null,
    driverLicence: null,
    locateTicket: "",
    locateValidThrough: null,
    actualStart: null,
    actualEnd: null,
    recurrence: null,
  };
  return (
    <>
      <PageHeader eyebrow="Work orders" title="New work order">
        <Link href="/orders" className="btn-quiet">
          Back to orders
        </Link>
      </PageHeader>
      <OrderForm
        mode="new"
        yards={yards.map((y) => ({ id: y.id, code: y.code, name: y.name, timezone: y.timezone }))}
        workTypes={workTypes}
        initial={initial}
      />
    </>
  );
}
