// "Install a part": the tech types the printed label, sees the part it names (kind, value,
// status) at once, says where it goes, and installs it.
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
import { useInstallPart, usePartByLabel } from '../api/job-parts';

export function InstallPartForm({ jobId }: { jobId: number }) {
  const [label, setLabel] = useState('');
  const [position, setPosition] = useState('');
  const [errors, setErrors] = useState<{ label?: string; position?: string; root?: string }>({});
  const [done, setDone] = useState<string | null>(null);
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
    if (!label.trim()) next.label = 'Type the label printed on the part.';
    else if (wanted !== label.trim() || found.isFetching) next.label = 'Looking the label up; try again in a moment.';
    else if (!part) next.label = notFound ? `No part is labelled “${label.trim()}”.` : 'The part could not be found.';
    const checked = InstallPartInputSchema.safeParse({ partId: part?.id ?? 1, position });
    if (!checked.success) next.position = checked.error.issues.find((i) => i.path[0] === 'position')?.message;
    setErrors(next);
    if (next.label || next.position || !part) return;
    try {
      await install.mutateAsync({ id: jobId, input: { partId: part.id, position: checked.data!.position } });
      setDone(`${part.label} installed at “${position.trim()}”.`);
      setLabel('');
      setPosition('');
    } catch (err) {
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
          onChange={(e) => setLabel(e.target.value)}
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
        <TextField label="Position" autoComplete="off" placeholder="volume, neck" hint="Where it goes, in the shop’s words" value={position} onChange={(e) => setPosition(e.target.value)} error={errors.position} />
        <Button type="submit" variant="primary" className="sm:mt-6" busy={install.isPending} busyText="Installing…" disabled={Boolean(blocked)}>
          Install
        </Button>
      </div>
      {blocked && part && <p className="text-sm text-marginal">{part.label} is {part.status}; {part.status === 'installed' ? 'remove it from its job first.' : 'it cannot be installed.'}</p>}
    </form>
  );
}
