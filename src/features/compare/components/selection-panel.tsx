// Which pots to compare: by lot, supplier, nominal, taper class, date, tag, or one by one.
import { useId, useMemo, useState } from 'react';
import type { GroupBy } from '@shared/analysis/compare';
import type { CompareSelection } from '@shared/schemas/compare';
import { TAPER_LAW_LABEL, TAPER_LAWS } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { SelectField, TextField } from '@/components/ui/field';
import type { CompareCandidates } from '../api/types';

function toggle<T>(list: readonly T[] | undefined, value: T, on: boolean): T[] | undefined {
  const next = (list ?? []).filter((v) => v !== value);
  if (on) next.push(value);
  return next.length ? next : undefined;
}

function CheckList({
  legend,
  items,
}: {
  legend: string;
  items: { key: string; label: React.ReactNode; checked: boolean; onChange: (on: boolean) => void }[];
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium text-ink">{legend}</legend>
      {items.length === 0 ? (
        <p className="text-sm text-ink-faint">None with sweeps</p>
      ) : (
        <ul className="max-h-48 space-y-1.5 overflow-y-auto pr-1">
          {items.map((it) => (
            <li key={it.key}>
              <label className="flex cursor-pointer items-start gap-2 text-sm">
                <input
                  type="checkbox"
                  className="mt-0.5 size-4 accent-accent"
                  checked={it.checked}
                  onChange={(e) => it.onChange(e.target.checked)}
                />
                <span>{it.label}</span>
              </label>
            </li>
          ))}
        </ul>
      )}
    </fieldset>
  );
}

export const GROUP_LABEL: Record<GroupBy, string> = { lot: 'Lot', supplier: 'Supplier', none: 'No grouping' };

export function GroupByChooser({ value, onChange }: { value: GroupBy; onChange: (g: GroupBy) => void }) {
  const name = useId();
  return (
    <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-1">
      <legend className="sr-only">Group and colour by</legend>
      <span className="text-sm font-medium text-ink" aria-hidden="true">
        Group by
      </span>
      {(['lot', 'supplier', 'none'] as const).map((g) => (
        <label key={g} className="flex cursor-pointer items-center gap-1.5 text-sm">
          <input type="radio" name={name} className="size-4 accent-accent" checked={value === g} onChange={() => onChange(g)} />
          {GROUP_LABEL[g]}
        </label>
      ))}
    </fieldset>
  );
}

