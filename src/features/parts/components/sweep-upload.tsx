// Upload a sweep file. A refused file shows every problem with its line and column; a file whose
// columns were not recognised opens the column-mapping step and is sent again with the mapping.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { NeedsMapping } from '@shared/csv/columns';
import { SweepKindSchema } from '@shared/schemas/sweeps';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ColumnMappingStep } from '@/components/uploads/column-mapping';
import { SelectField, TextField } from '@/components/ui/field';
import { isApiError, type FileIssue } from '@/lib/api-client';
import { useUploadSweep, type SweepUpload } from '../api/sweeps';

const UploadSchema = z.object({
  kind: SweepKindSchema,
  fullRotationDeg: z.coerce
    .number({ message: 'Type the full rotation in degrees, e.g. 300.' })
    .positive('Must be more than 0°.')
    .max(3600, 'At most 3600°.'),
  file: z.custom<FileList>((v) => typeof FileList !== 'undefined' && v instanceof FileList && v.length === 1, 'Choose a CSV file.'),
});
type UploadValues = z.input<typeof UploadSchema>;

export function IssueList({ issues }: { issues: FileIssue[] }) {
  if (issues.length === 0) return null;
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm">
        <caption className="sr-only">Problems found in the file</caption>
        <thead>
          <tr className="border-b border-fail/30 text-left text-xs uppercase tracking-wide text-ink-soft">
            <th scope="col" className="py-1.5 pr-3 text-right font-medium">
              Line
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Column
            </th>
            <th scope="col" className="py-1.5 font-medium">
              Problem
            </th>
          </tr>
        </thead>
        <tbody>
          {issues.map((i, n) => (
            <tr key={n} className="border-b border-paper-edge/70 align-top last:border-0">
              <td className="num py-1.5 pr-3 text-right">{i.line ?? '—'}</td>
              <td className="py-1.5 pr-3 font-mono text-xs">{i.column ?? '—'}</td>
              <td className="py-1.5">{i.message}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function SweepUploadForm({ partId, partKind, onDone }: { partId: number; partKind: string; onDone?: () => void }) {
  const upload = useUploadSweep();
  const form = useForm<UploadValues, unknown, z.output<typeof UploadSchema>>({
    resolver: zodResolver(UploadSchema),
    defaultValues: { kind: partKind === 'pot' ? 'taper' : 'impedance', fullRotationDeg: '300' },
  });
  const { errors } = form.formState;
  const kind = form.watch('kind');
  const [pending, setPending] = useState<Omit<SweepUpload, 'mapping'> | null>(null);
  const [needs, setNeeds] = useState<NeedsMapping | null>(null);
  const [refused, setRefused] = useState<{ message: string; issues: FileIssue[] } | null>(null);
  const [done, setDone] = useState<string | null>(null);
  // Remounting the file input is the one way to empty it after a successful upload.
  const [fileKey, setFileKey] = useState(0);

  const send = async (input: SweepUpload) => {
    setRefused(null);
    setDone(null);
    try {
      const sweep = await upload.mutateAsync(input);
      setNeeds(null);
      setPending(null);
      form.reset({ ...form.getValues(), file: undefined });
      setFileKey((k) => k + 1);
      const ignored = sweep.ignoredColumns.length > 0 ? ` Columns not used: ${sweep.ignoredColumns.map((h) => `“${h}”`).join(', ')}.` : '';
      const notes = sweep.notes.length > 0 ? ` ${sweep.notes.join(' ')}` : '';
      setDone(`Read ${sweep.pointCount} points from ${input.file.name} and fitted them.${ignored}${notes}`);
      onDone?.();
    } catch (err) {
      if (isApiError(err) && err.code === 'needs_mapping' && err.details?.needsMapping) {
        setPending(input);
        setNeeds(err.details.needsMapping as NeedsMapping);
        if (input.mapping) setRefused({ message: err.message, issues: err.issues });
        return;
      }
      const issues = isApiError(err) ? err.issues : [];
      // With a list of problems the table says where; the heading only says how many.
      const message =
        issues.length > 0
          ? `The file was refused: ${issues.length === 1 ? 'one problem' : `${issues.length} problems`}. Fix the file and upload it again.`
          : err instanceof Error
            ? err.message
            : 'The upload failed.';
      setRefused({ message, issues });
    }
  };

  const onSubmit = form.handleSubmit((v) => {
    setNeeds(null);
    void send({ partId, file: v.file[0]!, kind: v.kind, fullRotationDeg: v.kind === 'taper' ? v.fullRotationDeg : undefined });
  });

  return (
    <div className="space-y-3">
      <form
        onSubmit={onSubmit}
        noValidate
        aria-label="Upload a sweep"
        className="grid items-start gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(8.5rem,1fr)_minmax(7rem,1fr)_auto]"
      >
        <TextField
          key={fileKey}
          label="Sweep file (CSV)"
          type="file"
          accept=".csv,.txt,.tsv,text/csv,text/plain"
          error={errors.file?.message}
          inputClassName="py-1.5"
          {...form.register('file')}
        />
        <SelectField label="Sweep of" error={errors.kind?.message} {...form.register('kind')}>
          <option value="taper" disabled={partKind !== 'pot'}>
            Rotation
          </option>
          <option value="impedance">Impedance</option>
        </SelectField>
        {kind === 'taper' ? (
          <TextField
            label="Full rotation (°)"
            inputMode="decimal"
            inputClassName="num"
            hint="Used when the file gives degrees"
            error={errors.fullRotationDeg?.message}
            {...form.register('fullRotationDeg')}
          />
        ) : (
          <div className="hidden sm:block" />
        )}
        <Button type="submit" variant="primary" className="sm:mt-6" busy={upload.isPending && !needs} busyText="Reading…">
          Upload and fit
        </Button>
      </form>
      {done && <Alert tone="success">{done}</Alert>}
      {refused && (
        <div role="alert" className="space-y-2 rounded-md border border-fail/40 bg-fail-tint/40 p-3">
          <p className="text-sm font-semibold text-fail">{refused.message}</p>
          <IssueList issues={refused.issues} />
        </div>
      )}
      {needs && pending && (
        <ColumnMappingStep
          key={pending.file.name + pending.kind}
          kind={pending.kind}
          needs={needs}
          busy={upload.isPending}
          onSend={(mapping) => void send({ ...pending, mapping })}
          onCancel={() => {
            setNeeds(null);
            setPending(null);
            setRefused(null);
          }}
        />
      )}
    </div>
  );
}
