import type { PartDetail } from '@shared/schemas/parts';
import { useProfiles } from '@/data/profiles';
import { chooseProfile } from '@shared/analysis/profile-match';
import { Alert, Loading } from '@/components/ui/alert';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import { attachmentFileHref } from '../api/attachments';
import { useSweeps, type Sweep } from '../api/sweeps';
import { ImpedancePlots, TaperPlots } from './sweep-plots';
import { SweepUploadForm } from './sweep-upload';
import type { Condition } from '@shared/csv/conditions';

function SweepBlock({ sweep, part }: { sweep: Sweep; part: PartDetail }) {
  const profiles = useProfiles();
  const profile = profiles.data ? chooseProfile(profiles.data.profiles, part) : null;
  const name = `${part.label}-sweep-${sweep.id}`;
  // What the plots show: this part's sweep as uploaded, the fit drawn, and the envelope's profile.
  const conditions: Condition[] = [
    { key: 'part', value: `${part.label} (${part.kind})` },
    { key: 'sweep', value: `#${sweep.id}, ${sweep.pointCount} points, uploaded ${formatDateTime(sweep.createdAt)}` },
    {
      key: 'columns read',
      value: sweep.columns
        ? Object.entries(sweep.columns)
            .map(([role, header]) => `${role} = ${header}`)
            .join('; ')
        : null,
    },
    { key: 'fit', value: sweep.fit ? `#${sweep.fit.id}` : null },
    ...(sweep.kind === 'taper' ? [{ key: 'profile envelope', value: profile ? profile.name : 'none' }] : []),
  ];
  return (
    <article aria-labelledby={`sweep-${sweep.id}-heading`} className="space-y-3 border-t border-paper-edge pt-4 first:border-0 first:pt-0">
      <header className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 id={`sweep-${sweep.id}-heading`} className="text-sm font-semibold">
          {sweep.kind === 'taper' ? 'Rotation sweep' : 'Impedance sweep'} <span className="font-normal text-ink-soft">#{sweep.id}</span>
        </h3>
        <p className="text-xs text-ink-soft">
          <span className="num">{sweep.pointCount}</span> points · {formatDateTime(sweep.createdAt)}
          {sweep.attachmentId && (
            <>
              {' · '}
              <a href={attachmentFileHref(sweep.attachmentId)} className="text-accent underline underline-offset-2">
                original file
              </a>
            </>
          )}
        </p>
      </header>
      {sweep.columns && (
        <p className="text-xs text-ink-soft">
          Columns read:{' '}
          {Object.entries(sweep.columns).map(([role, header]) => (
            <span key={role} className="mr-2">
              {role} ← <span className="font-mono text-ink">{header}</span>
            </span>
          ))}
        </p>
      )}
      {!sweep.fit ? (
        <p className="text-sm text-ink-soft">No current fit for this sweep.</p>
      ) : sweep.kind === 'taper' && sweep.fit.kind === 'taper' ? (
        <TaperPlots
          points={sweep.points}
          fit={sweep.fit.result}
          envelope={profile ? { law: profile.rules.law, mMin: profile.rules.mMin, mMax: profile.rules.mMax } : null}
          fileName={name}
          conditions={conditions}
        />
      ) : sweep.kind === 'impedance' && sweep.fit.kind === 'coil' ? (
        <ImpedancePlots points={sweep.points} fit={sweep.fit.result} fileName={name} conditions={conditions} />
      ) : null}
    </article>
  );
}

export function PartSweeps({ part }: { part: PartDetail }) {
  const canWrite = useCan('write');
  const sweeps = useSweeps(part.id);
  return (
    <div className="space-y-5">
      {canWrite && part.status !== 'retired' && <SweepUploadForm partId={part.id} partKind={part.kind} />}
      {sweeps.isPending ? (
        <Loading what="Loading sweeps" />
      ) : sweeps.isError ? (
        <Alert>{sweeps.error.message}</Alert>
      ) : sweeps.data.sweeps.length === 0 ? (
        <p className="text-sm text-ink-soft">
          No sweeps yet.
          {part.kind === 'pot'
            ? ' A rotation sweep gives the taper law and its mid-rotation value.'
            : part.kind === 'pickup'
              ? ' An impedance sweep gives the coil model and its resonance.'
              : ''}
        </p>
      ) : (
        <div className="space-y-6">
          <SweepBlock sweep={sweeps.data.sweeps[0]!} part={part} />
          {sweeps.data.sweeps.length > 1 && (
            <details className="border-t border-paper-edge pt-4">
              <summary className="cursor-pointer text-sm font-medium text-accent">Earlier sweeps ({sweeps.data.sweeps.length - 1})</summary>
              <div className="mt-4 space-y-6">
                {sweeps.data.sweeps.slice(1).map((s) => (
                  <SweepBlock key={s.id} sweep={s} part={part} />
                ))}
              </div>
            </details>
          )}
        </div>
      )}
    </div>
  );
}
