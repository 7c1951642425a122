import { Link } from 'react-router-dom';
import { JOB_STATUSES } from '@shared/schemas/jobs';
import { Alert, Loading } from '@/components/ui/alert';
import { StatusBadge } from '@/components/ui/badge';
import { Button, buttonClass } from '@/components/ui/button';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { formatDate, formatDateTime, formatNominal } from '@/lib/format';
import { useJob } from '../api/get-job';
import { useHarnesses } from '@/data/harnesses';
import { useRemovePart } from '../api/job-parts';
import { useUpdateJob } from '../api/save-job';
import type { JobDetail } from '../api/types';
import { InstallPartForm } from './job-install';
import { JobReportPanel } from './job-report';
import { JOB_STATUS_LOOK, JobStatusBadge } from './job-status-badge';

const KIND_WORD: Record<string, string> = { pot: 'Pot', capacitor: 'Capacitor', resistor: 'Resistor', pickup: 'Pickup', other: 'Other' };

function JobControls({ job }: { job: JobDetail }) {
  const update = useUpdateJob();
  const harnesses = useHarnesses();
  const sel = 'max-w-full rounded-md border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm';
  return (
    <div className="flex flex-wrap items-end gap-4">
      <label className="min-w-0 max-w-full text-sm">
        <span className="mb-1 block font-medium">Status</span>
        <select
          className={sel}
          value={job.status}
          disabled={update.isPending}
          onChange={(e) => update.mutate({ id: job.id, input: { status: e.target.value as JobDetail['status'] } })}
        >
          {JOB_STATUSES.map((s) => (
            <option key={s} value={s}>
              {JOB_STATUS_LOOK[s].label}
            </option>
          ))}
        </select>
      </label>
      <label className="min-w-0 max-w-full text-sm">
        <span className="mb-1 block font-medium">Harness design</span>
        <select
          className={sel}
          value={job.harnessId ?? ''}
          disabled={update.isPending || harnesses.isPending}
          onChange={(e) => update.mutate({ id: job.id, input: { harnessId: e.target.value === '' ? null : Number(e.target.value) } })}
        >
          <option value="">None</option>
          {job.harnessId && !harnesses.data?.harnesses.some((h) => h.id === job.harnessId) && (
            <option value={job.harnessId}>{job.harnessName ?? `Design ${job.harnessId}`}</option>
          )}
          {harnesses.data?.harnesses.map((h) => (
            <option key={h.id} value={h.id}>
              {h.name}
            </option>
          ))}
        </select>
      </label>
      {update.isPending && <span className="pb-2 text-sm text-ink-soft">Saving…</span>}
      {update.isError && <Alert>{update.error.message}</Alert>}
    </div>
  );
}

