import { requirePageRole } from "@/lib/auth/session";
import { PageHeader } from "@/components/status";

export const metadata = { title: "Board" };

export default async function BoardPage() {
  await requirePageRole("dispatcher", "supervisor", "admin");
  return <PageHeader eyebrow="Board" title="Tomorrow's crews" />;
}
