import { requirePageRole } from "@/lib/auth/session";
import { CAN_KEEP_CREDENTIALS } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { listCredentials } from "@/lib/credentials/data";
import { listTypes } from "@/lib/credentials/data-qualification-types";
import { listYards } from "@/lib/yards/data";
import { PageHeader } from "@/components/status";
import { CREDENTIAL_VIEWS, type CredentialView } from "@/lib/credentials/model";
import { CredentialTabs } from "./tabs";
import { CredentialsTable } from "./credentials-table";
import { SendReminders } from "./send-reminders";

export const metadata = { title: "Credentials" };

type Search = { view?: string; yard?: string; qualification?: string; q?: string };

export default async function CredentialsPage({ searchParams }: { searchParams: Promise<Search> }) {
  const user = await requirePageRole("hr", "admin", "supervisor");
  const sp = await searchParams;
  const canEdit = CAN_KEEP_CREDENTIALS.includes(user.role);
  const [rows, yards, types] = await Promise.all([
    listCredentials(db(), user.organisationId),
    listYards(db(), user.organisationId),
    listTypes(db(), user.organisationId),
  ]);
  const view = (CREDENTIAL_VIEWS as readonly string[]).includes(sp.view ?? "") ? (sp.view as CredentialView) : "all";
  return (
    <>
      <PageHeader eyebrow="Credentials" title="Credentials on file">
        {canEdit && <SendReminders />}
      </PageHeader>
      <CredentialTabs active="list" canEdit={canEdit} />
      <CredentialsTable
        rows={rows}
        yards={yards.map((y) => ({ code: y.code, name: y.name }))}
        types={types.map((t) => ({ code: t.code, name: t.name }))}
        canEdit={canEdit}
        initial={{ view, yard: sp.yard ?? "", qualification: sp.qualification ?? "", q: sp.q ?? "" }}
      />
    </>
  );
}
