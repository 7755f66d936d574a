"use client";

import { useForm } from "react-hook-form";
import { ChoiceGroup, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { ROLES, ROLE_LABEL, type Role } from "@/lib/users/roles";
import type { IssueTarget } from "@/lib/api/client";

interface Yard {
  id: number;
  code: string;
  name: string;
}

type Values = { name: string; email: string; role: Role; yardIds: string[] | string | false; workerId: string };

export interface NewUser {
  email: string;
  name: string;
  role: Role;
  yardIds: number[];
  workerId: number | null;
}

/** Add a sign-in (POST /api/users); the route's 422 issues come back onto these fields through `bind`. */
export function AddUserForm({
  yards,
  workers,
  busy,
  onCreate,
}: {
  yards: Yard[];
  workers: { id: number; label: string }[];
  busy: boolean;
  /** Sends it; resolves true when it was added. `form` receives the route's field issues. */
  onCreate: (user: NewUser, form: IssueTarget) => Promise<boolean>;
}) {
  const form = useForm<Values>({ defaultValues: { name: "", email: "", role: "dispatcher", yardIds: [], workerId: "" } });
  const { register, watch } = form;
  const errors = form.formState.errors;
  const role = watch("role");

  async function submit(v: Values) {
    const ids = (Array.isArray(v.yardIds) ? v.yardIds : typeof v.yardIds === "string" ? [v.yardIds] : []).map(Number);
    const ok = await onCreate(
      {
        email: v.email,
        name: v.name,
        role: v.role,
        yardIds: v.role === "dispatcher" ? ids : [],
        workerId: v.role === "lineworker" && v.workerId ? Number(v.workerId) : null,
      },
      form,
    );
    if (ok) form.reset({ name: "", email: "", role: v.role, yardIds: [], workerId: "" });
  }

  return (
    <form onSubmit={form.handleSubmit(submit)} className="space-y-3" noValidate>
      <TextField id="new-name" label="Name" required error={errors.name?.message} {...register("name")} />
      <TextField id="new-email" label="E-mail" type="email" required error={errors.email?.message} {...register("email")} />
      <SelectField id="new-role" label="Role" error={errors.role?.message} {...register("role")}>
        <LabelOptions values={ROLES} labels={ROLE_LABEL} />
      </SelectField>
      {role === "dispatcher" && (
        <ChoiceGroup legend="Yards they dispatch" error={errors.yardIds?.message}>
          {yards.map((y) => (
            <label key={y.id} className="mr-3 inline-flex items-center gap-1 text-sm">
              <input type="checkbox" value={y.id} {...register("yardIds")} /> {y.name}
            </label>
          ))}
        </ChoiceGroup>
      )}
      {role === "lineworker" && (
        <SelectField id="new-worker" label="Signs in as worker" required error={errors.workerId?.message} {...register("workerId")}>
          <option value="">Pick the worker…</option>
          {workers.map((w) => (
            <option key={w.id} value={w.id}>
              {w.label}
            </option>
          ))}
        </SelectField>
      )}
      <p className="text-xs text-ink-500">Supervisors and admins work in every yard. The person gets an e-mail with a one-time link to set their password.</p>
      <button type="submit" className="btn-primary w-full" disabled={busy}>
        Add sign-in
      </button>
    </form>
  );
}
