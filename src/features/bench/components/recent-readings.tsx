import { Link } from 'react-router-dom';
import { Alert, Loading } from '@/components/ui/alert';
import { VerdictBadge } from '@/components/ui/badge';
import { OverdueMark } from '@/components/readings/overdue-mark';
import { QUANTITY_SHORT, formatReading } from '@/components/readings/words';
import { paths } from '@/config/paths';
import { formatDateTime } from '@/lib/format';
import { RECENT_LIMIT, useRecentReadings } from '../api/get-recent-readings';

export function RecentReadings() {
  const q = useRecentReadings();
  if (q.isPending) return <Loading what="Loading recent readings" />;
  if (q.isError) return <Alert>{q.error.message}</Alert>;
  const rows = q.data.readings;
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No readings yet. The first one you save appears here.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="table-list w-full min-w-[760px] border-collapse text-sm">
        <caption className="sr-only">The last {RECENT_LIMIT} readings taken at the bench, newest first</caption>
        <thead>
          <tr className="border-b border-paper-edge text-left text-xs uppercase tracking-wide text-ink-soft">
            <th scope="col" className="py-2 pr-3 font-medium">
              Part
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Qty
            </th>
            <th scope="col" className="py-2 pr-3 text-right font-medium">
              Value
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Verdict
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Instrument
            </th>
            <th scope="col" className="py-2 pr-3 font-medium">
              Who
            </th>
            <th scope="col" className="py-2 font-medium">
              When
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-paper-edge/70 align-top last:border-0">
              <td className="whitespace-nowrap py-2 pr-3">
                <Link to={paths.app.part.getHref(r.partId)} className="font-medium text-accent underline-offset-2 hover:underline">
                  {r.partLabel}
                </Link>
              </td>
              <td data-label="Qty" className="py-2 pr-3 text-ink-soft">
                {QUANTITY_SHORT[r.quantity]}
              </td>
              <td data-label="Value" className="num whitespace-nowrap py-2 pr-3 text-right">
                {formatReading(r.quantity, r.value)}
              </td>
              <td data-label="Verdict" className="py-2 pr-3">
                {r.verdict ? (
                  <VerdictBadge verdict={r.verdict} reason={r.verdictReason ?? undefined} />
                ) : (
                  <span className="text-xs text-ink-soft">no limit</span>
                )}
              </td>
              <td data-label="Instrument" className="py-2 pr-3">
                {r.instrumentName ?? <span className="text-ink-faint">—</span>}
                {r.calibrationOverdue && <OverdueMark />}
              </td>
              <td data-label="Who" className="whitespace-nowrap py-2 pr-3">
                {r.takenBy ?? <span className="text-ink-faint">—</span>}
              </td>
              <td data-label="When" className="py-2 whitespace-nowrap text-ink-soft">
                <time dateTime={new Date(r.takenAt).toISOString()}>{formatDateTime(r.takenAt)}</time>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
