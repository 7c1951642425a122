// The customer report as the server writes it, and sending it by e-mail (in the demo it lands in
// the Outbox, which admins read).
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
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
import { useJobReport } from '../api/get-job';
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

function SendReportForm({ job }: { job: JobDetail }) {
  const send = useSendJobReport();
  const isAdmin = useCan('admin');
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm<z.input<typeof ReportFormFields>, unknown, z.output<typeof ReportFormSchema>>({
    resolver: zodResolver(ReportFormSchema),
    defaultValues: { to: '', message: '' },
  });
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
        hint="Goes above the parts list"
        error={errors.message?.message}
        {...form.register('message')}
      />
      <Button type="submit" variant="primary" busy={send.isPending} busyText="Sending…">
        E-mail the report
      </Button>
    </form>
  );
}

export function JobReportPanel({ job, canWrite }: { job: JobDetail; canWrite: boolean }) {
  const report = useJobReport(job.id);
  return (
    <div className={canWrite ? 'grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]' : undefined}>
      <div>
        <h3 className="mb-2 text-sm font-medium">Preview</h3>
        {report.isPending ? (
          <Loading what="Writing the report" />
        ) : report.isError ? (
          <Alert>{report.error.message}</Alert>
        ) : (
          <>
            <pre className="num max-h-96 overflow-auto rounded-md border border-paper-edge bg-paper p-3 text-xs leading-relaxed whitespace-pre-wrap">
              {report.data.text}
            </pre>
            {report.data.csv && (
              <Button
                size="sm"
                className="mt-2"
                onClick={() => downloadText(report.data.csv!, `${job.code}-predicted-curves.csv`, 'text/csv')}
              >
                Download the curves (CSV)
              </Button>
            )}
          </>
        )}
      </div>
      {canWrite && (
        <div>
          <h3 className="mb-2 text-sm font-medium">Send</h3>
          <SendReportForm job={job} />
        </div>
      )}
    </div>
  );
}
