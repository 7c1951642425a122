// A saved design's own page: what it is (layout, selector position, options, knobs, notes) and the
// Listen panel, with a slider per knob of its layout.
import { Link } from 'react-router-dom';
import { getLayout } from '@shared/circuit/layouts';
import { DesignListen } from '@/components/listen/design-listen';
import { Alert, Loading } from '@/components/ui/alert';
import { buttonClass } from '@/components/ui/button';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { formatDateTime } from '@/lib/format';
import { useHarness } from '../api/get-harness';

export function DesignPage({ id }: { id: number }) {
  const design = useHarness(id);
  if (design.isPending) return <Loading what="Loading the design" />;
  if (design.isError) return <Alert>{design.error.message}</Alert>;
  const d = design.data;
  const layout = getLayout(d.layout);
  const choice = (optionId: string) => {
    const o = layout?.options.find((x) => x.id === optionId);
    return o?.choices.find((c) => c.id === d.options[optionId])?.name ?? o?.choices[0]?.name ?? d.options[optionId];
  };
  return (
    <div>
      <PageHeader
        title={d.name}
        documentTitle={`Design ${d.name}`}
        description={`${layout?.name ?? d.layout}${layout && layout.selector.positions.length > 1 ? `, selector at ${layout.selector.positions[d.selector]?.name}` : ''} · saved ${formatDateTime(d.updatedAt ?? d.createdAt)}`}
        actions={
          <Link to={paths.app.harness.getHref()} className={buttonClass('secondary', 'sm')}>
            Harness
          </Link>
        }
      />
      <dl className="mb-6 grid grid-cols-2 gap-x-6 gap-y-3 rounded-lg border border-paper-edge bg-paper-bright p-4 sm:grid-cols-4">
        {layout?.options.map((o) => (
          <div key={o.id}>
            <dt className="text-xs text-ink-soft">{o.name}</dt>
            <dd className="text-sm">{choice(o.id)}</dd>
          </div>
        ))}
        <div>
          <dt className="text-xs text-ink-soft">Saved knobs</dt>
          <dd className="text-sm">
            {layout ? layout.knobs.map((k) => `${k.name.toLowerCase()} ${d.knobs?.[k.id] ?? 10}`).join(', ') : '—'}
          </dd>
        </div>
        {d.notes && (
          <div className="col-span-2 sm:col-span-4">
            <dt className="text-xs text-ink-soft">Notes</dt>
            <dd className="text-sm whitespace-pre-wrap">{d.notes}</dd>
          </div>
        )}
      </dl>
      <DesignListen panelId="design-listen" design={{ ...d, label: d.name }} />
      {!layout && <Panel title="Layout">Unknown layout {d.layout}.</Panel>}
    </div>
  );
}
