export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="flex items-center gap-3 p-6 text-sm text-ink-500">
      <span className="h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" />
      Loading…
    </div>
  );
}
