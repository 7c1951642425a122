import { useCallback, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { formatValue } from '@shared/units/format';
import { Alert, Loading } from '@/components/ui/alert';
import { Button, buttonClass } from '@/components/ui/button';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { withParams } from '@/lib/api-client';
import { useCan } from '@/lib/auth';
import { formatDate, formatTolerance } from '@/lib/format';
import { useLot } from '../api/get-lot';
import { useLotItems } from '../api/get-lot-items';
import { usePromoteLotItems } from '../api/promote-lot';
import { LotItemScan } from './lot-item-scan';
import { LotHistory } from './lot-history';
import { LotWatchers } from './lot-watchers';
import { useInstruments } from '@/data/instruments';
import { DEFAULT_MATCH, type LotDetail, type MatchOptions } from '../api/types';
import { LotDisposition } from './lot-disposition';
import { LOT_KIND_LABEL, SECOND_LABEL, SECOND_UNIT } from './lot-form-schema';
import { fmtSecond } from './lot-format';
import { LotBins, LotSets } from './lot-groups';
import { LotHistogram } from './lot-histogram';
import { lotConditions } from '@shared/csv/conditions';
import { LotItemsTable, NO_FILTERS, type ItemFilters } from './lot-items-table';
import { LotStatsPanel } from './lot-stats-panel';
import { LotStatusBadge } from './lot-status-badge';
import { LotUpload } from './lot-upload';

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div>
      <dt className="text-xs text-ink-soft">{term}</dt>
      <dd className="text-sm">{children}</dd>
    </div>
  );
}

function LotFacts({ lot }: { lot: LotDetail }) {
  const instruments = useInstruments();
  const instrumentName = instruments.data?.instruments.find((i) => i.id === lot.instrumentId)?.name;
  return (
    <dl className="mb-6 grid grid-cols-2 gap-x-6 gap-y-3 rounded-lg border border-paper-edge bg-paper-bright p-4 sm:grid-cols-4">
      <Fact term="Nominal">
        <span className="num">{formatValue(lot.nominal, lot.unit)}</span>{' '}
        <span className="num">{formatTolerance(lot.tolerancePct, lot.tolerancePlusPct)}</span>
        {lot.marking && <span className="num ml-2 text-ink-soft">marked {lot.marking}</span>}
      </Fact>
      <Fact term="Supplier">{lot.supplier ?? '—'}</Fact>
      <Fact term="Received">{lot.receivedOn ?? '—'}</Fact>
      <Fact term="Readings">
        <span className="num">{lot.count.toLocaleString()}</span>
        {lot.expectedCount != null && (
          <span className={`num ${lot.count > 0 && lot.count !== lot.expectedCount ? 'text-marginal' : 'text-ink-soft'}`}>
            {' '}
            of {lot.expectedCount.toLocaleString()} expected
          </span>
        )}
      </Fact>
      <Fact term="Second quantity">
        {lot.secondQuantity && lot.secondLimit != null ? (
          <span className="num">
            {SECOND_LABEL[lot.secondQuantity]} ≤ {fmtSecond(lot.secondLimit, SECOND_UNIT[lot.secondQuantity])}
          </span>
        ) : (
          '—'
        )}
      </Fact>
      <Fact term="Watchers">{lot.watchers.length ? lot.watchers.map((w) => w.name).join(', ') : 'none'}</Fact>
      <Fact term="Test frequency">
        {lot.testFrequency != null ? <span className="num">{formatValue(lot.testFrequency, 'Hz')}</span> : 'not recorded'}
      </Fact>
      <Fact term="Instrument">{lot.instrumentId != null ? (instrumentName ?? `instrument ${lot.instrumentId}`) : 'not recorded'}</Fact>
      <Fact term="Created">{formatDate(lot.createdAt)}</Fact>
      {lot.notes && <Fact term="Notes">{lot.notes}</Fact>}
    </dl>
  );
}

