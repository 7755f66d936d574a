/** The wordmark: a gaff (the climber's spur) drawn as a simple angled spike beside the name. */
export function Logo({ className = "" }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 text-lg font-extrabold tracking-tight ${className}`}>
      <svg aria-hidden="true" viewBox="0 0 24 24" className="h-6 w-6">
        <path d="M7 2h4v12l-5 8H4l3-8z" fill="#a85a24" />
        <path d="M13 6h7v3h-7z" fill="currentColor" />
      </svg>
      Gaffline
    </span>
  );
}
