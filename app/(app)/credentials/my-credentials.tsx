import Link from "next/link";
import { db } from "@/lib/db";
import { workerCredentials } from "@/lib/credentials/data";
import { listTypes } from "@/lib/credentials/data-qualification-types";
import { getWorker } from "@/lib/workers/data";
import { todayIn } from "@/lib/time/days";
import { MyCredentialsList } from "@/components/my-credentials-list";

/**
 * The lineworker's own credentials, for the My week page: read-only, with "Send renewal"
 * (upload of the new card, pending until HR verifies). Server component:
 *   <MyCredentials workerId={user.workerId} organisationId={user.organisationId} />
 */
export async function MyCredentials({ workerId, organisationId }: { workerId: number | null; organisationId: number }) {
  if (!workerId) return null;
  const worker = await getWorker(db(), organisationId, workerId);
  if (!worker) return null;
  const [creds, types] = await Promise.all([workerCredentials(db(), organisationId, workerId), listTypes(db(), organisationId)]);
  return (
    <section aria-labelledby="my-creds-h" className="mt-8">
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="my-creds-h" className="text-base font-bold">
          My credentials
        </h2>
        <Link href={`/credentials/${workerId}`} className="text-sm font-semibold text-copper hover:underline">
          History
        </Link>
      </div>
      <MyCredentialsList
        workerId={workerId}
        current={creds.current}
        pending={creds.pending}
        types={types.map((t) => ({ id: t.id, code: t.code, name: t.name, renewalMonths: t.renewalMonths, needsEvidence: t.needsEvidence }))}
        today={todayIn(worker.timezone)}
      />
    </section>
  );
}
