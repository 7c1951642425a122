// The customer report as the server writes it, and sending it by e-mail (in the demo it lands in
// the Outbox, which admins read). The preview is the server's composeReport for the address and
// note typed here: the very message a send would carry (Send waits until the preview is current).
import { zodResolver } from '@hookform/resolvers/zod';
import { useMemo, useState } from 'react';
import { useForm, type UseFormReturn } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { JobReportInputSchema } from '@shared/schemas/jobs';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextAreaField, TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { downloadText } from '@/lib/download';
import { applyServerError } from '@/lib/form';
import { useDebouncedValue } from '@/hooks/use-debounced-value';
import { useJobReport, type JobReportOptions } from '../api/get-job';
import { useSendJobReport } from '../api/send-job-report';
import type { JobDetail } from '../api/types';

const ReportFormFields = z.object({ to: z.string(), message: z.string() });
const ReportFormSchema = ReportFormFields.transform((v, ctx) => {
  const r = JobReportInputSchema.safeParse({ ...(v.to.trim() ? { to: v.to } : {}), ...(v.message.trim() ? { message: v.message } : {}) });
  if (!r.success) {
    for (const i of r.error.issues) ctx.addIssue({ code: 'custom', path: [String(i.path[0] ?? 'to')], message: i.message });
    return z.NEVER;
  }
  return r.data;
});

type ReportForm = z.input<typeof ReportFormFields>;

/** The options the preview is asked with: only what the send would carry (an address that is not one yet is left out). */
function previewOptions(v: ReportForm): JobReportOptions {
  const r = ReportFormSchema.safeParse(v);
  if (r.success) return r.data;
  const message = v.message.trim();
  return message ? { message } : {};
}

const formatSize = (bytes: number) =>
  bytes < 1024 ? `${bytes} B` : bytes < 1024 * 1024 ? `${(bytes / 1024).toFixed(1)} KiB` : `${(bytes / 1024 / 1024).toFixed(1)} MiB`;

function SendReportForm({
  job,
  form,
  current,
}: {
  job: JobDetail;
  form: UseFormReturn<ReportForm, unknown, z.output<typeof ReportFormSchema>>;
  /** Whether the preview beside the form shows what these fields would send. */
  current: boolean;
}) {
  const send = useSendJobReport();
  const isAdmin = useCan('admin');
  const [sentTo, setSentTo] = useState<string | null>(null);
  const { errors } = form.formState;
  const onSubmit = form.handleSubmit(async (input) => {
    setSentTo(null);
    try {
      const r = await send.mutateAsync({ id: job.id, input });
      setSentTo(r.to);
    } catch (err) {
      applyServerError(err, form.setError, ['to', 'message']);
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-3" aria-label="E-mail the report">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      {sentTo && (
        <Alert tone="success" title={`Sent to ${sentTo}`}>
          Without a mail server configured, it waits in the Outbox
          {isAdmin ? (
            <>
              {' '}
              (
              <Link to={paths.app.outbox.getHref()} className="underline">
                open the Outbox
              </Link>
              )
            </>
          ) : (
            ' (an admin reads it there)'
          )}
          .
        </Alert>
      )}
      <TextField
        label="To"
        type="email"
        autoComplete="off"
        placeholder={job.customerEmail ?? 'customer@example.com'}
        hint={job.customerEmail ? `Blank: the customer’s address, ${job.customerEmail}` : 'The job has no customer e-mail: give one.'}
        error={errors.to?.message}
        {...form.register('to')}
      />
      <TextAreaField
        label="A note from the shop (optional)"
        rows={2}
        hint="Goes above the parts list; the preview shows it in place"
        error={errors.message?.message}
        {...form.register('message')}
      />
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" variant="primary" busy={send.isPending} busyText="Sending…" disabled={!current}>
          E-mail the report
        </Button>
        {!current && (
          <span className="text-sm text-ink-soft" role="status">
            Updating the preview…
          </span>
        )}
      </div>
    </form>
  );
}

export function JobReportPanel({ job, canWrite }: { job: JobDetail; canWrite: boolean }) {
  const form = useForm<ReportForm, unknown, z.output<typeof ReportFormSchema>>({
    resolver: zodResolver(ReportFormSchema),
    defaultValues: { to: '', message: '' },
  });
  const to = form.watch('to');
  const message = form.watch('message');
  // Debounced as text: a new object on every render would restart the timer for ever.
  const wanted = JSON.stringify(previewOptions({ to, message }));
  const asked = useDebouncedValue(wanted, 400);
  const report = useJobReport(
    job.id,
    useMemo(() => JSON.parse(asked) as JobReportOptions, [asked]),
  );
  // The preview is what a send would carry only once it was asked with the fields as they are now.
  const current = asked === wanted && !report.isPlaceholderData && !report.isFetching;
  return (
    <div className={canWrite ? 'grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]' : undefined}>
      <div>
        <h3 className="mb-2 text-sm font-medium">Preview: the e-mail as it will be sent</h3>
        {report.isPending ? (
          <Loading what="Writing the report" />
        ) : report.isError ? (
          <Alert>{report.error.message}</Alert>
        ) : (
          <div aria-busy={!current} data-testid="report-preview">
            <dl className="mb-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-0.5 text-sm">
              <dt className="text-ink-soft">To</dt>
              <dd className="break-all">{report.data.to ?? 'no address yet: give one'}</dd>
              <dt className="text-ink-soft">Subject</dt>
              <dd>{report.data.subject}</dd>
            </dl>
            <pre className="num max-h-[40rem] overflow-auto rounded-md border border-paper-edge bg-paper p-3 text-xs leading-relaxed whitespace-pre-wrap">
              {report.data.text}
            </pre>
            <h4 className="mt-3 mb-1 text-sm font-medium">Attachments</h4>
            {report.data.attachments.length === 0 ? (
              <p className="text-sm text-ink-soft">None.</p>
            ) : (
              <ul className="space-y-1 text-sm">
                {report.data.attachments.map((a) => (
                  <li key={a.filename} className="flex flex-wrap items-center gap-2">
                    <span className="num break-all">{a.filename}</span>
                    <span className="text-ink-soft">
                      {a.contentType}, {formatSize(a.size)}
                    </span>
                    {a.contentType === 'text/csv' && report.data.csv && (
                      <Button size="sm" onClick={() => downloadText(report.data.csv!, a.filename, 'text/csv')}>
                        Download
                      </Button>
                    )}
                  </li>
                ))}
              </ul>
            )}
          </div>
        )}
      </div>
      {canWrite && (
        <div>
          <h3 className="mb-2 text-sm font-medium">Send</h3>
          <SendReportForm job={job} form={form} current={current} />
        </div>
      )}
    </div>
  );
}
