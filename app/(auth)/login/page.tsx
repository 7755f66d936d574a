import { redirect } from "next/navigation";
import { currentUser } from "@/lib/auth/session";
import { START_PAGE } from "@/lib/users/roles";
import { LoginForm } from "./login-form";
import { Logo } from "@/components/logo";

export const metadata = { title: "Sign in" };

export default async function LoginPage() {
  const user = await currentUser();
  if (user) redirect(START_PAGE[user.role]);
  return (
    <div className="rounded-card bg-paper p-6 shadow-xl sm:p-8">
      <h1>
        <Logo className="text-ink" />
      </h1>
      <p className="mt-1 text-sm text-ink-500">Crew dispatch for distribution line work</p>
      <LoginForm />
    </div>
  );
}
