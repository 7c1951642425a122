import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { formatDate } from '@/lib/format';
import { useJobs } from '@/data/jobs';
import { CreateJobForm } from './job-form';
import { JobStatusBadge } from './job-status-badge';

export function JobsScreen() {
  const canWrite = useCan('write');
  const jobs = useJobs();
  const [creating, setCreating] = useState(false);
  const rows = jobs.data?.jobs ?? [];
  const th = 'border-b border-paper-edge px-3 py-2 font-medium';
  return (
    <div>
      <PageHeader
        title="Jobs"
        description="Work on customers’ instruments: the parts installed where, the wiring design, and the report for the customer."
        actions={
          canWrite && !creating ? (
            <Button variant="primary" onClick={() => setCreating(true)} aria-expanded={creating} aria-controls="new-job-panel">
              New job
            </Button>
          ) : null
        }
      />
      {canWrite && creating && (
        <div id="new-job-panel" className="mb-6 rounded-lg border border-accent/30 bg-paper-bright p-4 sm:p-5">
          <CreateJobForm onClose={() => setCreating(false)} />
        </div>
      )}
      {jobs.isPending ? (
        <Loading what="Loading jobs" />
      ) : jobs.isError ? (
        <Alert>{jobs.error.message}</Alert>
      ) : rows.length === 0 ? (
        <p className="rounded-lg border border-dashed border-paper-edge bg-paper-bright p-6 text-sm text-ink-soft">
          {canWrite ? 'No jobs yet. Use “New job” when an instrument comes in.' : 'No jobs yet.'}
        </p>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-paper-edge bg-paper-bright">
          <table className="table-list w-full min-w-[720px] border-collapse text-sm">
            <caption className="sr-only">Jobs, newest first</caption>
            <thead className="bg-paper-deep text-left text-ink-soft">
              <tr>
                <th scope="col" className={th}>
                  Job
                </th>
                <th scope="col" className={th}>
                  Customer
                </th>
                <th scope="col" className={th}>
                  Instrument
                </th>
                <th scope="col" className={th}>
                  Status
                </th>
                <th scope="col" className={`${th} text-right`}>
                  Parts
                </th>
                <th scope="col" className={th}>
                  Opened
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((j) => (
                <tr key={j.id} className="border-b border-paper-edge/70 last:border-b-0 hover:bg-paper">
                  <td className="px-3 py-2">
                    <Link to={paths.app.job.getHref(j.id)} className="num font-medium text-accent underline-offset-2 hover:underline">
                      {j.code}
                    </Link>
                  </td>
                  <td data-label="Customer" className="px-3 py-2">
                    {j.customer}
                  </td>
                  <td data-label="Instrument" className="px-3 py-2">
                    {j.instrument}
                  </td>
                  <td data-label="Status" className="px-3 py-2">
                    <JobStatusBadge status={j.status} />
                  </td>
                  <td data-label="Parts" className="num px-3 py-2 text-right">
                    {j.partCount}
                  </td>
                  <td data-label="Opened" className="px-3 py-2 whitespace-nowrap">
                    {formatDate(j.createdAt)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
