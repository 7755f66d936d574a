import Link from "next/link";
import { requirePageRole } from "@/lib/auth/session";
import { ROLE_LABEL, START_PAGE } from "@/lib/users/roles";
import { navFor } from "@/lib/auth/nav";
import { db } from "@/lib/db";
import { unreadNotices } from "@/lib/notices/data";
import { Logo } from "@/components/logo";
import { NavLinks } from "@/components/shell/nav-links";
import { SignOutButton } from "@/components/shell/sign-out-button";
import { Providers } from "@/components/shell/providers";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const user = await requirePageRole();
  // Issue 18, point 13: unread notices (lapsed overrides) show as a count on the queue's link.
  const unread = user.role === "supervisor" ? await unreadNotices(db(), user.id) : 0;
  const items = navFor(user.role).map(({ href, label }) => ({ href, label: href === "/queue" && unread ? `${label} (${unread})` : label }));
  return (
    <div className="flex min-h-screen flex-col">
      {/* The first Tab stop: straight past the top bar to the page (WCAG 2.4.1). */}
      <a
        href="#main"
        className="no-print sr-only focus:not-sr-only focus:fixed focus:left-2 focus:top-2 focus:z-50 focus:rounded-md focus:bg-paper focus:px-3 focus:py-2 focus:text-sm focus:font-bold focus:text-ink focus:shadow-lg"
      >
        Skip to the page
      </a>
      <header className="no-print bg-ink text-paper">
        <div className="mx-auto flex max-w-[1600px] flex-wrap items-center gap-x-6 gap-y-2 px-4 py-2">
          <Link href={START_PAGE[user.role]} className="text-paper">
            <Logo />
          </Link>
          <div className="order-3 w-full sm:order-none sm:w-auto sm:flex-1">
            <NavLinks items={items} />
          </div>
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden text-right leading-tight sm:block">
              <span className="block font-semibold">{user.name}</span>
              <span className="block text-xs text-paper/70" data-testid="role">
                {ROLE_LABEL[user.role]}
              </span>
            </span>
            <span className="text-xs text-paper/70 sm:hidden" data-testid="role-short">
              {ROLE_LABEL[user.role]}
            </span>
            <Link href="/account/password" className="text-xs text-paper/80 underline-offset-2 hover:underline" title="Change my password">
              Password
            </Link>
            <SignOutButton />
          </div>
        </div>
      </header>
      <Providers>
        <main id="main" tabIndex={-1} className="mx-auto w-full max-w-[1600px] flex-1 px-4 py-5">
          {children}
        </main>
      </Providers>
    </div>
  );
}
