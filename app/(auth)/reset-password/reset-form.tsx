"use client";

import Link from "next/link";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FormAlert, TextField } from "@/components/form/fields";
import { apiFetch, asFailure, placeFailure } from "@/lib/api/client";

type Values = { password: string; confirm: string };

/** Set a password from a reset or welcome link (POST /api/password-reset). Signed out: no query client, so apiFetch directly. */
export function ResetForm({ token }: { token: string }) {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const form = useForm<Values>({ defaultValues: { password: "", confirm: "" } });
  const errors = form.formState.errors;

  async function onSubmit(values: Values) {
    setError(null);
    try {
      await apiFetch("/api/password-reset", { method: "POST", body: { token, password: values.password } });
      setDone(true);
    } catch (err) {
      setError(placeFailure(form, asFailure(err), ["password"]).message);
    }
  }

  if (done) {
    return (
      <div className="mt-4">
        <FormAlert tone="clear">
          Password set. <Link href="/login" className="underline">Sign in</Link> with it.
        </FormAlert>
      </div>
    );
  }
  return (
    <form onSubmit={form.handleSubmit(onSubmit)} className="mt-6 space-y-4" noValidate>
      <TextField
        type="password"
        autoComplete="new-password"
        label="New password (12 characters or more)"
        error={errors.password?.message}
        {...form.register("password")}
      />
      <TextField
        type="password"
        autoComplete="new-password"
        label="New password again"
        error={errors.confirm?.message}
        {...form.register("confirm", { validate: (v, all) => v === all.password || "The two passwords differ." })}
      />
      {error && <FormAlert tone="block">{error}</FormAlert>}
      <button type="submit" className="btn-primary w-full" disabled={form.formState.isSubmitting}>
        Set password
      </button>
    </form>
  );
}
