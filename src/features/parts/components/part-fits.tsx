// Fits: the current fit of each sweep with its parameters, quality figures, flags and the engine
// version that made it; earlier (superseded) fits stay below as history.
import { useMemo, useState, type ReactNode } from 'react';
import { DEFAULT_CABLE, LOAD_IDS, LOADS, loadedResponse, type LoadId } from '@shared/circuit/loads';
import type { CoilFit } from '@shared/analysis/coil';
import type { TaperFit } from '@shared/analysis/taper';
import type { Fit, RefitInput } from '@shared/schemas/sweeps';
import { TAPER_LAW_LABEL } from '@shared/taper/law';
import { formatValue } from '@shared/units/format';
import { Alert, Loading } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { useCan } from '@/lib/auth';
import { formatDateTime } from '@/lib/format';
import type { PartDetail } from '@shared/schemas/parts';
import { useFits } from '@/data/parts';
import { useRefitSweep, useSweeps } from '../api/sweeps';

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
  const totalWord = {
    'sweep-r13': 'R13 column of the sweep',
    'sweep-halves': 'lug 1 to wiper + wiper to lug 3',
    'sweep-full-rotation': 'reading at full rotation',
    'bench-reading': 'bench reading: the sweep gives none',
  }[r.totalSource];
  return (
    <dl>
      <Row term="Law">{<span className="font-sans">{TAPER_LAW_LABEL[r.law]}</span>}</Row>
      <Row term="Mid-rotation m">{pct(r.m * 100)}</Row>
      <Row term="R²">{r.r2.toFixed(5)}</Row>
      <Row term="Deviation RMS / max">{`${pct(r.rmsPct, 2)} / ${pct(r.maxPct, 2)}`}</Row>
      <Row term={`Total R13 (${totalWord})`}>
        {formatValue(r.total, 'Ω', { digits: 4 })}
        {r.totalDeviationPct != null && (
          <span className="text-ink-soft">
            {' '}
            ({r.totalDeviationPct >= 0 ? '+' : ''}
            {r.totalDeviationPct.toFixed(1)} % from nominal)
          </span>
        )}
      </Row>
      <Row term="End resistance start / end">{`${formatValue(r.endResistance.start, 'Ω')} / ${r.endResistance.end != null ? formatValue(r.endResistance.end, 'Ω') : 'not measured'}`}</Row>
      <Row term="Half-sum mismatch">{r.halfSumMismatch != null ? formatValue(r.halfSumMismatch, 'Ω') : 'not measured'}</Row>
      <Row term="Monotonic breaks">
        {r.monotonicBreaks.length === 0 ? 'none' : r.monotonicBreaks.map((b) => `${b.rotation.toFixed(0)} %`).join(', ')}
      </Row>
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

/** "Fit again" with the same choices the fit takes: the coil's loss resistance, or a forced taper law. */
function FitAgain({ kind, busy, onFit }: { kind: 'taper' | 'coil'; busy: boolean; onFit: (choices: RefitInput) => void }) {
  const [choice, setChoice] = useState('');
  const choices = (): RefitInput =>
    kind === 'taper'
      ? choice === ''
        ? {}
        : { law: choice as NonNullable<RefitInput['law']> }
      : { withRp: choice === 'on' ? true : choice === 'off' ? false : 'auto' };
  return (
    <div className="flex items-center gap-2">
      <select
        aria-label={kind === 'taper' ? 'Law to fit' : 'Loss resistance'}
        className="rounded border border-paper-edge bg-paper px-2 py-1 text-sm"
        value={choice}
        onChange={(e) => setChoice(e.target.value)}
      >
        {kind === 'taper' ? (
          <>
            <option value="">Best law (F test)</option>
            <option value="linear">Force linear</option>
            <option value="audio">Force audio</option>
            <option value="reverse">Force reverse audio</option>
            <option value="two-segment">Force two-segment</option>
          </>
        ) : (
          <>
            <option value="">Loss resistance: auto</option>
            <option value="on">Loss resistance: on</option>
            <option value="off">Loss resistance: off</option>
          </>
        )}
      </select>
      <Button size="sm" onClick={() => onFit(choices())} busy={busy} busyText="Fitting…">
        Fit again
      </Button>
    </div>
  );
}

/** The loaded resonance: the fitted coil with volume and tone at 10 (500 kΩ each), a cable and a load. */
function LoadedResonance({ r }: { r: CoilFit }) {
  const [load, setLoad] = useState<LoadId>('amplifier-input');
  const [lengthText, setLengthText] = useState(String(DEFAULT_CABLE.lengthM));
  const [pfText, setPfText] = useState(String(DEFAULT_CABLE.capPerMetre * 1e12));
  const lengthM = Number(lengthText);
  const pf = Number(pfText);
  const valid = Number.isFinite(lengthM) && lengthM >= 0 && lengthM <= 100 && Number.isFinite(pf) && pf >= 0 && pf <= 1000;
  const m = useMemo(
    () =>
      valid
        ? loadedResponse({ R: r.R, L: r.L, C: r.C, Rp: r.Rp }, { load: LOADS[load], cable: { lengthM, capPerMetre: pf * 1e-12 } })
        : null,
    [valid, r.R, r.L, r.C, r.Rp, load, lengthM, pf],
  );
  return (
    <div className="mt-3 space-y-2 border-t border-paper-edge pt-3">
      <h4 className="text-sm font-semibold">Loaded: volume and tone at 10 (500 kΩ each)</h4>
      <div className="grid gap-2 sm:grid-cols-3">
        <label className="text-xs text-ink-soft">
          Load
          <select
            className="mt-0.5 block w-full rounded border border-paper-edge bg-paper px-2 py-1 text-sm text-ink"
            value={load}
            onChange={(e) => setLoad(e.target.value as LoadId)}
          >
            {LOAD_IDS.map((id) => (
              <option key={id} value={id}>
                {LOADS[id].name}
              </option>
            ))}
          </select>
        </label>
        <label className="text-xs text-ink-soft">
          Cable length (m)
          <input
            className="num mt-0.5 block w-full rounded border border-paper-edge bg-paper px-2 py-1 text-sm text-ink"
            inputMode="decimal"
            value={lengthText}
            onChange={(e) => setLengthText(e.target.value)}
          />
        </label>
        <label className="text-xs text-ink-soft">
          Cable pF per metre
          <input
            className="num mt-0.5 block w-full rounded border border-paper-edge bg-paper px-2 py-1 text-sm text-ink"
            inputMode="decimal"
            value={pfText}
            onChange={(e) => setPfText(e.target.value)}
          />
        </label>
      </div>
      {!valid ? (
        <p className="text-sm text-fail">Cable length 0–100 m and 0–1000 pF per metre.</p>
      ) : (
        m && (
          <dl>
            <Row term="Loaded resonance">
              {m.noSignal
                ? 'no signal'
                : m.peak.interior
                  ? formatValue(m.peak.frequency, 'Hz', { digits: 3 })
                  : 'no peak in 20 Hz – 20 kHz'}
            </Row>
            <Row term="Peak above the bass">{m.peak.interior ? `${m.peakRiseDb.toFixed(1)} dB` : '—'}</Row>
            <Row term="−3 dB corner">{m.cornerHz != null ? formatValue(m.cornerHz, 'Hz', { digits: 3 }) : 'none in range'}</Row>
          </dl>
        )
      )}
    </div>
  );
}

export function FitFlags({ fit }: { fit: Fit }) {
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

const summary = (f: Fit) =>
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
  if (current.length === 0 && older.length === 0)
    return <p className="text-sm text-ink-soft">No fits yet: upload a sweep and it is fitted at once.</p>;

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
                <FitAgain
                  kind={fit.kind}
                  busy={refit.isPending && refit.variables?.sweepId === s.id}
                  onFit={(choices) => refit.mutate({ partId: part.id, sweepId: s.id, choices })}
                />
              )}
            </header>
            <div className="space-y-3">
              {refit.isSuccess && refit.variables?.sweepId === s.id && (
                <p role="status" className="text-sm text-ink-soft">
                  Fitted again:{' '}
                  {refit.data.fit.kind === 'taper'
                    ? `${TAPER_LAW_LABEL[refit.data.fit.result.law]}, m ${pct(refit.data.fit.result.m * 100)}`
                    : `R ${formatValue(refit.data.fit.result.R, 'Ω')}, L ${formatValue(refit.data.fit.result.L, 'H')}, loss resistance ${refit.data.fit.result.Rp != null ? formatValue(refit.data.fit.result.Rp, 'Ω') : 'not used'}`}
                  ; the earlier fit is kept below.
                </p>
              )}
              <FitFlags fit={fit} />
              {fit.kind === 'taper' ? (
                <TaperFacts r={fit.result} />
              ) : (
                <>
                  <CoilFacts r={fit.result} />
                  <LoadedResonance r={fit.result} />
                </>
              )}
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
                  <span className="font-medium">
                    {f.kind === 'taper' ? 'Taper' : 'Coil'} fit of sweep #{f.sweepId}
                  </span>{' '}
                  — <span className="num">{summary(f)}</span>
                </p>
                <p className="text-xs text-ink-soft">
                  {f.result.flags.length === 0
                    ? 'no flags'
                    : `${f.result.flags.length} flag(s): ${f.result.flags.map((x) => x.code).join(', ')}`}{' '}
                  · engine <span className="font-mono">{f.engineVersion}</span> · made {formatDateTime(f.createdAt)} · replaced{' '}
                  {formatDateTime(f.supersededAt)}
                </p>
              </li>
            ))}
          </ul>
        </details>
      )}
    </div>
  );
}
