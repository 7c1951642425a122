import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { InstallPartInputSchema } from '@shared/schemas/jobs';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { applyServerError } from '@/lib/form';
import type { PartDetail } from '@shared/schemas/parts';
import { useJobs } from '@/data/jobs';
import { useInstallPart } from '@/data/jobs';

const Schema = z.object({ jobId: z.string().min(1, 'Choose a job.'), position: InstallPartInputSchema.shape.position });
type Values = z.input<typeof Schema>;

function InstallForm({ part, onDone }: { part: PartDetail; onDone: () => void }) {
  const jobs = useJobs(true);
  const install = useInstallPart();
  const form = useForm<Values, unknown, z.output<typeof Schema>>({
    resolver: zodResolver(Schema),
    defaultValues: { jobId: '', position: '' },
  });
  const { errors } = form.formState;
  const open = jobs.data?.jobs.filter((j) => j.status === 'open') ?? [];

  const onSubmit = form.handleSubmit(async (v) => {
    try {
      await install.mutateAsync({ id: Number(v.jobId), input: { partId: part.id, position: v.position } });
      onDone();
    } catch (err) {
      applyServerError(err, form.setError, ['jobId', 'position']);
    }
  });

  if (jobs.isError) return <Alert>{jobs.error.message}</Alert>;
  if (jobs.isSuccess && open.length === 0)
    return <p className="text-sm text-ink-soft">There is no open job to install into. Open one on the Jobs screen.</p>;
  return (
    <form onSubmit={onSubmit} noValidate aria-label={`Install ${part.label} in a job`} className="space-y-3">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <SelectField label="Open job" error={errors.jobId?.message} disabled={jobs.isPending} {...form.register('jobId')}>
        <option value="">{jobs.isPending ? 'Loading jobs…' : 'Choose a job'}</option>
        {open.map((j) => (
          <option key={j.id} value={j.id}>
            {j.code} — {j.customer}, {j.instrument}
          </option>
        ))}
      </SelectField>
      <TextField
        label="Position"
        autoComplete="off"
        hint="Where it goes, e.g. volume, neck"
        error={errors.position?.message}
        {...form.register('position')}
      />
      <div className="flex gap-2">
        <Button type="submit" variant="primary" busy={install.isPending} busyText="Installing…">
          Install
        </Button>
        <Button onClick={onDone}>Cancel</Button>
      </div>
    </form>
  );
}

export function PartJobs({ part }: { part: PartDetail }) {
  const canWrite = useCan('write');
  const [installing, setInstalling] = useState(false);
  const installable = part.status !== 'installed' && part.status !== 'rejected' && part.status !== 'retired';
  return (
    <div className="space-y-3">
      {part.installedIn.length === 0 ? (
        <p className="text-sm text-ink-soft">Not installed in any job.</p>
      ) : (
        <ul className="space-y-2">
          {part.installedIn.map((j) => (
            <li key={`${j.jobId}-${j.installedAt}`} className="text-sm">
              <Link to={paths.app.job.getHref(j.jobId)} className="font-medium text-accent underline-offset-2 hover:underline">
                {j.code}
              </Link>{' '}
              — {j.customer}, {j.instrument} · position <span className="font-medium">{j.position}</span>
              <span className="block text-xs text-ink-soft">Installed {formatDateTime(j.installedAt)}</span>
            </li>
          ))}
        </ul>
      )}
      {canWrite &&
        installable &&
        (installing ? (
          <InstallForm part={part} onDone={() => setInstalling(false)} />
        ) : (
          <Button onClick={() => setInstalling(true)}>Install in a job…</Button>
        ))}
    </div>
  );
}
