import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { useNavigate } from 'react-router-dom';
import { z } from 'zod';
import { CreateJobInputSchema, type CreateJobInput } from '@shared/schemas/jobs';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField, TextAreaField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { applyServerError } from '@/lib/form';
import { useHarnesses } from '@/data/harnesses';
import { useCreateJob } from '../api/save-job';

const JobFormFields = z.object({
  customer: z.string(),
  customerEmail: z.string(),
  instrument: z.string(),
  harnessId: z.string(),
  notes: z.string(),
});
type JobFormValues = z.input<typeof JobFormFields>;
const FIELDS = ['customer', 'customerEmail', 'instrument', 'harnessId', 'notes'] as const;

// The form's text goes through the shared schema, so the server's rules are the form's rules.
const JobFormSchema = JobFormFields.transform((v, ctx): CreateJobInput => {
  const r = CreateJobInputSchema.safeParse({
    customer: v.customer,
    customerEmail: v.customerEmail.trim() === '' ? null : v.customerEmail,
    instrument: v.instrument,
    harnessId: v.harnessId === '' ? null : Number(v.harnessId),
    notes: v.notes.trim() === '' ? null : v.notes,
  });
  if (!r.success) {
    for (const issue of r.error.issues)
      ctx.addIssue({ code: 'custom', path: [String(issue.path[0] ?? 'customer')], message: issue.message });
    return z.NEVER;
  }
  return r.data;
});

export function CreateJobForm({ onClose }: { onClose: () => void }) {
  const create = useCreateJob();
  const harnesses = useHarnesses();
  const navigate = useNavigate();
  const form = useForm<JobFormValues, unknown, CreateJobInput>({
    resolver: zodResolver(JobFormSchema),
    defaultValues: { customer: '', customerEmail: '', instrument: '', harnessId: '', notes: '' },
  });
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (input) => {
    try {
      const job = await create.mutateAsync(input);
      onClose();
      navigate(paths.app.job.getHref(job.id));
    } catch (err) {
      applyServerError(err, form.setError, FIELDS);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="new-job-heading" className="space-y-4">
      <h2 id="new-job-heading" className="text-base font-semibold">
        New job
      </h2>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Customer" autoComplete="off" error={errors.customer?.message} {...form.register('customer')} />
        <TextField
          label="Customer e-mail"
          type="email"
          autoComplete="off"
          hint="Where the report goes; optional"
          error={errors.customerEmail?.message}
          {...form.register('customerEmail')}
        />
        <TextField
          label="Instrument"
          autoComplete="off"
          hint="e.g. solid-body, two humbuckers, 3-way switch"
          error={errors.instrument?.message}
          {...form.register('instrument')}
        />
        <SelectField
          label="Harness design"
          hint={harnesses.isError ? harnesses.error.message : 'Designs from the Harness screen'}
          error={errors.harnessId?.message}
          {...form.register('harnessId')}
        >
          <option value="">None yet</option>
          {harnesses.data?.harnesses.map((h) => (
            <option key={h.id} value={h.id}>
              {h.name}
            </option>
          ))}
        </SelectField>
        <TextAreaField label="Notes" className="sm:col-span-2" rows={3} error={errors.notes?.message} {...form.register('notes')} />
      </div>
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" busy={create.isPending} busyText="Saving…">
          Create job
        </Button>
        <Button onClick={onClose}>Cancel</Button>
      </div>
    </form>
  );
}