function FilterBar({
  lot,
  filters,
  onChange,
  setCount,
}: {
  lot: LotDetail;
  filters: ItemFilters;
  onChange: (f: ItemFilters) => void;
  setCount: number;
}) {
  const stats = lot.stats!;
  const sel = 'rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm';
  const check = 'inline-flex min-h-9 items-center gap-2 text-sm';
  return (
    <form
      role="search"
      aria-label="Filter the items"
      className="mb-3 flex flex-wrap items-end gap-x-4 gap-y-2"
      onSubmit={(e) => e.preventDefault()}
    >
      <label className="text-sm">
        <span className="mb-1 block font-medium">Tolerance</span>
        <select
          className={sel}
          value={filters.tolerance}
          onChange={(e) => onChange({ ...filters, tolerance: e.target.value as ItemFilters['tolerance'] })}
        >
          <option value="all">All items</option>
          <option value="out">Out of tolerance</option>
          <option value="in">In tolerance</option>
        </select>
      </label>
      <label className="text-sm">
        <span className="mb-1 block font-medium">Bin</span>
        <select className={`${sel} num`} value={filters.bin} onChange={(e) => onChange({ ...filters, bin: Number(e.target.value) })}>
          <option value={-1}>All bins</option>
          {stats.bins.map((b, i) => (
            <option key={i} value={i}>
              {b.label} ({b.count})
            </option>
          ))}
        </select>
      </label>
      <label className="text-sm">
        <span className="mb-1 block font-medium">Matched set</span>
        <select
          className={sel}
          value={String(filters.set)}
          onChange={(e) => {
            const v = e.target.value;
            onChange({ ...filters, set: v === 'any' || v === 'in' || v === 'none' ? v : Number(v) });
          }}
        >
          <option value="any">Any</option>
          <option value="in">In a set</option>
          <option value="none">In no set</option>
          {Array.from({ length: Math.min(setCount, 200) }, (_, k) => (
            <option key={k} value={k}>
              S{k + 1}
            </option>
          ))}
        </select>
      </label>
      <label className={check}>
        <input
          type="checkbox"
          className="size-4 accent-accent"
          checked={filters.outlier}
          onChange={(e) => onChange({ ...filters, outlier: e.target.checked })}
        />
        Outliers only
      </label>
      {lot.secondQuantity && stats.secondFailures && (
        <label className={check}>
          <input
            type="checkbox"
            className="size-4 accent-accent"
            checked={filters.secondFail}
            onChange={(e) => onChange({ ...filters, secondFail: e.target.checked })}
          />
          {SECOND_LABEL[lot.secondQuantity]} over its limit only
        </label>
      )}
      {filters !== NO_FILTERS && (
        <Button size="sm" variant="quiet" onClick={() => onChange(NO_FILTERS)}>
          Clear filters
        </Button>
      )}
    </form>
  );
}

