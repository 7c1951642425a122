// "Install a part": the tech types the printed label, sees the part it names (kind, value,
// status) at once, says where it goes, and installs it. A label typed or scanned faster than the
// look-up is looked up on submit. A flagged or never-judged part goes in only with a stated reason:
// the server's refusal carries the status and the reasons, shown here before the tech confirms.
import { useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { InstallPartInputSchema } from '@shared/schemas/jobs';
import { Alert } from '@/components/ui/alert';
import { StatusBadge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { InstallSafetyNote } from '@/components/safety/safety-notes';
import { paths } from '@/config/paths';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { isApiError } from '@/lib/api-client';
import { formatNominal } from '@/lib/format';
import { useInstallPart } from '@/data/jobs';
import { partByLabelQueryOptions, usePartByLabel } from '../api/job-parts';

interface Refusal {
  partId: number;
  label: string;
  status: string;
  reasons: string[];
}

export function InstallPartForm({ jobId }: { jobId: number }) {
  const [label, setLabel] = useState('');
  const [position, setPosition] = useState('');
  const [errors, setErrors] = useState<{ label?: string; position?: string; overrideReason?: string; root?: string }>({});
  const [done, setDone] = useState<string | null>(null);
  const [refusal, setRefusal] = useState<Refusal | null>(null);
  const [overrideReason, setOverrideReason] = useState('');
  const queryClient = useQueryClient();
  const wanted = useDebouncedValue(label.trim(), 250);
  const found = usePartByLabel(wanted);
  const install = useInstallPart();
  const part = wanted ? found.data : undefined;
  const notFound = found.isError && isApiError(found.error) && found.error.status === 404;
  const blocked = part && ['installed', 'rejected', 'retired'].includes(part.status);

  const submit = async (e: FormEvent) => {
    e.preventDefault();
    setDone(null);
    const next: typeof errors = {};
    const typed = label.trim();
    let target = wanted === typed && !found.isFetching ? part : undefined;
    if (!typed) next.label = 'Type the label printed on the part.';
    else if (!target) {
      // Typed or scanned faster than the debounced look-up: ask now.
      try {
        target = await queryClient.fetchQuery(partByLabelQueryOptions(typed));
      } catch (err) {
        next.label =
          isApiError(err) && err.status === 404
            ? `No part is labelled “${typed}”.`
            : err instanceof Error
              ? err.message
              : 'The part could not be found.';
      }
    }
    const checked = InstallPartInputSchema.safeParse({
      partId: target?.id ?? 1,
      position,
      overrideReason: refusal && refusal.partId === target?.id ? overrideReason : undefined,
    });
    if (!checked.success) {
      for (const key of ['position', 'overrideReason'] as const) next[key] = checked.error.issues.find((i) => i.path[0] === key)?.message;
    }
    setErrors(next);
    if (next.label || next.position || next.overrideReason || !target) return;
    try {
      await install.mutateAsync({ id: jobId, input: checked.data! });
      setDone(
        `${target.label} installed at “${position.trim()}”${checked.data!.overrideReason ? ' with your override reason recorded' : ''}.`,
      );
      setLabel('');
      setPosition('');
      setRefusal(null);
      setOverrideReason('');
    } catch (err) {
      if (isApiError(err) && err.code === 'needs_override') {
        const d = err.details as { status?: string; reasons?: string[] } | undefined;
        setRefusal({ partId: target.id, label: target.label, status: d?.status ?? target.status, reasons: d?.reasons ?? [] });
        return;
      }
      setErrors({ root: err instanceof Error ? err.message : 'The part could not be installed.' });
    }
  };

  return (
    <form onSubmit={submit} noValidate className="space-y-3" aria-label="Install a part">
      {errors.root && <Alert>{errors.root}</Alert>}
      {done && <Alert tone="success">{done}</Alert>}
      <InstallSafetyNote />
      <div className="grid gap-3 sm:grid-cols-[1fr_1fr_auto] sm:items-start">
        <TextField
          label="Part label"
          autoComplete="off"
          spellCheck={false}
          inputClassName="num"
          placeholder="P-0142"
          value={label}
          onChange={(e) => {
            setLabel(e.target.value);
            setRefusal(null);
          }}
          error={errors.label ?? (notFound && wanted ? `No part is labelled “${wanted}”.` : undefined)}
          hint={
            part ? (
              <span className="inline-flex flex-wrap items-center gap-1.5" aria-live="polite">
                <Link to={paths.app.part.getHref(part.id)} className="text-accent underline">
                  {part.label}
                </Link>
                <span>
                  {part.kind}, <span className="num">{formatNominal(part.kind, part.nominal)}</span>
                </span>
                <StatusBadge status={part.status} reason={part.statusReason} />
              </span>
            ) : found.isFetching ? (
              'Looking up…'
            ) : (
              'As printed on the part or its bag'
            )
          }
        />
        <TextField
          label="Position"
          autoComplete="off"
          placeholder="volume, neck"
          hint="Where it goes, in the shop’s words"
          value={position}
          onChange={(e) => setPosition(e.target.value)}
          error={errors.position}
        />
        <Button
          type="submit"
          variant="primary"
          className="sm:mt-6"
          busy={install.isPending}
          busyText="Installing…"
          disabled={Boolean(blocked)}
        >
          Install
        </Button>
      </div>
      {refusal && (
        <div className="space-y-2 rounded-md border border-marginal/50 bg-paper-bright p-3" role="alert" aria-label="Install check">
          <p className="text-sm">
            <span className="num font-medium">{refusal.label}</span> is <span className="font-semibold">{refusal.status}</span>
            {refusal.status === 'incoming' ? ' (never judged)' : ''}. Why:
          </p>
          <ul className="list-disc pl-5 text-sm">
            {refusal.reasons.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
          <TextField
            label="Reason to install it anyway"
            autoComplete="off"
            hint="3 to 300 characters; kept on the job and in the audit log, and printed in the customer report."
            value={overrideReason}
            onChange={(e) => setOverrideReason(e.target.value)}
            error={errors.overrideReason}
          />
          <div className="flex flex-wrap gap-2">
            <Button type="submit" size="sm" variant="danger" busy={install.isPending} busyText="Installing…">
              Install anyway
            </Button>
            <Button
              type="button"
              size="sm"
              variant="secondary"
              onClick={() => {
                setRefusal(null);
                setOverrideReason('');
              }}
            >
              Cancel
            </Button>
          </div>
        </div>
      )}
      {blocked && part && (
        <p className="text-sm text-marginal">
          {part.label} is {part.status}; {part.status === 'installed' ? 'remove it from its job first.' : 'it cannot be installed.'}
        </p>
      )}
    </form>
  );
}
