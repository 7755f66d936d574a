import { requirePageRole } from "@/lib/auth/session";
import { CAN_KEEP_CREDENTIALS } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { listWorkers } from "@/lib/workers/data";
import { listYards } from "@/lib/yards/data";
import { PageHeader } from "@/components/status";
import { RosterClient } from "./roster-client";

export const metadata = { title: "Roster" };

export default async function RosterPage({ searchParams }: { searchParams: Promise<{ edit?: string }> }) {
  const user = await requirePageRole("hr", "admin", "dispatcher", "supervisor");
  const [workers, yards] = await Promise.all([listWorkers(db(), user.organisationId), listYards(db(), user.organisationId)]);
  const { edit } = await searchParams;
  const canEdit = CAN_KEEP_CREDENTIALS.includes(user.role);
  return (
    <>
      <PageHeader eyebrow="Roster" title={`Workers (${workers.filter((w) => w.active).length} active)`} />
      <RosterClient
        workers={workers}
        yards={yards.map((y) => ({ id: y.id, code: y.code, name: y.name }))}
        canEdit={canEdit}
        canSeeCredentials={["hr", "admin", "supervisor"].includes(user.role)}
        editId={canEdit && edit && /^\d+$/.test(edit) ? Number(edit) : null}
      />
    </>
  );
}
