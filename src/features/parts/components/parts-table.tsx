import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { Part } from '@shared/schemas/parts';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { StatusBadge } from '@/components/ui/badge';
import { paths } from '@/config/paths';
import { formatNominal, formatTolerance } from '@/lib/format';
import { KIND_LABEL } from './part-form';

const col = createColumnHelper<Part>();

const columns = [
  col.accessor('label', {
    header: 'Label',
    cell: (c) => (
      <Link to={paths.app.part.getHref(c.row.original.id)} className="font-medium text-accent underline-offset-2 hover:underline">
        {c.getValue()}
      </Link>
    ),
  }),
  col.accessor('kind', { header: 'Kind', cell: (c) => KIND_LABEL[c.getValue()] }),
  col.accessor('nominal', {
    header: 'Nominal',
    meta: { numeric: true },
    sortUndefined: 'last',
    cell: (c) => formatNominal(c.row.original.kind, c.getValue()),
  }),
  col.accessor('tolerancePct', {
    header: 'Tolerance',
    meta: { numeric: true },
    cell: (c) => formatTolerance(c.getValue(), c.row.original.tolerancePlusPct),
  }),
  col.accessor('taperClass', {
    header: 'Taper',
    cell: (c) => {
      const t = c.getValue();
      return t ? (TAPER_LAW_LABEL[t] ?? t) : <span className="text-ink-faint">—</span>;
    },
  }),
  col.accessor('supplier', { header: 'Supplier', cell: (c) => c.getValue() ?? <span className="text-ink-faint">—</span> }),
  col.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} reason={c.row.original.statusReason} /> }),
];

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars -- the merged declaration must repeat the library's two type parameters
  interface ColumnMeta<TData, TValue> {
    /** Numbers: mono font, right-aligned. */
    numeric?: boolean;
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

export function PartsTable({ parts, caption }: { parts: Part[]; caption: string }) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const table = useReactTable({
    data: parts,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    // Every column sorts ascending on the first click, numbers included.
    sortDescFirst: false,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  return (
    <div className="overflow-x-auto rounded-lg border border-paper-edge bg-paper-bright">
      <table className="table-list table-list-head w-full min-w-[720px] border-collapse text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-deep text-left">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => {
                const sorted = header.column.getIsSorted();
                const numeric = header.column.columnDef.meta?.numeric;
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                    className={`border-b border-paper-edge px-3 py-2 font-medium text-ink-soft ${numeric ? 'text-right' : ''}`}
                  >
                    <button
                      type="button"
                      onClick={header.column.getToggleSortingHandler()}
                      className={`inline-flex items-center gap-1.5 rounded hover:text-ink ${numeric ? 'flex-row-reverse' : ''}`}
                    >
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <SortMark dir={sorted} />
                    </button>
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-paper-edge/70 last:border-b-0 hover:bg-paper">
              {row.getVisibleCells().map((cell) => (
                <td
                  key={cell.id}
                  data-label={
                    cell.column.id === 'label' || typeof cell.column.columnDef.header !== 'string'
                      ? undefined
                      : cell.column.columnDef.header
                  }
                  className={`px-3 py-2 align-middle ${cell.column.columnDef.meta?.numeric ? 'num text-right whitespace-nowrap' : ''}`}
                >
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
