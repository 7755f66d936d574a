import { requirePageRole } from "@/lib/auth/session";
import { PageHeader } from "@/components/status";
import { PasswordForm } from "./password-form";

export const metadata = { title: "Change my password" };

// Every signed-in user, whatever their role.
export default async function PasswordPage() {
  const user = await requirePageRole();
  return (
    <>
      <PageHeader eyebrow="Account" title="Change my password" />
      <section className="card max-w-md p-4">
        <p className="mb-4 text-sm text-ink-500">
          Signed in as {user.email}. After the change every session of yours ends, on every device: sign in again with the new password.
        </p>
        <PasswordForm />
      </section>
    </>
  );
}
