"use client";

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="card mx-auto mt-10 max-w-lg p-6">
      <p className="text-xs font-bold uppercase tracking-widest text-block">✖ Something went wrong</p>
      <h1 className="mt-2 text-lg font-bold">This page could not be shown.</h1>
      <p className="mt-2 text-sm text-ink-500">
        Nothing you saved was lost. If the database is restarting, try again in a few seconds.
        {error.digest ? ` (reference ${error.digest})` : ""}
      </p>
      <button type="button" onClick={reset} className="btn-primary mt-4">
        Try again
      </button>
    </div>
  );
}
