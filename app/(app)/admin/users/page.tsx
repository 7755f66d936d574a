import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { PageHeader } from "@/components/status";
import { listUsers } from "@/lib/users/data";
import { activeWorkerChoices } from "@/lib/workers/data";
import { yardChoices } from "@/lib/yards/data";
import { UsersClient } from "./users-client";

export const metadata = { title: "Users" };
export const dynamic = "force-dynamic";

// Admin: add a sign-in, change a role or a dispatcher's yards, deactivate or reactivate, send a
// password reset link. Each change is audited and ends the user's sessions at once.
export default async function UsersPage() {
  const user = await requirePageRole("admin");
  const [users, yards, workers] = await Promise.all([
    listUsers(db(), user.organisationId),
    yardChoices(db(), user.organisationId),
    activeWorkerChoices(db(), user.organisationId),
  ]);
  return (
    <>
      <PageHeader eyebrow="Admin" title="Users">
        <Link href="/admin" className="btn-quiet">
          Policies
        </Link>
      </PageHeader>
      <UsersClient
        me={user.id}
        users={users}
        yards={yards.map((y) => ({ id: Number(y.id), code: y.code, name: y.name }))}
        workers={workers.map((w) => ({ id: Number(w.id), label: `${w.first_name} ${w.last_name} (${w.employee_no})` }))}
      />
    </>
  );
}
