// Upload of the lot's meter export. A refused file shows the server's message with the line and
// column of each problem; a file whose columns were not recognised opens a mapping step (column
// and unit per role), and the same file is sent again with that mapping.
import { useId, useRef, useState } from 'react';
import type { ExplicitMapping, NeedsMapping } from '@shared/csv/columns';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { isApiError } from '@/lib/api-client';
import { needsMappingOf, uploadMs, useUploadLotReadings, type UploadIssue, type UploadResult } from '../api/upload-lot-readings';
import type { Lot } from '../api/types';
import { fmtLotValue } from './lot-format';

type Role = 'item' | 'value' | 'second' | 'testFrequency';
const ROLES: { role: Role; label: string; required: boolean; units: (kind: Lot['kind']) => string[] }[] = [
  { role: 'item', label: 'Item (name or number of each part)', required: true, units: () => [] },
  { role: 'value', label: 'Value', required: true, units: (k) => (k === 'capacitor' ? ['pF', 'nF', 'µF', 'F'] : ['Ω', 'kΩ', 'MΩ']) },
  { role: 'second', label: 'Second reading (D or ESR)', required: false, units: () => ['', '%', 'Ω', 'mΩ'] },
  { role: 'testFrequency', label: 'Test frequency', required: false, units: () => ['Hz', 'kHz'] },
];
const UNIT_WORD: Record<string, string> = { '': 'none (D)', '%': '% (D)' };