export function SelectionPanel({
  candidates,
  selection,
  onChange,
}: {
  candidates: CompareCandidates;
  selection: CompareSelection;
  onChange: (s: CompareSelection) => void;
}) {
  const [search, setSearch] = useState('');
  const set = (patch: Partial<CompareSelection>) => {
    const next: CompareSelection = { ...selection, ...patch };
    for (const k of Object.keys(next) as (keyof CompareSelection)[]) if (next[k] === undefined || next[k] === '') delete next[k];
    onChange(next);
  };
  const picked = new Set(selection.partIds ?? []);
  const shown = useMemo(() => {
    const q = search.trim().toLowerCase();
    return candidates.pots.filter((p) => !q || [p.label, p.lotCode, p.supplier, p.tags].some((s) => s?.toLowerCase().includes(q)));
  }, [candidates.pots, search]);
  const dateError =
    selection.createdFrom && selection.createdTo && selection.createdFrom > selection.createdTo
      ? 'The end date is before the start date.'
      : undefined;

  return (
    <div className="space-y-4">
      <div className="grid gap-5 sm:grid-cols-2 lg:grid-cols-4">
        <CheckList
          legend="Lots"
          items={candidates.lots.map((l) => ({
            key: String(l.id),
            label: (
              <>
                <span className="font-medium">{l.code}</span>
                <span className="block text-xs text-ink-soft">
                  {l.supplier ?? 'No supplier'} · {l.count} {l.count === 1 ? 'pot' : 'pots'}
                </span>
              </>
            ),
            checked: selection.lotIds?.includes(l.id) ?? false,
            onChange: (on) => set({ lotIds: toggle(selection.lotIds, l.id, on) }),
          }))}
        />
        <CheckList
          legend="Suppliers"
          items={candidates.suppliers.map((s) => ({
            key: s,
            label: s,
            checked: selection.suppliers?.includes(s) ?? false,
            onChange: (on) => set({ suppliers: toggle(selection.suppliers, s, on) }),
          }))}
        />
        <div className="space-y-3">
          <CheckList
            legend="Taper class"
            items={TAPER_LAWS.map((c) => ({
              key: c,
              label: TAPER_LAW_LABEL[c],
              checked: selection.taperClasses?.includes(c) ?? false,
              onChange: (on) => set({ taperClasses: toggle(selection.taperClasses, c, on) }),
            }))}
          />
          <SelectField
            label="Nominal"
            value={selection.nominal ?? ''}
            onChange={(e) => set({ nominal: e.target.value ? Number(e.target.value) : undefined })}
          >
            <option value="">Any nominal</option>
            {candidates.nominals.map((n) => (
              <option key={n} value={n}>
                {formatValue(n, 'Ω')}
              </option>
            ))}
          </SelectField>
        </div>
        <div className="space-y-3">
          <TextField
            label="Added from"
            type="date"
            value={selection.createdFrom ?? ''}
            onChange={(e) => set({ createdFrom: e.target.value || undefined })}
            inputClassName="num"
          />
          <TextField
            label="Added until"
            type="date"
            value={selection.createdTo ?? ''}
            onChange={(e) => set({ createdTo: e.target.value || undefined })}
            error={dateError}
            inputClassName="num"
          />
          <SelectField label="Tag" value={selection.tag ?? ''} onChange={(e) => set({ tag: e.target.value || undefined })}>
            <option value="">Any tag</option>
            {candidates.tags.map((t) => (
              <option key={t} value={t}>
                {t}
              </option>
            ))}
          </SelectField>
        </div>
      </div>

      <details className="rounded-md border border-paper-edge bg-paper px-3 py-2">
        <summary className="cursor-pointer text-sm font-medium text-ink">
          Pick pots one by one{' '}
          <span className="text-ink-soft">
            ({picked.size} picked
            {picked.size > 0 && !hasFilters(selection)
              ? '; only these are compared'
              : picked.size > 0
                ? '; added to the filtered pots'
                : ''}
            )
          </span>
        </summary>
        <div className="mt-3 space-y-2">
          <TextField
            label="Find a pot"
            placeholder="Label, lot, supplier or tag"
            value={search}
            onChange={(e) => setSearch(e.target.value)}
            className="max-w-sm"
          />
          <ul className="grid max-h-56 gap-x-4 gap-y-1 overflow-y-auto sm:grid-cols-2 lg:grid-cols-3" aria-label="Pots with a taper fit">
            {shown.map((p) => (
              <li key={p.id}>
                <label className="flex cursor-pointer items-center gap-2 text-sm">
                  <input
                    type="checkbox"
                    className="size-4 accent-accent"
                    checked={picked.has(p.id)}
                    onChange={(e) => set({ partIds: toggle(selection.partIds, p.id, e.target.checked) })}
                  />
                  <span className="font-medium">{p.label}</span>
                  <span className="truncate text-ink-soft">
                    {p.lotCode ?? 'no lot'} · <span className="num">{(p.m * 100).toFixed(1)} %</span>
                  </span>
                </label>
              </li>
            ))}
          </ul>
        </div>
      </details>
    </div>
  );
}

export function hasFilters(s: CompareSelection): boolean {
  return Boolean(
    s.lotIds?.length || s.suppliers?.length || s.nominal !== undefined || s.taperClasses?.length || s.createdFrom || s.createdTo || s.tag,
  );
}

/** The selection in a few words, for the summary line and saved studies. */
export function describeSelection(s: CompareSelection, c: CompareCandidates | undefined): string {
  const parts: string[] = [];
  if (s.lotIds?.length) parts.push(`lots ${s.lotIds.map((id) => c?.lots.find((l) => l.id === id)?.code ?? `#${id}`).join(', ')}`);
  if (s.suppliers?.length) parts.push(`from ${s.suppliers.join(', ')}`);
  if (s.nominal !== undefined) parts.push(formatValue(s.nominal, 'Ω'));
  if (s.taperClasses?.length) parts.push(s.taperClasses.map((t) => TAPER_LAW_LABEL[t]).join(' or '));
  if (s.createdFrom || s.createdTo) parts.push(`added ${s.createdFrom ?? '…'} to ${s.createdTo ?? '…'}`);
  if (s.tag) parts.push(`tagged “${s.tag}”`);
  const base = parts.length ? parts.join(', ') : s.partIds?.length ? '' : 'all pots with sweeps';
  const picked = s.partIds?.length ? `${parts.length ? ' plus ' : ''}${s.partIds.length} picked one by one` : '';
  return base + picked;
}
