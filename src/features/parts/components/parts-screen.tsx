import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { PART_KINDS, PART_STATUSES } from '@shared/schemas/common';
import { Alert, Loading } from '@/components/ui/alert';
import { STATUS_LOOK } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { PageHeader } from '@/components/ui/page-header';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { useCan } from '@/lib/auth';
import { PARTS_LIST_LIMIT, filtersFromSearch, useParts } from '../api/get-parts';
import { CreatePartForm, KIND_LABEL } from './part-form';
import { PartsTable } from './parts-table';

export function PartsScreen() {
  const canWrite = useCan('write');
  const [search, setSearch] = useSearchParams();
  const filters = filtersFromSearch(search);
  const parts = useParts({ ...filters, limit: PARTS_LIST_LIMIT });
  const [creating, setCreating] = useState(false);

  // The search box updates the address once typing pauses; the list follows the address.
  const [text, setText] = useState(filters.q ?? '');
  const settled = useDebouncedValue(text.trim(), 300);
  useEffect(() => {
    if (settled === (filters.q ?? '')) return;
    setSearch(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (settled) next.set('q', settled);
        else next.delete('q');
        return next;
      },
      { replace: true },
    );
    // Only a settled change of the text should move the address.
    // eslint-disable-next-line react-hooks/exhaustive-deps -- only a settled change of the text moves the address, not a new setter identity
  }, [settled]);

  const setFilter = (key: 'kind' | 'status', value: string) =>
    setSearch(
      (prev) => {
        const next = new URLSearchParams(prev);
        if (value) next.set(key, value);
        else next.delete(key);
        return next;
      },
      { replace: true },
    );

  const rows = parts.data?.parts ?? [];
  const filtered = Boolean(filters.kind || filters.status || filters.q);

  return (
    <div>
      <PageHeader
        title="Parts"
        description="Every pot, capacitor, resistor and pickup on the bench, with its nominal values and status."
        actions={
          canWrite && !creating ? (
            <Button variant="primary" onClick={() => setCreating(true)} aria-expanded={creating} aria-controls="new-part-panel">
              New part
            </Button>
          ) : null
        }
      />

      {canWrite && creating && (
        <div id="new-part-panel" className="mb-6 rounded-lg border border-accent/30 bg-paper-bright p-4 sm:p-5">
          <CreatePartForm onClose={() => setCreating(false)} />
        </div>
      )}

      <form
        role="search"
        aria-label="Filter parts"
        className="mb-4 grid gap-3 sm:grid-cols-[1fr_10rem_10rem]"
        onSubmit={(e) => e.preventDefault()}
      >
        <TextField
          label="Search"
          type="search"
          placeholder="Label, supplier, marking or tag"
          value={text}
          onChange={(e) => setText(e.target.value)}
        />
        <SelectField label="Kind" value={filters.kind ?? ''} onChange={(e) => setFilter('kind', e.target.value)}>
          <option value="">All kinds</option>
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Status" value={filters.status ?? ''} onChange={(e) => setFilter('status', e.target.value)}>
          <option value="">All statuses</option>
          {PART_STATUSES.map((s) => (
            <option key={s} value={s}>
              {STATUS_LOOK[s].label}
            </option>
          ))}
        </SelectField>
      </form>

      {parts.isPending ? (
        <Loading what="Loading parts" />
      ) : parts.isError ? (
        <Alert>{parts.error.message}</Alert>
      ) : rows.length === 0 ? (
        <p className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">
          {filtered ? 'No part matches these filters.' : canWrite ? 'No parts yet. Use “New part” to add the first.' : 'No parts yet.'}
        </p>
      ) : (
        <>
          <p className="mb-2 text-sm text-ink-soft" aria-live="polite">
            {rows.length === PARTS_LIST_LIMIT
              ? `Showing the newest ${PARTS_LIST_LIMIT} parts; narrow the filters to see others.`
              : `${rows.length} ${rows.length === 1 ? 'part' : 'parts'}`}
            {parts.isFetching && ' · updating…'}
          </p>
          <PartsTable parts={rows} caption="Parts, filtered as above. Column headers sort." />
        </>
      )}
    </div>
  );
}
