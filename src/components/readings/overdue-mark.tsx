/** Marks a reading or instrument whose calibration is overdue: an icon and a word as well as a colour. */
export function OverdueMark({
  title = "The instrument's calibration was overdue when this reading was taken",
  className = 'ml-1.5',
}: {
  title?: string;
  className?: string;
}) {
  return (
    <span
      className={`${className} inline-flex items-center gap-0.5 rounded border border-marginal/40 bg-marginal-tint px-1 text-[11px] font-medium text-marginal`}
      title={title}
    >
      <svg viewBox="0 0 16 16" className="size-3" aria-hidden="true">
        <circle cx="8" cy="8" r="6.3" fill="none" stroke="currentColor" strokeWidth="1.6" />
        <path d="M8 4.5V8l2.4 1.6" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
      </svg>
      cal. overdue
    </span>
  );
}
