// Fits: the current fit of each sweep with its parameters, quality figures, flags and the engine
// version that made it; earlier (superseded) fits stay below as history.
import type { ReactNode } from 'react';
import type { CoilFit } from '@shared/analysis/coil';
import type { TaperFit } from '@shared/analysis/taper';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { Alert, Loading } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import type { PartDetail } from '../api/get-part';
import { useFits, useRefitSweep, useSweeps, type FitRow } from '../api/sweeps';


const pct = (x: number, digits = 1) => `${x.toFixed(digits)} %`;
const withErr = (v: number, se: number | null | undefined, unit: string) => (
  <>
    {formatValue(v, unit, { digits: 4 })}
    {se != null && Number.isFinite(se) && <span className="text-ink-soft"> ± {formatValue(se, unit, { digits: 2 })}</span>}
  </>
);

function Row({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex items-baseline justify-between gap-4 border-b border-paper-edge/60 py-1.5 last:border-0">
      <dt className="text-sm text-ink-soft">{term}</dt>
      <dd className="num text-right text-sm">{children}</dd>
    </div>
  );
}

function TaperFacts({ r }: { r: TaperFit }) {
  const totalWord = { measured: 'measured end to end', 'last-reading': 'last sweep reading', 'last-reading-plus-end': 'last reading + wiper to lug 3' }[r.totalSource];
  return (
    <dl>
      <Row term="Law">{<span className="font-sans">{TAPER_LAW_LABEL[r.law]}</span>}</Row>
      <Row term="Mid-rotation m">{pct(r.m * 100)}</Row>
      <Row term="R²">{r.r2.toFixed(5)}</Row>
      <Row term="Deviation RMS / max">{`${pct(r.rmsPct, 2)} / ${pct(r.maxPct, 2)}`}</Row>
      <Row term={`Total R13 (${totalWord})`}>
        {formatValue(r.total, 'Ω', { digits: 4 })}
        {r.totalDeviationPct != null && <span className="text-ink-soft"> ({r.totalDeviationPct >= 0 ? '+' : ''}{r.totalDeviationPct.toFixed(1)} % from nominal)</span>}
      </Row>
      <Row term="End resistance start / end">{`${formatValue(r.endResistance.start, 'Ω')} / ${r.endResistance.end != null ? formatValue(r.endResistance.end, 'Ω') : '—'}`}</Row>
      <Row term="Half-sum mismatch">{r.halfSumMismatch != null ? formatValue(r.halfSumMismatch, 'Ω') : '—'}</Row>
      <Row term="Monotonic breaks">{r.monotonicBreaks.length === 0 ? 'none' : r.monotonicBreaks.map((b) => `${b.rotation.toFixed(0)} %`).join(', ')}</Row>
    </dl>
  );
}

function CoilFacts({ r }: { r: CoilFit }) {
  return (
    <dl>
      <Row term="DC resistance R">{withErr(r.R, r.stderr.R, 'Ω')}</Row>
      <Row term="Inductance L">{withErr(r.L, r.stderr.L, 'H')}</Row>
      <Row term="Self-capacitance C">{withErr(r.C, r.stderr.C, 'F')}</Row>
      <Row term="Loss resistance Rp">{r.Rp != null ? withErr(r.Rp, r.stderr.Rp, 'Ω') : 'not needed'}</Row>
      <Row term="Resonance f0 (unloaded)">{formatValue(r.f0, 'Hz', { digits: 4 })}</Row>
      <Row term="Q">{r.Q.toFixed(2)}</Row>
      <Row term="Peak |Z|">{`${formatValue(r.peakMagnitude, 'Ω')} at ${formatValue(r.peakFrequency, 'Hz')}`}</Row>
      <Row term="RMS ln|Z| / phase">{`${r.rmsLogMag.toFixed(4)} Np / ${r.rmsPhaseDeg.toFixed(2)}°`}</Row>
      <Row term="Converged">{<span className="font-sans">{r.converged ? `yes, ${r.iterations} iterations` : 'no'}</span>}</Row>
    </dl>
  );
}

