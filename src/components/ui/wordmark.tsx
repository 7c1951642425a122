/** Lugbook's mark: an eyelet lug drawn as a page corner, with the name beside it. */
export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={`inline-flex items-center gap-2 font-semibold tracking-tight text-ink ${className ?? ''}`}>
      <svg viewBox="0 0 24 24" className="size-6 text-accent" aria-hidden="true" focusable="false">
        <path d="M5 2.5h10l4 4V21.5H5z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
        <path d="M15 2.5v4h4" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
        <circle cx="12" cy="12" r="2.6" fill="none" stroke="currentColor" strokeWidth="1.6" />
        <path d="M12 14.6v4.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
      </svg>
      <span>Lugbook</span>
    </span>
  );
}
