import { requirePageRole } from "@/lib/auth/session";
import { ROLES } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { PageHeader, SafetyNote } from "@/components/status";
import { listEquipment, upcomingBookingsOf } from "@/lib/equipment/data";
import { CAN_EDIT_EQUIPMENT } from "@/lib/equipment/roles";
import { listYards } from "@/lib/yards/data";
import { todayIn } from "@/lib/time/days";
import { EquipmentClient } from "./equipment-client";

export const metadata = { title: "Equipment" };

export default async function EquipmentPage() {
  const user = await requirePageRole(...ROLES);
  const conn = db();
  const [equipment, yards] = await Promise.all([listEquipment(conn, user.organisationId), listYards(conn, user.organisationId)]);
  const home = yards.find((y) => y.id === user.homeYardId) ?? yards[0];
  const upcoming = await upcomingBookingsOf(conn, user.organisationId);
  const bookings: Record<number, { number: string; day: string }[]> = {};
  for (const b of upcoming) (bookings[b.equipment_id] ??= []).push({ number: b.number, day: b.work_date });
  return (
    <>
      <PageHeader eyebrow="Equipment" title="Trucks, trailers and rigging" />
      <SafetyNote className="mb-4" />
      <EquipmentClient
        initial={equipment}
        yards={yards.map((y) => ({ id: y.id, code: y.code, name: y.name }))}
        homeYardCode={home?.code ?? ""}
        today={home ? todayIn(home.timezone) : new Date().toISOString().slice(0, 10)}
        canEdit={CAN_EDIT_EQUIPMENT.includes(user.role)}
        bookings={bookings}
      />
    </>
  );
}