export function LotScreen({ id }: { id: number }) {
  const canWrite = useCan('write');
  const [match, setMatch] = useState<MatchOptions>(DEFAULT_MATCH);
  const lotQuery = useLot(id, match);
  const lot = lotQuery.data;
  const hasReadings = (lot?.count ?? 0) > 0;
  const itemsQuery = useLotItems(id, match);
  const [filters, setFilters] = useState<ItemFilters>(NO_FILTERS);
  const [selected, setSelected] = useState<Set<number>>(new Set());
  const promote = usePromoteLotItems();
  const [promoted, setPromoted] = useState<{ text: string; tone: 'success' | 'error'; firstId?: number } | null>(null);

  const onSelectedChange = useCallback((ids: Set<number>) => setSelected(ids), []);

  const doPromote = async (input: { readingIds: number[] } | { bin: number } | { set: number }, what: string) => {
    if (!window.confirm(`Make parts of ${what}? Each becomes a part in the registry with its reading.`)) return;
    setPromoted(null);
    try {
      const r = await promote.mutateAsync({ id, input: 'set' in input ? { ...input, ...match } : input });
      setPromoted({
        tone: 'success',
        text: `${r.created.toLocaleString()} part${r.created === 1 ? '' : 's'} made from ${what}.`,
        firstId: r.partIds[0],
      });
      if ('readingIds' in input) setSelected(new Set());
    } catch (err) {
      setPromoted({ tone: 'error', text: err instanceof Error ? err.message : 'The promotion failed.' });
    }
  };

  if (lotQuery.isPending) return <Loading what="Loading the lot" />;
  if (lotQuery.isError || !lot) return <Alert>{lotQuery.error?.message ?? 'The lot could not be loaded.'}</Alert>;
  const stats = lot.stats;
  const exportHref = withParams(`/api/lots/${lot.id}/export.csv`, { ...match });

  return (
    <div>
      <PageHeader
        title={
          <span className="flex flex-wrap items-center gap-3">
            <span>Lot {lot.code}</span>
            <LotStatusBadge status={lot.status} reason={lot.dispositionReason} />
          </span>
        }
        documentTitle={`Lot ${lot.code}`}
        description={`${LOT_KIND_LABEL[lot.kind]}, ${formatValue(lot.nominal, lot.unit)} ${formatTolerance(lot.tolerancePct, lot.tolerancePlusPct)}`}
        actions={
          <>
            <Link to={paths.app.lots.getHref()} className={buttonClass('secondary', 'sm')}>
              All lots
            </Link>
            {hasReadings && (
              <a href={exportHref} download className={buttonClass('secondary', 'sm')}>
                Export CSV
              </a>
            )}
          </>
        }
      />
      <LotFacts lot={lot} />

      <div className="space-y-6">
        {canWrite && lot.status === 'open' && (
          <Panel title={hasReadings ? 'Readings' : 'Upload the readings'} id="lot-upload">
            <LotUpload lot={lot} count={lot.count} />
          </Panel>
        )}

        {!stats ? (
          <p className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">
            No readings yet.{' '}
            {canWrite
              ? 'Upload the LCR meter’s export above to see the statistics.'
              : 'A bench tech or QA lead uploads the meter’s export.'}
          </p>
        ) : (
          <>
            <div className="grid gap-6 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
              <Panel title="Statistics" id="lot-stats">
                <LotStatsPanel lot={lot} stats={stats} />
              </Panel>
              <Panel title="Histogram" id="lot-histogram">
                <LotHistogram
                  stats={stats}
                  nominal={lot.nominal}
                  unit={lot.unit}
                  quantity={lot.quantity}
                  code={lot.code}
                  conditions={lotConditions(lot, { readings: stats.n, matchPct: match.matchPct ?? 1, setSize: match.setSize ?? 2 })}
                />
              </Panel>
            </div>

            {promoted && (
              <Alert tone={promoted.tone}>
                {promoted.text}{' '}
                {promoted.firstId && (
                  <Link className="font-medium underline" to={paths.app.parts.getHref({ q: lot.code })}>
                    See them in Parts
                  </Link>
                )}
              </Alert>
            )}

            <div className="grid gap-6 lg:grid-cols-2">
              <Panel title="Deviation bins" id="lot-bins">
                <LotBins
                  stats={stats}
                  canWrite={canWrite}
                  busy={promote.isPending}
                  onPromote={(what, label) => void doPromote(what, label)}
                />
              </Panel>
              <Panel title="Matched sets" id="lot-sets">
                <LotSets
                  stats={stats}
                  unit={lot.unit}
                  items={itemsQuery.data?.items ?? null}
                  match={match}
                  onMatch={(m) => {
                    setMatch(m);
                    setFilters((f) => (typeof f.set === 'number' ? { ...f, set: 'any' } : f));
                  }}
                  updating={lotQuery.isPlaceholderData}
                  canWrite={canWrite}
                  busy={promote.isPending}
                  onPromote={(what, label) => void doPromote(what, label)}
                />
              </Panel>
            </div>

            <Panel
              title="Items"
              id="lot-items"
              actions={
                canWrite && selected.size > 0 ? (
                  <Button
                    variant="primary"
                    size="sm"
                    busy={promote.isPending}
                    busyText="Promoting…"
                    onClick={() => void doPromote({ readingIds: [...selected] }, `the ${selected.size} selected items`)}
                  >
                    Promote {selected.size.toLocaleString()} selected to parts
                  </Button>
                ) : null
              }
            >
              {canWrite && itemsQuery.data && (
                <LotItemScan items={itemsQuery.data} selected={selected} onSelectedChange={onSelectedChange} />
              )}
              <FilterBar lot={lot} filters={filters} onChange={setFilters} setCount={stats.matchedSets.length} />
              {itemsQuery.isPending ? (
                <Loading what={`Loading ${lot.count.toLocaleString()} items`} />
              ) : itemsQuery.isError ? (
                <Alert>{itemsQuery.error.message}</Alert>
              ) : (
                <LotItemsTable
                  items={itemsQuery.data}
                  stats={stats}
                  nominal={lot.nominal}
                  unit={lot.unit}
                  secondQuantity={lot.secondQuantity}
                  filters={filters}
                  canSelect={canWrite}
                  selected={selected}
                  onSelectedChange={onSelectedChange}
                />
              )}
            </Panel>
          </>
        )}

        <div className="grid gap-6 lg:grid-cols-2">
          <Panel title="History" id="lot-history">
            <LotHistory history={lot.history} />
          </Panel>
          <Panel title="Watchers" id="lot-watchers">
            <LotWatchers lot={lot} />
          </Panel>
        </div>
        <Panel title="Disposition" id="lot-disposition">
          <LotDisposition lot={lot} />
        </Panel>
      </div>
    </div>
  );
}
