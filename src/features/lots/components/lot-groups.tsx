// Deviation bins and matched sets, each with a "promote to parts" action for writers.
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { LotStats, MatchOptions } from '../api/types';
import { fmtLotValue, fmtPct } from './lot-format';

interface PromoteProps {
  canWrite: boolean;
  /** Resolves when the promotion ends (the screen shows its outcome). */
  onPromote: (what: { bin: number } | { set: number }, label: string) => void;
  busy: boolean;
}

export function LotBins({ stats, canWrite, onPromote, busy }: { stats: LotStats } & PromoteProps) {
  const max = Math.max(1, ...stats.bins.map((b) => b.count));
  return (
    <table className="w-full border-collapse text-sm">
      <caption className="sr-only">Parts per deviation bin, from nominal</caption>
      <thead className="text-left text-ink-soft">
        <tr>
          <th scope="col" className="py-1.5 pr-2 font-medium">
            Deviation
          </th>
          <th scope="col" className="py-1.5 pr-2 text-right font-medium">
            Parts
          </th>
          <th scope="col" className="w-1/3 py-1.5 font-medium">
            <span className="sr-only">Share</span>
          </th>
          {canWrite && (
            <th scope="col" className="py-1.5 text-right font-medium">
              <span className="sr-only">Action</span>
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {stats.bins.map((b, i) => {
          const outer = i === 0 || i === stats.bins.length - 1;
          return (
            <tr key={b.label} className="border-t border-paper-edge/60">
              <td className={`num py-1.5 pr-2 whitespace-nowrap ${outer ? 'text-fail' : ''}`}>
                {b.label}
                {outer && <span className="ml-1 font-sans text-xs">(out of tolerance)</span>}
              </td>
              <td className="num py-1.5 pr-2 text-right">{b.count.toLocaleString()}</td>
              <td className="py-1.5">
                <div className="h-2.5 rounded-sm bg-paper-deep" aria-hidden="true">
                  <div
                    className={`h-2.5 rounded-sm ${outer ? 'bg-fail/70' : 'bg-accent/70'}`}
                    style={{ width: `${(b.count / max) * 100}%` }}
                  />
                </div>
              </td>
              {canWrite && (
                <td className="py-1 pl-2 text-right">
                  {b.count > 0 && b.count <= 1000 ? (
                    <Button
                      size="sm"
                      variant="quiet"
                      disabled={busy}
                      onClick={() => onPromote({ bin: i }, `the ${b.count} parts of bin ${b.label}`)}
                      aria-label={`Promote the ${b.count} parts of bin ${b.label} to parts`}
                    >
                      Promote
                    </Button>
                  ) : b.count > 1000 ? (
                    <span className="text-xs text-ink-soft" title="At most 1,000 parts at once">
                      over 1,000
                    </span>
                  ) : null}
                </td>
              )}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

const MATCH_PCTS = [0.1, 0.25, 0.5, 1, 2, 5];
const SET_SIZES = [2, 3, 4, 5, 6];
const SHOWN_SETS = 10;

export function LotSets({
  stats,
  unit,
  items,
  match,
  onMatch,
  updating,
  canWrite,
  onPromote,
  busy,
}: {
  stats: LotStats;
  unit: string;
  items: string[] | null;
  match: MatchOptions;
  onMatch: (m: MatchOptions) => void;
  updating: boolean;
} & PromoteProps) {
  const [more, setMore] = useState(false);
  const sets = stats.matchedSets;
  const shown = more ? sets.slice(0, 100) : sets.slice(0, SHOWN_SETS);
  const setCount = stats.matchedSetCount ?? sets.length;
  const inSets = setCount * match.setSize;
  return (
    <div>
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <label className="text-sm">
          <span className="mb-1 block font-medium">Agree within</span>
          <select
            className="num rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5"
            value={match.matchPct}
            onChange={(e) => onMatch({ ...match, matchPct: Number(e.target.value) })}
          >
            {MATCH_PCTS.map((p) => (
              <option key={p} value={p}>
                {p} %
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="mb-1 block font-medium">Set size</span>
          <select
            className="num rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5"
            value={match.setSize}
            onChange={(e) => onMatch({ ...match, setSize: Number(e.target.value) })}
          >
            {SET_SIZES.map((s) => (
              <option key={s} value={s}>
                {s === 2 ? '2 (pairs)' : s}
              </option>
            ))}
          </select>
        </label>
        <p className="pb-1.5 text-sm text-ink-soft" aria-live="polite">
          {updating
            ? 'Matching…'
            : `${setCount.toLocaleString()} ${setCount === 1 ? 'set' : 'sets'} (${inSets.toLocaleString()} of ${stats.n.toLocaleString()} parts), tightest first`}
        </p>
      </div>
      {sets.length === 0 ? (
        <p className="text-sm text-ink-soft">
          No parts agree within {match.matchPct} % in sets of {match.setSize}. Widen the percentage.
        </p>
      ) : (
        <table className="w-full border-collapse text-sm">
          <caption className="sr-only">Matched sets, tightest first</caption>
          <thead className="text-left text-ink-soft">
            <tr>
              <th scope="col" className="py-1.5 pr-2 font-medium">
                Set
              </th>
              <th scope="col" className="py-1.5 pr-2 font-medium">
                Items
              </th>
              <th scope="col" className="py-1.5 pr-2 text-right font-medium">
                Mean
              </th>
              <th scope="col" className="py-1.5 pr-2 text-right font-medium">
                Spread
              </th>
              {canWrite && (
                <th scope="col" className="py-1.5 font-medium">
                  <span className="sr-only">Action</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {shown.map((s, k) => (
              <tr key={k} className="border-t border-paper-edge/60">
                <td className="num py-1 pr-2 font-medium">S{k + 1}</td>
                <td
                  className="num max-w-40 truncate py-1 pr-2"
                  title={items ? s.indices.map((i) => items[i] ?? '?').join(', ') : undefined}
                >
                  {items ? s.indices.map((i) => items[i] ?? '?').join(', ') : '…'}
                </td>
                <td className="num py-1 pr-2 text-right whitespace-nowrap">{fmtLotValue(s.meanValue, unit)}</td>
                <td className="num py-1 pr-2 text-right whitespace-nowrap">{fmtPct(s.spreadPct, 3).replace(/^\+/, '')}</td>
                {canWrite && (
                  <td className="py-0.5 text-right">
                    <Button
                      size="sm"
                      variant="quiet"
                      disabled={busy}
                      onClick={() => onPromote({ set: k }, `matched set S${k + 1}`)}
                      aria-label={`Promote matched set S${k + 1} to parts`}
                    >
                      Promote
                    </Button>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {sets.length > SHOWN_SETS && (
        <Button size="sm" variant="quiet" className="mt-2" onClick={() => setMore((m) => !m)}>
          {more ? 'Show fewer' : `Show ${Math.min(100, sets.length) - SHOWN_SETS} more`}
        </Button>
      )}
      {sets.length > 100 && more && <p className="mt-1 text-xs text-ink-soft">The table below filters every set (“Set” filter).</p>}
    </div>
  );
}
