import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { PageHeader } from "@/components/status";
import { listWorkTypes } from "@/lib/orders/data-work-types";
import { TemplateForm } from "./template-form";

export const metadata = { title: "Crew templates" };

export default async function TemplatesPage() {
  const user = await requirePageRole("admin");
  const types = await listWorkTypes(db(), user.organisationId);
  return (
    <>
      <PageHeader eyebrow="Admin" title="Crew templates">
        <Link href="/admin" className="btn-quiet">
          Users and policies
        </Link>
      </PageHeader>
      <p className="mb-4 max-w-3xl text-sm text-ink-700">
        Each work type&apos;s default positions and minimum crew. A new order starts with its type&apos;s template; dispatchers add or
        remove positions per order. Every template has exactly one lead position — the employee in charge, who holds the job
        briefing (<span className="[font-variant-ligatures:none]">29 CFR 1910.269(c)(1)</span>); the lead may also hold one other position on the order. The defaults are common practice,
        not law: fit them to your safety program.
      </p>
      <div className="grid gap-4 md:grid-cols-2 xl:grid-cols-3">
        {types.map((t) => (
          <TemplateForm key={t.id} type={t} />
        ))}
      </div>
    </>
  );
}
