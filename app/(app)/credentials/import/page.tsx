import { requirePageRole } from "@/lib/auth/session";
import { db } from "@/lib/db";
import { listTypes } from "@/lib/credentials/data-qualification-types";
import { PageHeader } from "@/components/status";
import { CredentialTabs } from "../tabs";
import { ImportClient } from "./import-client";

export const metadata = { title: "Import credentials" };

export default async function ImportPage() {
  const user = await requirePageRole("hr", "admin");
  const types = await listTypes(db(), user.organisationId);
  return (
    <>
      <PageHeader eyebrow="Credentials" title="Import from CSV" />
      <CredentialTabs active="import" canEdit />
      <ImportClient codes={types.map((t) => ({ code: t.code, name: t.name, renewalMonths: t.renewalMonths }))} />
    </>
  );
}
