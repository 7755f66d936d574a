import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { PageHeader } from "@/components/status";
import { ROLE_LABEL, type Role } from "@/lib/users/roles";
import { getPolicy } from "@/lib/policies/data";
import { listUserSummaries } from "@/lib/users/data";
import { PolicyForm } from "./policy-form";

export const metadata = { title: "Admin" };

export default async function AdminPage() {
  const user = await requirePageRole("admin");
  const [users, policy] = await Promise.all([
    listUserSummaries(db(), user.organisationId),
    getPolicy(db(), user.organisationId),
  ]);
  return (
    <>
      <PageHeader eyebrow="Admin" title="Users and policies">
        <Link href="/admin/users" className="btn-quiet">
          Manage users
        </Link>
        <Link href="/admin/templates" className="btn-quiet">
          Crew templates
        </Link>
      </PageHeader>
      <div className="grid gap-6 lg:grid-cols-2">
        <section className="card p-4">
          <h2 className="mb-3 font-bold">Crew-rule policy</h2>
          <p className="mb-4 text-xs text-ink-500">
            Defaults are common practice, not law: edit them to match your safety program and agreements.
          </p>
          <PolicyForm policy={policy} />
        </section>
        <section className="card overflow-x-auto p-4">
          <h2 className="mb-3 font-bold">Users ({users.length})</h2>
          <table className="w-full text-left text-sm">
            <thead className="text-xs uppercase text-ink-500">
              <tr>
                <th className="py-1 pr-3">Name</th>
                <th className="py-1 pr-3">E-mail</th>
                <th className="py-1">Role</th>
              </tr>
            </thead>
            <tbody>
              {users.map((u) => (
                <tr key={u.id} className="border-t border-rule">
                  <td className="py-1.5 pr-3 font-semibold">{u.name}</td>
                  <td className="py-1.5 pr-3">{u.email}</td>
                  <td className="py-1.5">{ROLE_LABEL[u.role as Role]}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      </div>
    </>
  );
}
