import type { ReactNode } from 'react';
import { Badge } from '@/components/ui/badge';
import { formatTolerance } from '@/lib/format';
import type { Lot, LotStats } from '../api/types';
import { fmtLotValue, fmtPct, fmtSecond } from './lot-format';
import { SECOND_LABEL, SECOND_UNIT } from './lot-form-schema';

function Row({ term, children, note }: { term: ReactNode; children: ReactNode; note?: ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-paper-edge/60 py-1.5 last:border-b-0">
      <dt className="text-sm text-ink-soft">{term}</dt>
      <dd className="num text-right text-sm whitespace-nowrap text-ink">
        {children}
        {note && <span className="ml-1 text-xs text-ink-soft">{note}</span>}
      </dd>
    </div>
  );
}

// Cpk 1.33 is the usual floor for a capable incoming process: common practice (no published source).
function CapabilityBadge({ cpk }: { cpk: number | null }) {
  if (cpk === null) return null;
  if (cpk >= 1.33) return <Badge tone="pass" icon="check" label="Capable" title="Cpk at least 1.33" />;
  if (cpk >= 1) return <Badge tone="marginal" icon="edge" label="Barely capable" title="Cpk between 1 and 1.33" />;
  return <Badge tone="fail" icon="cross" label="Not capable" title="Cpk below 1: parts outside the limits are expected" />;
}

export function LotStatsPanel({ lot, stats }: { lot: Lot; stats: LotStats }) {
  const u = lot.unit;
  const dev = (v: number) => fmtPct(((v - lot.nominal) / lot.nominal) * 100);
  const out = stats.countBelow + stats.countAbove;
  const second = lot.secondQuantity;
  // From the lot, not the statistics: statistics stored before the two sides existed carry no such field.
  const asymmetric = lot.tolerancePlusPct != null && lot.tolerancePlusPct !== lot.tolerancePct;
  const midpoint = (stats.lower + stats.upper) / 2;
  return (
    <div className="grid gap-x-8 sm:grid-cols-2 lg:grid-cols-1">
      <dl>
        <Row term="Readings (n)">{stats.n.toLocaleString()}</Row>
        <Row term="Mean" note={dev(stats.mean)}>
          {fmtLotValue(stats.mean, u)}
        </Row>
        <Row term="Std deviation" note={fmtPct((stats.sd / lot.nominal) * 100, 2).replace(/^\+/, '')}>
          {fmtLotValue(stats.sd, u, 3)}
        </Row>
        <Row term="Median">{fmtLotValue(stats.median, u)}</Row>
        <Row term="Q1 · Q3">
          {fmtLotValue(stats.q1, u)} · {fmtLotValue(stats.q3, u)}
        </Row>
        <Row term="Min · max">
          {fmtLotValue(stats.min, u)} · {fmtLotValue(stats.max, u)}
        </Row>
        <Row term="Limits" note={formatTolerance(lot.tolerancePct, lot.tolerancePlusPct)}>
          {fmtLotValue(stats.lower, u)} … {fmtLotValue(stats.upper, u)}
        </Row>
      </dl>
      <dl>
        <Row term={asymmetric ? `Cp (band centred at ${fmtLotValue(midpoint, u)})` : 'Cp'}>
          {stats.cp === null ? '—' : stats.cp.toFixed(2)}
        </Row>
        <Row
          term={
            <span className="inline-flex items-center gap-2">
              Cpk <CapabilityBadge cpk={stats.cpk} />
            </span>
          }
        >
          {stats.cpk === null ? '—' : stats.cpk.toFixed(2)}
        </Row>
        <Row term="Below the lower limit">
          <span className={stats.countBelow ? 'text-fail' : undefined}>{stats.countBelow.toLocaleString()}</span>
        </Row>
        <Row term="Above the upper limit">
          <span className={stats.countAbove ? 'text-fail' : undefined}>{stats.countAbove.toLocaleString()}</span>
        </Row>
        <Row term="Out of tolerance" note={`${((out / stats.n) * 100).toFixed(2)} %`}>
          {out.toLocaleString()}
        </Row>
        <Row term="Outliers (Tukey)">{stats.outliers.indices.length.toLocaleString()}</Row>
        <Row term="Tukey fences">
          {fmtLotValue(stats.outliers.lowFence, u)} … {fmtLotValue(stats.outliers.highFence, u)}
        </Row>
        {second && lot.secondLimit != null && (
          <Row term={`${SECOND_LABEL[second]} over ${fmtSecond(lot.secondLimit, SECOND_UNIT[second])}`}>
            {stats.secondFailures ? (
              <span className={stats.secondFailures.length ? 'text-fail' : undefined}>{stats.secondFailures.length.toLocaleString()}</span>
            ) : (
              <span className="text-ink-soft">not in the file</span>
            )}
          </Row>
        )}
      </dl>
      {asymmetric && (
        <p className="mt-2 text-xs text-ink-soft sm:col-span-2 lg:col-span-1" data-testid="asymmetric-capability">
          The limits are not symmetric about nominal ({formatTolerance(lot.tolerancePct, lot.tolerancePlusPct)}). Cp compares the spread
          with the width between them as if the lot were centred at their middle, {fmtLotValue(midpoint, u)}, not at nominal{' '}
          {fmtLotValue(lot.nominal, u)}; Cpk, from the mean to the nearer limit, describes the lot as it is.
        </p>
      )}
    </div>
  );
}
