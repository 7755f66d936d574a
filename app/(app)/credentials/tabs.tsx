import Link from "next/link";

const TABS = [
  { href: "/credentials", key: "list", label: "Credentials" },
  { href: "/credentials/gear", key: "gear", label: "Rubber goods" },
  { href: "/credentials/types", key: "types", label: "Qualification types" },
  { href: "/credentials/import", key: "import", label: "Import CSV", editOnly: true },
] as const;

/** The desk's tabs. */
export function CredentialTabs({ active, canEdit }: { active: "list" | "types" | "import" | "gear"; canEdit: boolean }) {
  return (
    <nav aria-label="Credentials" className="mb-4 flex gap-1 overflow-x-auto border-b border-rule">
      {TABS.filter((t) => canEdit || !("editOnly" in t)).map((t) => (
        <Link
          key={t.key}
          href={t.href}
          aria-current={active === t.key ? "page" : undefined}
          className={`-mb-px whitespace-nowrap border-b-2 px-3 py-2 text-sm font-semibold ${
            active === t.key ? "border-copper text-ink" : "border-transparent text-ink-500 hover:text-ink"
          }`}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}
