// Every item of a lot in one virtualised table: the rows are filtered and sorted here over the
// server's columns (typed work on index arrays, no object per item), and only the rows in view are
// rendered, so 100,000 items scroll as smoothly as 100.
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useVirtualizer } from '@tanstack/react-virtual';
import { useMemo, useRef, useState } from 'react';
import { Badge } from '@/components/ui/badge';
import type { LotItems, LotStats } from '../api/types';
import { displayScale, fmtPct, fmtSecond } from './lot-format';
import { SECOND_LABEL, SECOND_UNIT } from './lot-form-schema';
import type { SecondQuantity } from '../api/types';
import { filterRows, sortRows, type ItemFilters } from './lot-item-rows';

export { NO_FILTERS, type ItemFilters } from './lot-item-rows';

const ROW_HEIGHT = 37;
const MAX_SELECTION = 1000;

interface Props {
  items: LotItems;
  stats: LotStats;
  nominal: number;
  unit: string;
  secondQuantity: SecondQuantity | null;
  filters: ItemFilters;
  canSelect: boolean;
  selected: ReadonlySet<number>;
  onSelectedChange: (ids: Set<number>) => void;
}

const col = createColumnHelper<number>();

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars -- the merged declaration must repeat the library's two type parameters
  interface ColumnMeta<TData, TValue> {
    numeric?: boolean;
    /** A fixed column width (CSS), for the fixed table layout. */
    width?: string;
    /** Left out below the sm breakpoint, so the list fits a phone without scrolling sideways. */
    wideOnly?: boolean;
  }
}

