import Link from "next/link";
import { safePath } from "@/lib/auth/options";

export const metadata = { title: "Not allowed" };

export default async function Forbidden({ searchParams }: { searchParams: Promise<{ from?: string }> }) {
  const { from } = await searchParams;
  // Only a path on this site: "/\\host" and "//host" leave it (issue 15, finding 13).
  const back = safePath(from) ?? "/";
  return (
    <main className="mx-auto max-w-md p-8 text-center">
      <p className="text-xs font-bold uppercase tracking-widest text-block">✖ Not allowed</p>
      <h1 className="mt-2 text-xl font-bold">Your role cannot open this page.</h1>
      <p className="mt-2 text-sm text-ink-500">Ask an admin if you need access.</p>
      <Link href={back} className="btn-primary mt-6">
        Go to my start page
      </Link>
    </main>
  );
}
