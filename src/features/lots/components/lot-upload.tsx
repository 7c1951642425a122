// Upload of the lot's meter export. A refused file shows the server's message with the line and
// column of each problem; a file whose columns were not recognised, or whose value column gives no
// unit where the values cannot be farads, opens the shared column-mapping step (column and unit per
// role), and the same file is sent again with that mapping. The columns used and those not used are
// listed back.
import { useId, useRef, useState } from 'react';
import { roleWord, type ColumnRole, type ExplicitMapping, type NeedsMapping } from '@shared/csv/columns';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ColumnMappingStep } from '@/components/uploads/column-mapping';
import { isApiError } from '@/lib/api-client';
import { needsMappingOf, uploadMs, useUploadLotReadings, type UploadIssue, type UploadResult } from '../api/upload-lot-readings';
import type { Lot } from '../api/types';
import { fmtLotValue } from './lot-format';

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
        // The step says what it needs; a message only when a mapping was sent and still did not fit.
        setProblem(mapping ? { message: err.message, issues: [] } : null);
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
          <Alert tone={needs ? 'info' : 'error'} title={needs ? 'The file still needs its columns named' : 'The file was not stored'}>
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
        <ColumnMappingStep
          kind="lot"
          quantity={lot.kind === 'capacitor' ? 'capacitance' : 'resistance'}
          needs={needs}
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
              .map(([role, header]) => `${roleWord(role as ColumnRole)} ← “${header}”`)
              .join(', ')}
            .
            {result.ignoredColumns && result.ignoredColumns.length > 0 && (
              <> Columns not used: {result.ignoredColumns.map((h) => `“${h}”`).join(', ')}.</>
            )}
            {result.stats &&
              ` Mean ${fmtLotValue(result.stats.mean, lot.unit)}, ${result.stats.countBelow + result.stats.countAbove} out of tolerance.`}
          </Alert>
        </div>
      )}
    </div>
  );
}