export function FitFlags({ fit }: { fit: FitRow }) {
  const flags = fit.result.flags;
  if (flags.length === 0) return <Badge tone="pass" icon="check" label="No flags" />;
  return (
    <ul className="space-y-1.5">
      {flags.map((f) => (
        <li key={f.code} className="flex flex-wrap items-start gap-2 text-sm">
          <Badge tone="fail" icon="flag" label={f.code.replace(/-/g, ' ')} />
          <span>{f.message}</span>
        </li>
      ))}
    </ul>
  );
}

const summary = (f: FitRow) =>
  f.kind === 'taper'
    ? `${TAPER_LAW_LABEL[f.result.law]}, m ${pct(f.result.m * 100)}, R² ${f.result.r2.toFixed(4)}`
    : `R ${formatValue(f.result.R, 'Ω')}, L ${formatValue(f.result.L, 'H')}, C ${formatValue(f.result.C, 'F')}, f0 ${formatValue(f.result.f0, 'Hz')}`;

export function PartFits({ part }: { part: PartDetail }) {
  const canWrite = useCan('write');
  const sweeps = useSweeps(part.id);
  const fits = useFits(part.id);
  const refit = useRefitSweep();

  if (sweeps.isPending || fits.isPending) return <Loading what="Loading fits" />;
  if (sweeps.isError || fits.isError) return <Alert>{(sweeps.error ?? fits.error)?.message}</Alert>;
  const current = sweeps.data.sweeps.filter((s) => s.fit);
  const older = fits.data.fits.filter((f) => f.supersededAt != null);
  if (current.length === 0 && older.length === 0) return <p className="text-sm text-ink-soft">No fits yet: upload a sweep and it is fitted at once.</p>;

  return (
    <div className="space-y-5">
      {refit.isError && <Alert>{refit.error.message}</Alert>}
      {current.map((s) => {
        const fit = s.fit!;
        return (
          <article key={fit.id} aria-labelledby={`fit-${fit.id}`} className="rounded-md border border-paper-edge p-3 sm:p-4">
            <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <h3 id={`fit-${fit.id}`} className="text-sm font-semibold">
                {fit.kind === 'taper' ? 'Taper fit' : 'Coil fit'} of sweep #{s.id}
              </h3>
              {canWrite && s.id && (
                <Button size="sm" onClick={() => refit.mutate({ partId: part.id, sweepId: s.id })} busy={refit.isPending && refit.variables?.sweepId === s.id} busyText="Fitting…">
                  Fit again
                </Button>
              )}
            </header>
            <div className="space-y-3">
              <FitFlags fit={fit} />
              {fit.kind === 'taper' ? <TaperFacts r={fit.result} /> : <CoilFacts r={fit.result} />}
              <p className="text-xs text-ink-soft">
                Engine <span className="font-mono">{fit.engineVersion}</span> · fitted {formatDateTime(fit.createdAt)}
              </p>
            </div>
          </article>
        );
      })}
      {older.length > 0 && (
        <details className="text-sm">
          <summary className="cursor-pointer font-medium text-accent">Earlier fits ({older.length})</summary>
          <ul className="mt-2 space-y-2">
            {older.map((f) => (
              <li key={f.id} className="border-l-2 border-paper-edge pl-3">
                <p>
                  <span className="font-medium">{f.kind === 'taper' ? 'Taper' : 'Coil'} fit of sweep #{f.sweepId}</span> — <span className="num">{summary(f)}</span>
                </p>
                <p className="text-xs text-ink-soft">
                  {f.result.flags.length === 0 ? 'no flags' : `${f.result.flags.length} flag(s): ${f.result.flags.map((x) => x.code).join(', ')}`} · engine{' '}
                  <span className="font-mono">{f.engineVersion}</span> · made {formatDateTime(f.createdAt)} · replaced {formatDateTime(f.supersededAt)}
                </p>
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
