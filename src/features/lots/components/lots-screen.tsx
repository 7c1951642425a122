import { useState } from 'react';
import { Link } from 'react-router-dom';
import { formatValue } from '@shared/units/format';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { formatTolerance } from '@/lib/format';
import { useLots } from '../api/get-lots';
import { CreateLotForm } from './lot-form';
import { LOT_KIND_LABEL } from './lot-form-schema';
import { LotStatusBadge } from './lot-status-badge';

const dateOnly = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium' });
/** "2026-11-30" as a local calendar date (not shifted by the time zone). */
const formatDay = (day: string | null) => {
  if (!day) return '—';
  const [y, m, d] = day.split('-').map(Number);
  return y && m && d ? dateOnly.format(new Date(y, m - 1, d)) : day;
};

export function LotsScreen() {
  const canWrite = useCan('write');
  const lots = useLots();
  const [creating, setCreating] = useState(false);
  const rows = lots.data?.lots ?? [];

  return (
    <div>
      <PageHeader
        title="Lots"
        description="Batches of capacitors, pots and resistors measured in bulk: statistics, bins, matched sets and the disposition."
        actions={
          canWrite && !creating ? (
            <Button variant="primary" onClick={() => setCreating(true)} aria-expanded={creating} aria-controls="new-lot-panel">
              New lot
            </Button>
          ) : null
        }
      />
      {canWrite && creating && (
        <div id="new-lot-panel" className="mb-6 rounded-lg border border-accent/30 bg-paper-bright p-4 sm:p-5">
          <CreateLotForm onClose={() => setCreating(false)} />
        </div>
      )}
      {lots.isPending ? (
        <Loading what="Loading lots" />
      ) : lots.isError ? (
        <Alert>{lots.error.message}</Alert>
      ) : rows.length === 0 ? (
        <p className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">
          {canWrite ? 'No lots yet. Use “New lot” to register an incoming batch, then upload its meter export.' : 'No lots yet.'}
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-paper-edge bg-paper-bright">
          <table className="table-list w-full min-w-[760px] border-collapse text-sm">
            <caption className="sr-only">Lots, newest first</caption>
            <thead className="bg-paper-deep text-left text-ink-soft">
              <tr>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 font-medium">
                  Lot
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 font-medium">
                  Kind
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 text-right font-medium">
                  Nominal
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 text-right font-medium">
                  Tolerance
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 font-medium">
                  Supplier
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 font-medium">
                  Received
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 text-right font-medium">
                  Count
                </th>
                <th scope="col" className="border-b border-paper-edge px-3 py-2 font-medium">
                  Status
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((lot) => (
                <tr key={lot.id} className="border-b border-paper-edge/70 last:border-b-0 hover:bg-paper">
                  <td className="px-3 py-2">
                    <Link to={paths.app.lot.getHref(lot.id)} className="font-medium text-accent underline-offset-2 hover:underline">
                      {lot.code}
                    </Link>
                    {lot.marking && <span className="num ml-2 text-xs text-ink-soft">{lot.marking}</span>}
                  </td>
                  <td data-label="Kind" className="px-3 py-2">
                    {LOT_KIND_LABEL[lot.kind]}
                  </td>
                  <td data-label="Nominal" className="num px-3 py-2 text-right whitespace-nowrap">
                    {formatValue(lot.nominal, lot.unit)}
                  </td>
                  <td data-label="Tolerance" className="num px-3 py-2 text-right whitespace-nowrap">
                    {formatTolerance(lot.tolerancePct, lot.tolerancePlusPct)}
                  </td>
                  <td data-label="Supplier" className="px-3 py-2">
                    {lot.supplier ?? <span className="text-ink-faint">—</span>}
                  </td>
                  <td data-label="Received" className="px-3 py-2 whitespace-nowrap">
                    {formatDay(lot.receivedOn)}
                  </td>
                  <td data-label="Count" className="num px-3 py-2 text-right whitespace-nowrap">
                    {lot.count.toLocaleString()}
                    {lot.expectedCount != null && <span className="text-ink-soft"> / {lot.expectedCount.toLocaleString()}</span>}
                  </td>
                  <td data-label="Status" className="px-3 py-2">
                    <LotStatusBadge status={lot.status} reason={lot.dispositionReason} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