function MappingStep({
  needs,
  lot,
  onSend,
  busy,
  onCancel,
}: {
  needs: NeedsMapping;
  lot: Lot;
  onSend: (m: ExplicitMapping) => void;
  busy: boolean;
  onCancel: () => void;
}) {
  const initial = Object.fromEntries(
    ROLES.map((r) => {
      const d = needs.detected[r.role];
      return [r.role, { column: d ? String(d.index) : '', unit: d?.unit ?? r.units(lot.kind)[r.role === 'value' ? 1 : 0] ?? '' }];
    }),
  ) as Record<Role, { column: string; unit: string }>;
  const [choice, setChoice] = useState(initial);
  const [error, setError] = useState<string | null>(null);
  const set = (role: Role, patch: Partial<{ column: string; unit: string }>) =>
    setChoice((c) => ({ ...c, [role]: { ...c[role], ...patch } }));

  const send = () => {
    const missing = ROLES.filter((r) => r.required && choice[r.role].column === '');
    if (missing.length) return setError(`Choose the column of the ${missing.map((m) => m.role).join(' and the ')}.`);
    const used = ROLES.map((r) => choice[r.role].column).filter((c) => c !== '');
    if (new Set(used).size !== used.length) return setError('Each column can hold one thing only.');
    setError(null);
    const mapping: ExplicitMapping = {};
    for (const r of ROLES) {
      const c = choice[r.role];
      if (c.column === '') continue;
      mapping[r.role] = { column: Number(c.column), ...(r.units(lot.kind).length ? { unit: c.unit } : {}) };
    }
    onSend(mapping);
  };

  return (
    <fieldset className="mt-4 rounded-md border border-accent/30 bg-accent-tint/40 p-4">
      <legend className="px-1 text-sm font-semibold">Which column holds what?</legend>
      <p className="mb-3 text-sm text-ink-soft">
        The file’s header is <span className="num">{needs.header.map((h) => `“${h}”`).join(', ')}</span>. Choose the columns, and the unit
        each is written in.
      </p>
      {error && (
        <div className="mb-3">
          <Alert>{error}</Alert>
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        {ROLES.map((r) => {
          const units = r.units(lot.kind);
          const id = `map-${r.role}`;
          return (
            <div key={r.role} className="flex flex-wrap items-end gap-2">
              <label className="min-w-40 flex-1 text-sm">
                <span className="mb-1 block font-medium">
                  {r.label}
                  {!r.required && <span className="font-normal text-ink-soft"> (optional)</span>}
                </span>
                <select
                  id={id}
                  className="w-full rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5"
                  value={choice[r.role].column}
                  onChange={(e) => set(r.role, { column: e.target.value })}
                >
                  <option value="">{r.required ? 'Choose a column' : 'Not in this file'}</option>
                  {needs.header.map((h, i) => (
                    <option key={i} value={String(i)}>
                      {h || `column ${i + 1}`}
                    </option>
                  ))}
                </select>
              </label>
              {units.length > 0 && (
                <label className="w-40 text-sm">
                  <span className="mb-1 block font-medium">Unit</span>
                  <select
                    className="w-full rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5"
                    value={choice[r.role].unit}
                    disabled={choice[r.role].column === ''}
                    onChange={(e) => set(r.role, { unit: e.target.value })}
                  >
                    {units.map((u) => (
                      <option key={u} value={u}>
                        {UNIT_WORD[u] ?? u}
                      </option>
                    ))}
                  </select>
                </label>
              )}
            </div>
          );
        })}
      </div>
      <div className="mt-4 flex gap-2">
        <Button variant="primary" onClick={send} busy={busy} busyText="Reading…">
          Read the file with these columns
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </fieldset>
  );
}

export function LotUpload({ lot, count }: { lot: Lot; count: number }) {
  const upload = useUploadLotReadings();
  const inputId = useId();
  const fileRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [replace, setReplace] = useState(false);
  const [result, setResult] = useState<UploadResult | null>(null);
  const [needs, setNeeds] = useState<NeedsMapping | null>(null);
  const [problem, setProblem] = useState<{ message: string; issues: UploadIssue[] } | null>(null);

  const send = async (mapping?: ExplicitMapping) => {
    if (!file) return setProblem({ message: 'Choose the lot’s CSV export first.', issues: [] });
    setProblem(null);
    setResult(null);
    try {
      const r = await upload.mutateAsync({ id: lot.id, file, replace: count > 0 && replace, ...(mapping ? { mapping } : {}) });
      setResult(r);
      setNeeds(null);
      setFile(null);
      setReplace(false);
      if (fileRef.current) fileRef.current.value = '';
    } catch (err) {
      const mappingNeeded = needsMappingOf(err);
      if (mappingNeeded && isApiError(err)) {
        setNeeds(mappingNeeded);
        setProblem({ message: err.message, issues: [] });
      } else if (isApiError(err)) {
        setProblem({ message: err.message, issues: err.issues });
      } else setProblem({ message: err instanceof Error ? err.message : 'The upload failed.', issues: [] });
    }
  };

  return (
    <div>
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          void send();
        }}
      >
        <div className="min-w-60 flex-1">
          <label htmlFor={inputId} className="mb-1 block text-sm font-medium">
            Meter export (CSV or TSV)
          </label>
          <input
            ref={fileRef}
            id={inputId}
            type="file"
            accept=".csv,.tsv,.txt,text/csv"
            aria-describedby={`${inputId}-hint`}
            className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-paper-edge file:bg-paper-bright file:px-3 file:py-1.5 file:text-sm file:text-ink hover:file:bg-paper-deep"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              setNeeds(null);
              setProblem(null);
            }}
          />
          <p id={`${inputId}-hint`} className="mt-1 text-xs text-ink-soft">
            One row per part: item, value with its unit in the header (“C (nF)”), optionally D or ESR and the test frequency. Up to 100,000
            rows.
          </p>
        </div>
        {count > 0 && (
          <label className="inline-flex min-h-10 items-center gap-2 text-sm">
            <input type="checkbox" className="size-4 accent-accent" checked={replace} onChange={(e) => setReplace(e.target.checked)} />
            Replace the {count.toLocaleString()} stored readings
          </label>
        )}
        <Button
          type="submit"
          variant="primary"
          busy={upload.isPending && !needs}
          busyText="Uploading…"
          disabled={!file || (count > 0 && !replace)}
        >
          Upload
        </Button>
      </form>
      {problem && (
        <div className="mt-3">
          <Alert tone={needs ? 'info' : 'error'} title={needs ? 'The columns need naming' : 'The file was not stored'}>
            <p>{problem.message}</p>
            {/* The message names the first problem already; list them when there are more. */}
            {problem.issues.length > 1 && (
              <ul className="mt-1 list-disc pl-5">
                {problem.issues.map((i, k) => (
                  <li key={k}>
                    {i.line != null && <span className="num">line {i.line}</span>}
                    {i.column && <span> · column “{i.column}”</span>}
                    {(i.line != null || i.column) && ': '}
                    {i.message}
                  </li>
                ))}
              </ul>
            )}
          </Alert>
        </div>
      )}
      {needs && (
        <MappingStep
          needs={needs}
          lot={lot}
          busy={upload.isPending}
          onSend={(m) => void send(m)}
          onCancel={() => {
            setNeeds(null);
            setProblem(null);
          }}
        />
      )}
      {result && (
        <div className="mt-3">
          <Alert
            tone="success"
            title={`Stored ${result.rows.toLocaleString()} readings${uploadMs(result) !== null ? ` in ${uploadMs(result)!.toLocaleString()} ms` : ''}`}
          >
            Columns used:{' '}
            {Object.entries(result.columns)
              .map(([role, header]) => `${role} ← “${header}”`)
              .join(', ')}
            .
            {result.stats &&
              ` Mean ${fmtLotValue(result.stats.mean, lot.unit)}, ${result.stats.countBelow + result.stats.countAbove} out of tolerance.`}
          </Alert>
        </div>
      )}
    </div>
  );
}
