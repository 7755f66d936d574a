import { notFound } from "next/navigation";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { fakesEnabled } from "@/lib/notify/config";
import { workersWithPhones } from "@/lib/workers/data";
import { formatPhone } from "@/lib/notify/wording";
import { PageHeader } from "@/components/status";
import { PhoneClient, type PhoneOwner } from "./phone-client";

export const metadata = { title: "Phone simulator" };
export const dynamic = "force-dynamic";

// A stand-in for a lineworker's phone, for demos: only while the local fakes are on.
export default async function PhonePage({ searchParams }: { searchParams: Promise<{ phone?: string }> }) {
  const user = await requirePageRole("dispatcher", "supervisor", "admin");
  if (!fakesEnabled()) notFound();
  const sp = await searchParams;
  const rows = await workersWithPhones(db(), user.organisationId);
  const owners: PhoneOwner[] = rows.map((r) => ({
    workerId: r.id,
    name: `${r.first_name} ${r.last_name}`,
    phone: r.phone_e164,
    display: formatPhone(r.phone_e164) ?? r.phone_e164,
    optedIn: Boolean(r.sms_opt_in),
    yard: r.yard_code,
    timezone: r.timezone,
  }));
  const initial = owners.find((o) => o.phone === sp.phone)?.phone ?? owners[0]?.phone ?? null;
  return (
    <>
      <PageHeader eyebrow="Demo" title="Phone simulator" />
      <PhoneClient owners={owners} initialPhone={initial} fromNumber={formatPhone(process.env.TWILIO_FROM_NUMBER ?? "") ?? ""} />
    </>
  );
}
