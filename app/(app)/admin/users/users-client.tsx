"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ROLES, ROLE_LABEL, type Role } from "@/lib/auth/roles";
import type { UserView } from "@/lib/users/data";

interface Yard {
  id: number;
  code: string;
  name: string;
}

async function send(path: string, method: string, body?: unknown) {
  const res = await fetch(path, { method, headers: { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
  const data = await res.json().catch(() => ({}));
  if (!res.ok) throw new Error(data.error ?? `The server answered ${res.status}.`);
  return data;
}

export function UsersClient({ me, users, yards, workers }: { me: number; users: UserView[]; yards: Yard[]; workers: { id: number; label: string }[] }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  const [role, setRole] = useState<Role>("dispatcher");
  const yardCode = (id: number) => yards.find((y) => y.id === id)?.code ?? String(id);

  async function run(fn: () => Promise<string>) {
    setBusy(true);
    setMessage(null);
    try {
      setMessage({ ok: true, text: await fn() });
      router.refresh();
    } catch (err) {
      setMessage({ ok: false, text: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  async function onCreate(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const form = e.currentTarget;
    await run(async () => {
      const body = {
        email: String(f.get("email") ?? ""),
        name: String(f.get("name") ?? ""),
        role,
        yardIds: role === "dispatcher" ? f.getAll("yardIds").map(Number) : [],
        workerId: role === "lineworker" && f.get("workerId") ? Number(f.get("workerId")) : null,
      };
      const r = await send("/api/users", "POST", body);
      form.reset();
      return `Added ${r.user.name}. They were e-mailed a link to set their password.`;
    });
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <section className="card overflow-x-auto p-4" aria-labelledby="users-h">
        <h2 id="users-h" className="mb-3 font-bold">
          Sign-ins ({users.length})
        </h2>
        {message && (
          <p role={message.ok ? "status" : "alert"} className={`mb-3 rounded-md px-3 py-2 text-sm font-medium ${message.ok ? "bg-clear-bg text-clear" : "bg-block-bg text-block"}`}>
            {message.ok ? "✓" : "✖"} {message.text}
          </p>
        )}
        <table className="w-full min-w-[46rem] text-left text-sm">
          <thead className="text-xs uppercase text-ink-500">
            <tr>
              <th className="py-1 pr-3">Name</th>
              <th className="py-1 pr-3">Role</th>
              <th className="py-1 pr-3">Yards / worker</th>
              <th className="py-1 pr-3">State</th>
              <th className="py-1">Actions</th>
            </tr>
          </thead>
          <tbody>
            {users.map((u) => (
              <tr key={u.id} className="border-t border-rule align-top" data-testid={`user-${u.email}`}>
                <td className="py-2 pr-3">
                  <div className="font-semibold">{u.name}</div>
                  <div className="text-xs text-ink-500">{u.email}</div>
                </td>
                <td className="py-2 pr-3">
                  <label className="sr-only" htmlFor={`role-${u.id}`}>
                    Role of {u.name}
                  </label>
                  <select
                    id={`role-${u.id}`}
                    className="field py-1"
                    defaultValue={u.role}
                    disabled={busy || u.id === me}
                    onChange={(e) => {
                      const next = e.target.value as Role;
                      const extra = next === "dispatcher" ? { yardIds: u.yardIds.length ? u.yardIds : yards.slice(0, 1).map((y) => y.id) } : {};
                      void run(async () => {
                        await send(`/api/users/${u.id}`, "PATCH", { role: next, ...extra });
                        return `${u.name} is now ${ROLE_LABEL[next]}; their open sessions ended.`;
                      });
                    }}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r} disabled={r === "lineworker" && !u.workerId}>
                        {ROLE_LABEL[r]}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="py-2 pr-3 text-xs">
                  {u.role === "dispatcher" ? (
                    <fieldset>
                      <legend className="sr-only">Yards {u.name} dispatches</legend>
                      {yards.map((y) => (
                        <label key={y.id} className="mr-3 inline-flex items-center gap-1">
                          <input
                            type="checkbox"
                            defaultChecked={u.yardIds.includes(y.id)}
                            disabled={busy}
                            onChange={(e) => {
                              const ids = e.target.checked ? [...u.yardIds, y.id] : u.yardIds.filter((i) => i !== y.id);
                              void run(async () => {
                                await send(`/api/users/${u.id}`, "PATCH", { yardIds: ids });
                                return `${u.name} now dispatches ${ids.map(yardCode).join(", ") || "no yard"}.`;
                              });
                            }}
                          />
                          {y.code}
                        </label>
                      ))}
                    </fieldset>
                  ) : u.role === "lineworker" ? (
                    u.workerName ?? "—"
                  ) : (
                    <span className="text-ink-500">All yards</span>
                  )}
                </td>
                <td className="py-2 pr-3">{u.active ? <span className="text-clear">✓ Active</span> : <span className="text-block">✖ Deactivated</span>}</td>
                <td className="space-x-2 whitespace-nowrap py-2">
                  {u.id !== me && (
                    <button
                      type="button"
                      className="btn-quiet"
                      disabled={busy}
                      onClick={() =>
                        run(async () => {
                          await send(`/api/users/${u.id}`, "PATCH", { active: !u.active });
                          return u.active ? `${u.name} is deactivated and signed out everywhere.` : `${u.name} can sign in again.`;
                        })
                      }
                    >
                      {u.active ? "Deactivate" : "Reactivate"}
                    </button>
                  )}
                  {u.active && (
                    <button
                      type="button"
                      className="btn-quiet"
                      disabled={busy}
                      onClick={() =>
                        run(async () => {
                          const r = await send(`/api/users/${u.id}/reset`, "POST");
                          return `A one-time link to set a new password went to ${r.to}.`;
                        })
                      }
                    >
                      Send password reset
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section className="card p-4" aria-labelledby="add-h">
        <h2 id="add-h" className="mb-3 font-bold">
          Add a sign-in
        </h2>
        <form onSubmit={onCreate} className="space-y-3" noValidate>
          <div>
            <label htmlFor="new-name" className="label">
              Name
            </label>
            <input id="new-name" name="name" required className="field" />
          </div>
          <div>
            <label htmlFor="new-email" className="label">
              E-mail
            </label>
            <input id="new-email" name="email" type="email" required className="field" />
          </div>
          <div>
            <label htmlFor="new-role" className="label">
              Role
            </label>
            <select id="new-role" className="field" value={role} onChange={(e) => setRole(e.target.value as Role)}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABEL[r]}
                </option>
              ))}
            </select>
          </div>
          {role === "dispatcher" && (
            <fieldset>
              <legend className="label">Yards they dispatch</legend>
              {yards.map((y) => (
                <label key={y.id} className="mr-3 inline-flex items-center gap-1 text-sm">
                  <input type="checkbox" name="yardIds" value={y.id} /> {y.name}
                </label>
              ))}
            </fieldset>
          )}
          {role === "lineworker" && (
            <div>
              <label htmlFor="new-worker" className="label">
                Signs in as worker
              </label>
              <select id="new-worker" name="workerId" className="field" required>
                <option value="">Pick the worker…</option>
                {workers.map((w) => (
                  <option key={w.id} value={w.id}>
                    {w.label}
                  </option>
                ))}
              </select>
            </div>
          )}
          <p className="text-xs text-ink-500">Supervisors and admins work in every yard. The person gets an e-mail with a one-time link to set their password.</p>
          <button type="submit" className="btn-primary w-full" disabled={busy}>
            Add sign-in
          </button>
        </form>
      </section>
    </div>
  );
}
