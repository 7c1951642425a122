import { useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { Alert, Loading } from '@/components/ui/alert';
import { StatusBadge } from '@/components/ui/badge';
import { Button, buttonClass } from '@/components/ui/button';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/auth';
import { formatDateTime, formatNominal, formatTolerance } from '@/lib/format';
import { usePart } from '@/data/parts';
import type { PartDetail } from '@shared/schemas/parts';
import { EditPartForm, KIND_LABEL } from './part-form';
import { PartAttachments } from './part-attachments';
import { PartFits } from './part-fits';
import { PartJobs } from './part-jobs';
import { PartReadings } from './part-readings';
import { PartSweeps } from './part-sweeps';
import { RetirePartForm } from './retire-part-form';

type Mode = 'view' | 'edit' | 'retire';

function Fact({ term, children, numeric }: { term: string; children: ReactNode; numeric?: boolean }) {
  return (
    <div className="min-w-0">
      <dt className="text-xs font-medium uppercase tracking-wide text-ink-soft">{term}</dt>
      <dd className={`mt-0.5 break-words ${numeric ? 'num' : ''}`}>{children}</dd>
    </div>
  );
}

const none = <span className="text-ink-faint">—</span>;

function PartFacts({ part }: { part: PartDetail }) {
  return (
    <dl className="grid grid-cols-2 gap-x-6 gap-y-4 sm:grid-cols-3">
      <Fact term="Kind">{KIND_LABEL[part.kind]}</Fact>
      <Fact term="Nominal" numeric>
        {formatNominal(part.kind, part.nominal)}
      </Fact>
      <Fact term="Tolerance" numeric>
        {formatTolerance(part.tolerancePct, part.tolerancePlusPct)}
      </Fact>
      <Fact term="Marking">{part.marking ? <span className="font-mono">{part.marking}</span> : none}</Fact>
      {part.kind === 'pot' && <Fact term="Taper class">{part.taperClass ? TAPER_LAW_LABEL[part.taperClass] : none}</Fact>}
      <Fact term="Supplier">{part.supplier ?? none}</Fact>
      <Fact term="Lot">
        {part.lotId ? (
          <Link to={paths.app.lot.getHref(part.lotId)} className="text-accent underline underline-offset-2">
            Lot {part.lotCode ?? part.lotId}
            {part.lotItem ? `, item ${part.lotItem}` : ''}
          </Link>
        ) : (
          none
        )}
      </Fact>
      <Fact term="Tags">{part.tags ?? none}</Fact>
      <Fact term="Added">{formatDateTime(part.createdAt)}</Fact>
      {part.notes && (
        <div className="col-span-2 sm:col-span-3">
          <dt className="text-xs font-medium uppercase tracking-wide text-ink-soft">Notes</dt>
          <dd className="mt-0.5 whitespace-pre-wrap">{part.notes}</dd>
        </div>
      )}
    </dl>
  );
}

function StatusHistory({ part }: { part: PartDetail }) {
  const events = [...part.statusHistory].reverse();
  if (events.length === 0) return <p className="text-sm text-ink-soft">No status changes recorded.</p>;
  return (
    <ol className="space-y-3">
      {events.map((e) => (
        <li key={e.id} className="border-l-2 border-paper-edge pl-3">
          <div className="flex flex-wrap items-center gap-1.5 text-sm">
            {e.fromStatus ? (
              <>
                <StatusBadge status={e.fromStatus} />
                <span aria-label="became" className="text-ink-faint">
                  →
                </span>
              </>
            ) : null}
            <StatusBadge status={e.toStatus} />
          </div>
          <p className="mt-1 text-sm">{e.reason ?? <span className="text-ink-faint">No reason given</span>}</p>
          <p className="text-xs text-ink-soft">
            {e.userName ? `${e.userName} · ` : ''}
            <time dateTime={new Date(e.at).toISOString()}>{formatDateTime(e.at)}</time>
          </p>
        </li>
      ))}
    </ol>
  );
}

export function PartScreen({ id }: { id: number }) {
  const part = usePart(id);
  const canWrite = useCan('write');
  const [mode, setMode] = useState<Mode>('view');

  if (part.isPending) return <Loading what="Loading the part" />;
  if (part.isError) return <Alert>{part.error.message}</Alert>;
  const p = part.data;
  const retired = p.status === 'retired';

  return (
    <div>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link to={paths.app.parts.getHref()} className="text-accent underline-offset-2 hover:underline">
          Parts
        </Link>
        <span className="mx-1.5 text-ink-faint">/</span>
        <span aria-current="page">{p.label}</span>
      </nav>
      <PageHeader
        documentTitle={p.label}
        title={
          <span className="flex flex-wrap items-center gap-3">
            <span>{p.label}</span>
            <StatusBadge status={p.status} reason={p.statusReason} />
          </span>
        }
        description={
          <>
            {KIND_LABEL[p.kind]} · <span className="num">{formatNominal(p.kind, p.nominal)}</span>
            {p.statusReason && ` · ${p.statusReason}`}
          </>
        }
        actions={
          <>
            <a href={`/api/parts/${p.id}/label.svg`} target="_blank" rel="noreferrer" className={buttonClass('secondary')}>
              Printable label
            </a>
            {canWrite && mode === 'view' && (
              <>
                <Button onClick={() => setMode('edit')}>Edit</Button>
                {!retired && (
                  <Button variant="danger" onClick={() => setMode('retire')}>
                    Retire…
                  </Button>
                )}
              </>
            )}
          </>
        }
      />

      <div className="grid gap-6 lg:grid-cols-3">
        <div className="space-y-6 lg:col-span-2">
          <Panel id="part-fields" title={mode === 'edit' ? 'Edit part' : 'Part'}>
            {mode === 'edit' && canWrite ? <EditPartForm part={p} onDone={() => setMode('view')} /> : <PartFacts part={p} />}
          </Panel>
          {mode === 'retire' && canWrite && (
            <Panel id="part-retire" title="Retire this part" className="border-fail/40">
              <RetirePartForm part={p} onDone={() => setMode('view')} />
            </Panel>
          )}
          <Panel id="part-readings" title="Readings">
            <PartReadings part={p} />
          </Panel>
          <Panel id="part-sweeps" title="Sweeps">
            <PartSweeps part={p} />
          </Panel>
          <Panel id="part-fits" title="Fits">
            <PartFits part={p} />
          </Panel>
          <Panel id="part-attachments" title="Attachments">
            <PartAttachments partId={p.id} />
          </Panel>
        </div>
        <div className="space-y-6 self-start">
          <Panel id="part-jobs" title="Jobs">
            <PartJobs part={p} />
          </Panel>
          <Panel id="part-history" title="Status history">
            <StatusHistory part={p} />
          </Panel>
        </div>
      </div>
    </div>
  );
}
