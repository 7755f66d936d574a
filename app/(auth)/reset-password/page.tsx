import { ResetForm } from "./reset-form";

export const metadata = { title: "Set your password" };

// The e-mailed one-time link lands here (signed out). The token is checked when the form is sent.
export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string | string[] }> }) {
  const { token } = await searchParams;
  const t = typeof token === "string" ? token : "";
  return (
    <div className="rounded-card bg-paper p-6 shadow-xl sm:p-8">
      <p className="text-xs font-bold uppercase tracking-widest text-copper">Gaffline</p>
      <h1 className="mt-1 text-2xl font-extrabold tracking-tight">Set your password</h1>
      {t ? <ResetForm token={t} /> : <p className="mt-4 text-sm">This link is incomplete. Open the link from the e-mail again, or ask your admin for a new one.</p>}
    </div>
  );
}
