"use client";

import { useState } from "react";
import { FormAlert, SelectField } from "@/components/form/fields";
import { placeFailure, type IssueTarget } from "@/lib/api/client";
import { useApiMutation } from "@/lib/api/mutations";
import { ROLES, ROLE_LABEL, type Role } from "@/lib/users/roles";
import type { UserView } from "@/lib/users/model";
import { AddUserForm } from "./add-user-form";

interface Yard {
  id: number;
  code: string;
  name: string;
}

/** One write of this screen: where to send it and what to say when it is done. */
interface Write {
  url: string;
  method: string;
  body?: unknown;
  done: (answer: any) => string;
  form?: IssueTarget;
}

export function UsersClient({ me, users, yards, workers }: { me: number; users: UserView[]; yards: Yard[]; workers: { id: number; label: string }[] }) {
  const [done, setDone] = useState<string | null>(null);
  const write = useApiMutation<Write>({
    request: (w) => ({ url: w.url, method: w.method, body: w.body }),
    refresh: true,
    onSuccess: (answer, w) => setDone(w.done(answer)),
    onFailure: (f, w) => {
      if (w.form) placeFailure(w.form, f);
    },
  });
  const busy = write.isPending;
  const yardCode = (id: number) => yards.find((y) => y.id === id)?.code ?? String(id);
  const run = (w: Write) => {
    setDone(null);
    return write.submit(w);
  };

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_22rem]">
      <section className="card overflow-x-auto p-4" aria-labelledby="users-h">
        <h2 id="users-h" className="mb-3 font-bold">
          Sign-ins ({users.length})
        </h2>
        <div className="mb-3 empty:hidden">
          {write.errorText ? <FormAlert tone="block">{write.errorText}</FormAlert> : done && <FormAlert tone="clear">{done}</FormAlert>}
        </div>
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
                  <SelectField
                    id={`role-${u.id}`}
                    hideLabel
                    label={`Role of ${u.name}`}
                    className="field py-1"
                    defaultValue={u.role}
                    disabled={busy || u.id === me}
                    onChange={(e) => {
                      const next = e.target.value as Role;
                      const extra = next === "dispatcher" ? { yardIds: u.yardIds.length ? u.yardIds : yards.slice(0, 1).map((y) => y.id) } : {};
                      void run({ url: `/api/users/${u.id}`, method: "PATCH", body: { role: next, ...extra }, done: () => `${u.name} is now ${ROLE_LABEL[next]}; their open sessions ended.` });
                    }}
                  >
                    {ROLES.map((r) => (
                      <option key={r} value={r} disabled={r === "lineworker" && !u.workerId}>
                        {ROLE_LABEL[r]}
                      </option>
                    ))}
                  </SelectField>
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
                              void run({ url: `/api/users/${u.id}`, method: "PATCH", body: { yardIds: ids }, done: () => `${u.name} now dispatches ${ids.map(yardCode).join(", ") || "no yard"}.` });
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
                        run({
                          url: `/api/users/${u.id}`,
                          method: "PATCH",
                          body: { active: !u.active },
                          done: () => (u.active ? `${u.name} is deactivated and signed out everywhere.` : `${u.name} can sign in again.`),
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
                      onClick={() => run({ url: `/api/users/${u.id}/reset`, method: "POST", done: (r) => `A one-time link to set a new password went to ${r.to}.` })}
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
        <AddUserForm
          yards={yards}
          workers={workers}
          busy={busy}
          onCreate={async (user, form) =>
            (await run({ url: "/api/users", method: "POST", body: user, form, done: (r) => `Added ${r.user.name}. They were e-mailed a link to set their password.` })) !== undefined
          }
        />
      </section>
    </div>
  );
}