function SortMark({ dir }: { dir: false | 'asc' | 'desc' }) {
  return (
    <svg viewBox="0 0 10 12" className={`size-2.5 ${dir ? 'text-accent' : 'text-ink-faint'}`} aria-hidden="true">
      <path d="M5 1 9 5H1z" fill={dir === 'asc' ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1" />
      <path d="M5 11 1 7h8z" fill={dir === 'desc' ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1" />
    </svg>
  );
}

export function LotItemsTable({ items, stats, nominal, unit, secondQuantity, filters, canSelect, selected, onSelectedChange }: Props) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const scrollRef = useRef<HTMLDivElement>(null);
  const scale = displayScale(nominal, unit);
  const hasSecond = useMemo(() => secondQuantity !== null && items.second.some((v) => v !== null), [secondQuantity, items]);
  const secondUnit = secondQuantity ? SECOND_UNIT[secondQuantity] : '';

  const filtered = useMemo(() => filterRows(items, stats, filters), [items, stats, filters]);
  const rows = useMemo(() => sortRows(filtered, items, sorting), [filtered, items, sorting]);

  const columns = useMemo(() => {
    const digits = 4;
    return [
      ...(canSelect
        ? [
            col.display({
              id: 'select',
              header: () => <span className="sr-only">Select</span>,
              cell: (c) => {
                const i = c.row.original;
                const id = items.ids[i]!;
                return (
                  <input
                    type="checkbox"
                    className="size-4 accent-accent"
                    aria-label={`Select item ${items.items[i]}`}
                    checked={selected.has(id)}
                    onChange={(e) => {
                      const next = new Set(selected);
                      if (e.target.checked) {
                        if (next.size >= MAX_SELECTION) return;
                        next.add(id);
                      } else next.delete(id);
                      onSelectedChange(next);
                    }}
                  />
                );
              },
              meta: { width: '2.5rem' },
            }),
          ]
        : []),
      col.accessor((i) => i, {
        id: 'item',
        header: 'Item',
        enableSorting: true,
        cell: (c) => {
          const i = c.row.original;
          const partId = items.partIds?.[i];
          return (
            <span className="flex flex-nowrap items-center gap-1.5">
              {items.items[i]}
              {partId != null && (
                <Link
                  to={paths.app.part.getHref(partId)}
                  className="rounded-full border border-accent/40 px-1.5 text-xs whitespace-nowrap text-accent hover:underline"
                  title="Promoted to a part: open it"
                  aria-label={`Item ${items.items[i]} was promoted: open its part`}
                >
                  part
                </Link>
              )}
            </span>
          );
        },
        meta: { width: '9rem' },
      }),
      col.accessor((i) => i, {
        id: 'value',
        header: `Value (${scale.unit})`,
        enableSorting: true,
        cell: (c) => Number((items.values[c.row.original]! * scale.factor).toPrecision(digits + 1)).toString(),
        meta: { numeric: true, width: '7.5rem' },
      }),
      col.accessor((i) => i, {
        id: 'deviation',
        header: 'Deviation',
        enableSorting: true,
        cell: (c) => fmtPct(items.deviationsPct[c.row.original], 2),
        meta: { numeric: true, width: '7rem', wideOnly: true },
      }),
      ...(hasSecond && secondQuantity
        ? [
            col.accessor((i) => i, {
              id: 'second',
              header: secondUnit ? `${SECOND_LABEL[secondQuantity]} (${secondUnit})` : SECOND_LABEL[secondQuantity],
              enableSorting: true,
              cell: (c) => fmtSecond(items.second[c.row.original], secondUnit).replace(/ ?Ω$/, ''),
              meta: { numeric: true, width: '9.5rem', wideOnly: true },
            }),
          ]
        : []),
      col.accessor((i) => i, {
        id: 'bin',
        header: 'Bin',
        enableSorting: true,
        cell: (c) => stats.bins[items.bin[c.row.original]!]?.label ?? '—',
        meta: { numeric: true, width: '9rem', wideOnly: true },
      }),
      col.accessor((i) => i, {
        id: 'set',
        header: 'Set',
        enableSorting: true,
        cell: (c) => {
          const s = items.set[c.row.original]!;
          return s >= 0 ? `S${s + 1}` : <span className="text-ink-faint">—</span>;
        },
        meta: { numeric: true, width: '5rem', wideOnly: true },
      }),
      col.display({
        id: 'flags',
        header: 'Check',
        enableSorting: false,
        meta: { wideOnly: true },
        cell: (c) => {
          const i = c.row.original;
          const v = items.values[i]!;
          const out = v < stats.lower || v > stats.upper;
          return (
            <span className="flex flex-nowrap gap-1">
              {out ? (
                <Badge tone="fail" icon="cross" label={v < stats.lower ? 'Below limit' : 'Above limit'} />
              ) : (
                <Badge tone="pass" icon="check" label="In tolerance" />
              )}
              {items.outlier[i] ? <Badge tone="marginal" icon="edge" label="Outlier" /> : null}
              {items.secondFail[i] && secondQuantity ? (
                <Badge tone="fail" icon="flag" label={`${SECOND_LABEL[secondQuantity]} high`} />
              ) : null}
            </span>
          );
        },
      }),
    ];
  }, [canSelect, items, selected, onSelectedChange, scale.factor, scale.unit, hasSecond, secondQuantity, secondUnit, stats]);

  // The virtualiser works on the index list; the table gets only the rows in view, so the table
  // model (one object per row) stays a few dozen rows however large the lot.
  const virtualizer = useVirtualizer({
    count: rows.length,
    getScrollElement: () => scrollRef.current,
    estimateSize: () => ROW_HEIGHT,
    overscan: 12,
  });
  const virtualRows = virtualizer.getVirtualItems();
  const first = virtualRows[0]?.index ?? 0;
  const last = virtualRows.length ? virtualRows[virtualRows.length - 1]!.index : -1;
  const windowRows = useMemo(() => rows.slice(first, last + 1), [rows, first, last]);

  const table = useReactTable({
    data: windowRows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    manualSorting: true,
    manualFiltering: true,
    enableMultiSort: false,
    sortDescFirst: false,
    getRowId: (i) => String(items.ids[i]),
    getCoreRowModel: getCoreRowModel(),
  });
  const tableRows = table.getRowModel().rows;
  const padTop = virtualRows[0]?.start ?? 0;
  const padBottom = virtualRows.length ? virtualizer.getTotalSize() - virtualRows[virtualRows.length - 1]!.end : 0;
  const colCount = table.getVisibleLeafColumns().length;

  const selectShown = () => {
    const next = new Set<number>();
    for (const i of rows) {
      if (next.size >= MAX_SELECTION) break;
      next.add(items.ids[i]!);
    }
    onSelectedChange(next);
  };

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-ink-soft" aria-live="polite">
        <span>
          <span className="num text-ink">{rows.length.toLocaleString()}</span> of{' '}
          <span className="num">{items.values.length.toLocaleString()}</span> items shown
        </span>
        {canSelect && (
          <>
            <span>
              <span className="num text-ink">{selected.size.toLocaleString()}</span> selected
            </span>
            <button type="button" className="text-accent underline-offset-2 hover:underline" onClick={selectShown}>
              Select the shown items{rows.length > MAX_SELECTION ? ` (first ${MAX_SELECTION.toLocaleString()})` : ''}
            </button>
            {selected.size > 0 && (
              <button type="button" className="text-accent underline-offset-2 hover:underline" onClick={() => onSelectedChange(new Set())}>
                Clear selection
              </button>
            )}
          </>
        )}
      </div>
      <p className="mb-2 text-xs text-ink-soft sm:hidden">
        On a narrow screen the list shows each item and its value; deviation, bin, set and check appear on a wider screen.
      </p>
      <div
        ref={scrollRef}
        // Containment keeps each scroll step's layout and paint inside the table's box, away from
        // the rest of a long page.
        style={{ contain: 'strict', height: `${Math.min(34 * 16, (rows.length + 1) * ROW_HEIGHT + 8)}px` }}
        className="relative overflow-auto rounded-lg border border-paper-edge bg-paper-bright"
        // A scrolling region is reached by keyboard (WCAG 2.1.1), so it is a labelled, focusable region.
        role="region"
        tabIndex={0}
        aria-label="Items of the lot (scrolls)"
      >
        <table className="w-full min-w-[880px] max-sm:min-w-0 table-fixed border-collapse text-sm" aria-rowcount={rows.length + 1}>
          <caption className="sr-only">Every item of the lot with its value, deviation, bin, set and check. Column headers sort.</caption>
          <thead className="sticky top-0 z-10 bg-paper-deep text-left">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const meta = header.column.columnDef.meta;
                  const sortable = header.column.getCanSort() && header.column.id !== 'select' && header.column.id !== 'flags';
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      style={meta?.width ? { width: meta.width } : undefined}
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={`border-b border-paper-edge px-3 py-2 font-medium whitespace-nowrap text-ink-soft ${meta?.numeric ? 'text-right' : ''} ${meta?.wideOnly ? 'max-sm:hidden' : ''}`}
                    >
                      {sortable ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className={`inline-flex items-center gap-1.5 rounded hover:text-ink ${meta?.numeric ? 'flex-row-reverse' : ''}`}
                        >
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <SortMark dir={sorted} />
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {padTop > 0 && (
              <tr aria-hidden="true">
                <td colSpan={colCount} style={{ height: padTop, padding: 0 }} />
              </tr>
            )}
            {virtualRows.map((vr, k) => {
              const row = tableRows[k];
              if (!row) return null;
              return (
                <tr
                  key={row.id}
                  aria-rowindex={vr.index + 2}
                  style={{ height: ROW_HEIGHT }}
                  className="border-b border-paper-edge/60 hover:bg-paper"
                >
                  {row.getVisibleCells().map((cell) => (
                    <td
                      key={cell.id}
                      className={`overflow-hidden px-3 py-1 align-middle whitespace-nowrap ${cell.column.columnDef.meta?.numeric ? 'num text-right' : ''} ${cell.column.columnDef.meta?.wideOnly ? 'max-sm:hidden' : ''}`}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              );
            })}
            {padBottom > 0 && (
              <tr aria-hidden="true">
                <td colSpan={colCount} style={{ height: padBottom, padding: 0 }} />
              </tr>
            )}
            {rows.length === 0 && (
              <tr>
                <td colSpan={colCount} className="px-3 py-6 text-center text-ink-soft">
                  No item matches these filters.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