function InstalledParts({ job, canWrite }: { job: JobDetail; canWrite: boolean }) {
  const remove = useRemovePart();
  if (job.parts.length === 0) return <p className="text-sm text-ink-soft">No parts recorded yet.</p>;
  const th = 'border-b border-paper-edge px-3 py-2 font-medium';
  return (
    <div className="overflow-x-auto">
      {remove.isError && <Alert>{remove.error.message}</Alert>}
      <table className="table-list w-full min-w-[640px] border-collapse text-sm">
        <caption className="sr-only">Parts installed in {job.code}</caption>
        <thead className="bg-paper-deep text-left text-ink-soft">
          <tr>
            <th scope="col" className={th}>
              Position
            </th>
            <th scope="col" className={th}>
              Part
            </th>
            <th scope="col" className={th}>
              Kind
            </th>
            <th scope="col" className={`${th} text-right`}>
              Nominal
            </th>
            <th scope="col" className={th}>
              Status
            </th>
            <th scope="col" className={th}>
              Installed
            </th>
            {canWrite && (
              <th scope="col" className={th}>
                <span className="sr-only">Action</span>
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {job.parts.map((p) => (
            <tr key={p.partId} className="border-b border-paper-edge/70 last:border-b-0">
              <td data-label="Position" className="px-3 py-2 font-medium">
                {p.position}
              </td>
              <td data-label="Part" className="px-3 py-2">
                <Link
                  to={paths.app.part.getHref(p.partId)}
                  className="num whitespace-nowrap text-accent underline-offset-2 hover:underline"
                >
                  {p.label}
                </Link>
              </td>
              <td data-label="Kind" className="px-3 py-2">
                {KIND_WORD[p.kind] ?? p.kind}
              </td>
              <td data-label="Nominal" className="num px-3 py-2 text-right whitespace-nowrap">
                {formatNominal(p.kind, p.nominal)}
              </td>
              <td data-label="Status" className="px-3 py-2">
                <StatusBadge status={p.status} />
                {p.overrideReason && <p className="mt-1 text-xs text-marginal">Installed over its status: {p.overrideReason}</p>}
              </td>
              <td data-label="Installed" className="px-3 py-2 whitespace-nowrap">
                {formatDateTime(p.installedAt)}
              </td>
              {canWrite && (
                <td className="px-3 py-1 text-right">
                  <Button
                    size="sm"
                    variant="danger"
                    disabled={remove.isPending}
                    aria-label={`Remove ${p.label} from ${job.code}`}
                    onClick={() => {
                      if (window.confirm(`Remove ${p.label} (${p.position}) from ${job.code}? It goes back to the bench as incoming.`))
                        remove.mutate({ id: job.id, partId: p.partId });
                    }}
                  >
                    Remove
                  </Button>
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function JobScreen({ id }: { id: number }) {
  const canWrite = useCan('write');
  const job = useJob(id);
  if (job.isPending) return <Loading what="Loading the job" />;
  if (job.isError) return <Alert>{job.error.message}</Alert>;
  const j = job.data;
  return (
    <div>
      <PageHeader
        title={
          <span className="flex flex-wrap items-center gap-3">
            <span>
              Job <span className="num">{j.code}</span>
            </span>
            <JobStatusBadge status={j.status} />
          </span>
        }
        documentTitle={`Job ${j.code}`}
        description={`${j.customer} · ${j.instrument}`}
        actions={
          <Link to={paths.app.jobs.getHref()} className={buttonClass('secondary', 'sm')}>
            All jobs
          </Link>
        }
      />
      <dl className="mb-6 grid grid-cols-2 gap-x-6 gap-y-3 rounded-lg border border-paper-edge bg-paper-bright p-4 sm:grid-cols-4">
        <div>
          <dt className="text-xs text-ink-soft">Customer</dt>
          <dd className="text-sm">{j.customer}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-soft">E-mail</dt>
          <dd className="text-sm break-all">{j.customerEmail ?? '—'}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-soft">Harness design</dt>
          <dd className="text-sm">
            {j.harnessId ? (
              <Link to={paths.app.harness.getHref()} className="text-accent underline-offset-2 hover:underline">
                {j.harnessName ?? `Design ${j.harnessId}`}
              </Link>
            ) : (
              'none'
            )}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-soft">Opened</dt>
          <dd className="text-sm">{formatDate(j.createdAt)}</dd>
        </div>
        {j.notes && (
          <div className="col-span-2 sm:col-span-4">
            <dt className="text-xs text-ink-soft">Notes</dt>
            <dd className="text-sm whitespace-pre-wrap">{j.notes}</dd>
          </div>
        )}
      </dl>
      <div className="space-y-6">
        {canWrite && (
          <Panel title="Status and wiring" id="job-controls">
            <JobControls job={j} />
          </Panel>
        )}
        <Panel title={`Installed parts (${j.parts.length})`} id="job-parts">
          <InstalledParts job={j} canWrite={canWrite} />
          {canWrite && (
            <div className="mt-4 border-t border-paper-edge pt-4">
              <h3 className="mb-2 text-sm font-semibold">Install a part</h3>
              <InstallPartForm jobId={j.id} />
            </div>
          )}
        </Panel>
        <Panel title="Customer report" id="job-report">
          <JobReportPanel job={j} canWrite={canWrite} />
        </Panel>
      </div>
    </div>
  );
}
