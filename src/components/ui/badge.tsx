// Verdicts and part statuses always show a word and an icon as well as a colour, so they read the
// same in greyscale, in print and for colour-blind users.
import type { PartStatus, Verdict } from '@shared/schemas/common';

export type BadgeTone = 'pass' | 'fail' | 'marginal' | 'accent' | 'neutral';
export type BadgeIconName = 'check' | 'cross' | 'edge' | 'arrive' | 'flag' | 'lug' | 'shelf';

const TONE: Record<BadgeTone, string> = {
  pass: 'bg-pass-tint text-pass border-pass/30',
  fail: 'bg-fail-tint text-fail border-fail/30',
  marginal: 'bg-marginal-tint text-marginal border-marginal/30',
  accent: 'bg-accent-tint text-accent-strong border-accent/25',
  neutral: 'bg-paper-deep text-ink-soft border-paper-edge',
};

/** Small 16×16 line drawings, stroked in the current colour. */
function BadgeIcon({ icon }: { icon: BadgeIconName }) {
  const common = { fill: 'none', stroke: 'currentColor', strokeWidth: 1.7, strokeLinecap: 'round', strokeLinejoin: 'round' } as const;
  return (
    <svg viewBox="0 0 16 16" className="size-3.5 shrink-0" aria-hidden="true" focusable="false">
      {icon === 'check' && (
        <>
          <circle cx="8" cy="8" r="6.5" {...common} />
          <path d="M5 8.3 7.1 10.4 11 5.8" {...common} />
        </>
      )}
      {icon === 'cross' && (
        <>
          <circle cx="8" cy="8" r="6.5" {...common} />
          <path d="M5.6 5.6l4.8 4.8M10.4 5.6l-4.8 4.8" {...common} />
        </>
      )}
      {icon === 'edge' && (
        // A circle half filled: sitting on the edge of a limit.
        <>
          <circle cx="8" cy="8" r="6.5" {...common} />
          <path d="M8 1.5a6.5 6.5 0 0 1 0 13z" fill="currentColor" />
        </>
      )}
      {icon === 'arrive' && (
        // An arrow dropping into a tray.
        <path d="M8 1.8v7.4M5.2 6.6 8 9.4l2.8-2.8M2 9.5v3.7h12V9.5" {...common} />
      )}
      {icon === 'flag' && <path d="M3.5 14.5V2M3.5 2.5h8.5l-2 3 2 3H3.5" {...common} />}
      {icon === 'lug' && (
        // A solder lug: an eyelet on a tab.
        <>
          <circle cx="8" cy="5" r="2.2" {...common} />
          <path d="M4.5 5a3.5 3.5 0 0 1 7 0v3.2L9.6 10v4.3H6.4V10L4.5 8.2z" {...common} />
        </>
      )}
      {icon === 'shelf' && (
        // A box put away on the shelf.
        <path d="M2.5 3.5h11v3h-11zM3.5 6.5v6h9v-6M6.5 9h3" {...common} />
      )}
    </svg>
  );
}

export function Badge({ tone, icon, label, title }: { tone: BadgeTone; icon: BadgeIconName; label: string; title?: string }) {
  return (
    <span
      title={title}
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-medium ${TONE[tone]}`}
    >
      <BadgeIcon icon={icon} />
      {label}
    </span>
  );
}

const VERDICT_LOOK: Record<Verdict, { tone: BadgeTone; icon: BadgeIconName; label: string }> = {
  pass: { tone: 'pass', icon: 'check', label: 'Pass' },
  fail: { tone: 'fail', icon: 'cross', label: 'Fail' },
  marginal: { tone: 'marginal', icon: 'edge', label: 'Marginal' },
};

/** A verdict; give the reason in words as `reason` (shown as a tooltip here, in full elsewhere). */
export function VerdictBadge({ verdict, reason }: { verdict: Verdict; reason?: string }) {
  const look = VERDICT_LOOK[verdict];
  return <Badge {...look} title={reason} />;
}

export const STATUS_LOOK: Record<PartStatus, { tone: BadgeTone; icon: BadgeIconName; label: string }> = {
  incoming: { tone: 'neutral', icon: 'arrive', label: 'Incoming' },
  passed: { tone: 'pass', icon: 'check', label: 'Passed' },
  flagged: { tone: 'marginal', icon: 'flag', label: 'Flagged' },
  installed: { tone: 'accent', icon: 'lug', label: 'Installed' },
  rejected: { tone: 'fail', icon: 'cross', label: 'Rejected' },
  retired: { tone: 'neutral', icon: 'shelf', label: 'Retired' },
};

export function StatusBadge({ status, reason }: { status: PartStatus; reason?: string | null }) {
  return <Badge {...STATUS_LOOK[status]} title={reason ?? undefined} />;
}
