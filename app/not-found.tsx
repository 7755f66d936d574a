import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-md p-8 text-center">
      <p className="text-xs font-bold uppercase tracking-widest text-copper">Not found</p>
      <h1 className="mt-2 text-xl font-bold">There is nothing at this address.</h1>
      <p className="mt-2 text-sm text-ink-500">The link may be old, or the record was removed.</p>
      <Link href="/" className="btn-primary mt-6">
        Back to my start page
      </Link>
    </main>
  );
}
