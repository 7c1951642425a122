// The lot's history as a timeline, oldest first: creation, uploads, dispositions and reopens with
// who, when and why. It comes from the audit log, so a reopen loses nothing.
import { formatDateTime } from '@/lib/format';
import type { LotHistoryEvent } from '../api/types';

function describe(e: LotHistoryEvent): string {
  switch (e.kind) {
    case 'created':
      return 'Lot created';
    case 'upload':
      return `${e.replaced ? 'Readings replaced' : 'Readings uploaded'}${e.file ? `: ${e.file}` : ''}${e.rows != null ? ` (${e.rows.toLocaleString()} rows)` : ''}`;
    case 'disposition':
      return `Disposition: ${e.status}`;
    case 'reopen':
      return `Reopened${e.was ? ` (was ${e.was})` : ''}`;
    case 'watchers':
      return 'Watchers changed';
    case 'promote':
      return `Items promoted to parts${e.parts != null ? ` (${e.parts})` : ''}`;
  }
}

export function LotHistory({ history }: { history: LotHistoryEvent[] }) {
  if (history.length === 0) return <p className="text-sm text-ink-soft">No recorded events.</p>;
  return (
    <ol className="relative space-y-3 border-l border-paper-edge pl-4" aria-label="Lot history, oldest first">
      {history.map((e, i) => (
        <li key={i} className="relative">
          <span
            className={`absolute top-1.5 -left-[1.3rem] size-2.5 rounded-full ${e.kind === 'reopen' ? 'bg-marginal' : e.kind === 'disposition' ? 'bg-accent' : 'bg-ink-faint'}`}
            aria-hidden
          />
          <p className="text-sm font-medium break-words">{describe(e)}</p>
          <p className="text-xs text-ink-soft">
            {formatDateTime(e.at)}
            {e.by ? ` · ${e.by}` : ''}
          </p>
          {e.reason && <p className="text-sm break-words">Reason: {e.reason}</p>}
        </li>
      ))}
    </ol>
  );
}
