const WarnIcon = () => (
  <svg viewBox="0 0 16 16" className="size-4 shrink-0 text-marginal" aria-hidden="true">
    <path d="M8 1.5 15 14.5H1z" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
    <path d="M8 6v4M8 11.8v.4" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" />
  </svg>
);

/**
 * The bench-safety note of DESIGN.md §Safety, shown wherever readings are entered. Quiet, not
 * alarming: a panel beside the Bench form, one line under the part page's form.
 */
export function SafetyNote({ className, compact }: { className?: string; compact?: boolean }) {
  if (compact) {
    return (
      <p className={`flex items-start gap-1.5 text-xs text-ink-soft ${className ?? ''}`}>
        <WarnIcon />
        <span>
          <span className="font-medium text-ink">Safety:</span> measure parts unpowered and out of circuit (or with the meter unplugged from the mains); never probe
          inside a powered amplifier; ventilate solder fumes; follow local electrical codes and leave mains and amplifier work to qualified people.
        </span>
      </p>
    );
  }
  return (
    <aside aria-labelledby="bench-safety-heading" className={`rounded-lg border border-paper-edge bg-paper-deep/60 p-4 text-sm text-ink-soft ${className ?? ''}`}>
      <h2 id="bench-safety-heading" className="mb-1.5 flex items-center gap-1.5 text-sm font-semibold text-ink">
        <WarnIcon />
        At the bench
      </h2>
      <ul className="list-disc space-y-1 pl-4">
        <li>Measure parts unpowered and out of circuit, or with the instrument unplugged from the mains.</li>
        <li>Never probe inside a powered amplifier.</li>
        <li>Ventilate solder fumes.</li>
        <li>Follow your local electrical codes; leave mains and amplifier work to qualified people.</li>
      </ul>
    </aside>
  );
}
