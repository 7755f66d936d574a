import { requirePageRole } from "@/lib/auth/session";
import { CAN_KEEP_CREDENTIALS } from "@/lib/users/roles";
import { db } from "@/lib/db";
import { listTypes } from "@/lib/credentials/data-qualification-types";
import { PageHeader } from "@/components/status";
import { CredentialTabs } from "../tabs";
import { TypesClient } from "./types-client";

export const metadata = { title: "Qualification types" };

export default async function TypesPage() {
  const user = await requirePageRole("hr", "admin", "supervisor");
  const types = await listTypes(db(), user.organisationId);
  const canEdit = CAN_KEEP_CREDENTIALS.includes(user.role);
  return (
    <>
      <PageHeader eyebrow="Credentials" title="Qualification types" />
      <CredentialTabs active="types" canEdit={canEdit} />
      <p className="mb-4 max-w-3xl text-sm text-ink-700">
        Renewal periods and warning windows are your policy; OSHA sets none for most of these. Codes marked{" "}
        <strong>read by the crew rules</strong> are fixed: their names, periods and windows can change, the code cannot, and
        they cannot be deleted.
      </p>
      <TypesClient types={types} canEdit={canEdit} />
    </>
  );
}
