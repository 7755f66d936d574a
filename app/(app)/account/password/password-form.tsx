"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signOut } from "next-auth/react";
import { useForm } from "react-hook-form";
import { FormAlert, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import { passwordChangeSchema } from "@/lib/users/model";

type Values = { currentPassword: string; newPassword: string; confirm: string };

/** Change one's own password (POST /api/me/password, same schema); every session ends after. */
export function PasswordForm() {
  const form = useForm<Values>({ resolver: zodResolver(passwordChangeSchema as never) as never, defaultValues: { currentPassword: "", newPassword: "", confirm: "" } });
  const { register } = form;
  const errors = form.formState.errors;
  const save = useApiMutation<Values>({
    request: (values) => ({ url: "/api/me/password", method: "POST", body: values }),
    form,
    onSuccess: () => {
      setTimeout(() => void signOut({ callbackUrl: "/login" }), 1500);
    },
  });

  if (save.isSuccess) {
    return <FormAlert tone="clear">Password changed. Signing you out: sign in again with the new password.</FormAlert>;
  }
  return (
    <form onSubmit={form.handleSubmit(save.submit)} className="space-y-4" noValidate>
      <TextField id="current" type="password" autoComplete="current-password" label="Current password" error={errors.currentPassword?.message} {...register("currentPassword")} />
      <TextField id="next" type="password" autoComplete="new-password" label="New password (12 characters or more)" error={errors.newPassword?.message} {...register("newPassword")} />
      <TextField id="confirm" type="password" autoComplete="new-password" label="New password again" error={errors.confirm?.message} {...register("confirm")} />
      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      <button type="submit" className="btn-primary w-full" disabled={save.isPending}>
        Change password
      </button>
    </form>
  );
}
