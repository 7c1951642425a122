// Upload a sweep file. A refused file shows every problem with its line and column; a file whose
// columns were not recognised opens the column-mapping step and is sent again with the mapping.
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import type { ColumnRole, NeedsMapping } from '@shared/csv/columns';
import { SweepKindSchema, type SweepKind } from '@shared/schemas/sweeps';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
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

const ROLE_LABEL: Record<string, string> = {
  rotation: 'Rotation',
  resistance: 'Resistance, lug 1 to wiper',
  resistanceW3: 'Resistance, wiper to lug 3 (optional)',
  total: 'Resistance, lug 1 to lug 3 (R13, optional)',
  frequency: 'Frequency',
  magnitude: 'Impedance magnitude |Z|',
  phase: 'Phase',
  re: 'Real part of Z',
  im: 'Imaginary part of Z',
};

/** Units the reader accepts for each role (shared/csv/columns.ts ROLE_DIMENSIONS), as it parses them. */
const ROLE_UNITS: Record<string, { value: string; label: string }[]> = {
  rotation: [
    { value: 'deg', label: 'degrees (°)' },
    { value: '%', label: 'percent (%)' },
  ],
  resistance: [
    { value: 'Ω', label: 'Ω' },
    { value: 'kΩ', label: 'kΩ' },
    { value: 'MΩ', label: 'MΩ' },
  ],
  frequency: [
    { value: 'Hz', label: 'Hz' },
    { value: 'kHz', label: 'kHz' },
  ],
  phase: [
    { value: 'deg', label: 'degrees (°)' },
    { value: 'rad', label: 'radians' },
  ],
};
ROLE_UNITS.resistanceW3 = ROLE_UNITS.resistance!;
ROLE_UNITS.total = ROLE_UNITS.resistance!;
ROLE_UNITS.magnitude = ROLE_UNITS.resistance!;
ROLE_UNITS.re = ROLE_UNITS.resistance!;
ROLE_UNITS.im = ROLE_UNITS.resistance!;

type Choice = { column: string; unit: string };

/** The column-mapping step: which column of the file holds what, and in which unit. */
function MappingStep({
  kind,
  needs,
  busy,
  onSend,
  onCancel,
}: {
  kind: SweepKind;
  needs: NeedsMapping;
  busy: boolean;
  onSend: (mapping: NonNullable<SweepUpload['mapping']>) => void;
  onCancel: () => void;
}) {
  const [form, setForm] = useState<'polar' | 'rect'>(needs.detected.re || needs.detected.im ? 'rect' : 'polar');
  const roles: ColumnRole[] =
    kind === 'taper'
      ? ['rotation', 'resistance', 'resistanceW3', 'total']
      : form === 'polar'
        ? ['frequency', 'magnitude', 'phase']
        : ['frequency', 're', 'im'];
  const initial = (role: ColumnRole, i: number): Choice => {
    const d = needs.detected[role];
    const units = ROLE_UNITS[role]!;
    const unitFromHeader = d?.unit && units.some((u) => u.value === d.unit) ? d.unit : units[0]!.value;
    if (d) return { column: String(d.index), unit: unitFromHeader };
    // Unknown headers: suggest the columns in file order, but never for the optional column.
    if (role === 'resistanceW3' || role === 'total') return { column: '', unit: unitFromHeader };
    return { column: i < needs.header.length ? String(i) : '', unit: unitFromHeader };
  };
  const [choices, setChoices] = useState<Record<string, Choice>>(() =>
    Object.fromEntries(
      (['rotation', 'resistance', 'resistanceW3', 'total', 'frequency', 'magnitude', 'phase', 're', 'im'] as ColumnRole[]).map((r) => {
        const list =
          kind === 'taper'
            ? ['rotation', 'resistance', 'resistanceW3', 'total']
            : r === 're' || r === 'im'
              ? ['frequency', 're', 'im']
              : ['frequency', 'magnitude', 'phase'];
        return [r, initial(r, Math.max(0, list.indexOf(r)))];
      }),
    ),
  );
  const [error, setError] = useState<string | null>(null);

  const send = () => {
    const used = new Map<string, string>();
    const mapping: NonNullable<SweepUpload['mapping']> = {};
    for (const role of roles) {
      const c = choices[role]!;
      if (c.column === '') {
        if (role === 'resistanceW3' || role === 'total') continue;
        return setError(`Choose the column that holds the ${ROLE_LABEL[role]!.toLowerCase()}.`);
      }
      if (used.has(c.column))
        return setError(
          `One column cannot hold both the ${ROLE_LABEL[used.get(c.column)!]!.toLowerCase()} and the ${ROLE_LABEL[role]!.toLowerCase()}.`,
        );
      used.set(c.column, role);
      mapping[role] = { column: Number(c.column), unit: c.unit };
    }
    setError(null);
    onSend(mapping);
  };

  return (
    <fieldset className="space-y-3 rounded-md border border-accent/30 bg-accent-tint/40 p-3 sm:p-4">
      <legend className="px-1 text-sm font-semibold">Which column holds what?</legend>
      <p className="text-sm text-ink-soft">
        The file’s columns are:{' '}
        {needs.header.map((h, i) => (
          <span key={i} className="mr-1.5 inline-block rounded border border-paper-edge bg-paper-bright px-1.5 font-mono text-xs text-ink">
            {i + 1}: {h || '(no name)'}
          </span>
        ))}
      </p>
      {kind === 'impedance' && (
        <div role="radiogroup" aria-label="How the file gives the impedance" className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="radio" name="zform" checked={form === 'polar'} onChange={() => setForm('polar')} /> Magnitude and phase
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="zform" checked={form === 'rect'} onChange={() => setForm('rect')} /> Real and imaginary parts
          </label>
        </div>
      )}
      <div className="grid gap-3 sm:grid-cols-3">
        {roles.map((role) => {
          const c = choices[role]!;
          const set = (patch: Partial<Choice>) => setChoices((all) => ({ ...all, [role]: { ...all[role]!, ...patch } }));
          return (
            <div key={role} className="grid grid-cols-[1fr_7rem] gap-2 sm:col-span-3 md:col-span-1 md:grid-cols-1">
              <SelectField label={ROLE_LABEL[role]} value={c.column} onChange={(e) => set({ column: e.target.value })}>
                <option value="">{role === 'resistanceW3' || role === 'total' ? 'Not in the file' : 'Choose a column'}</option>
                {needs.header.map((h, i) => (
                  <option key={i} value={i}>
                    {i + 1}: {h || '(no name)'}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label={`Unit of ${ROLE_LABEL[role]!.replace(' (optional)', '').toLowerCase()}`}
                value={c.unit}
                onChange={(e) => set({ unit: e.target.value })}
                disabled={c.column === ''}
              >
                {ROLE_UNITS[role]!.map((u) => (
                  <option key={u.value} value={u.value}>
                    {u.label}
                  </option>
                ))}
              </SelectField>
            </div>
          );
        })}
      </div>
      {error && <Alert>{error}</Alert>}
      <div className="flex flex-wrap gap-2">
        <Button variant="primary" onClick={send} busy={busy} busyText="Sending…">
          Read the file with these columns
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </fieldset>
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
        <MappingStep
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
