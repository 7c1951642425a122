// The plots of a sweep: measured points against the fitted model, with the residuals beneath.
// Taper: R1W/R13 against rotation with the profile's envelope; impedance: |Z| and phase against
// log frequency. Curves are drawn in the browser from the stored fit with the shared engine
// formulas (taperLawValue, coilImpedance), so the plot shows exactly the model that was fitted.
import { useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import type { AlignedData, Options } from 'uplot';
import { coilImpedance, type CoilFit } from '@shared/analysis/coil';
import type { TaperFit, TaperPoint } from '@shared/analysis/taper';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { Plot, SERIES_COLOURS, axis, downloadPng, frequencyX } from '@/components/charts/plot';
import { Button } from '@/components/ui/button';
import type { Condition } from '@shared/csv/conditions';

const pointsOnly = (stroke: string, label: string, size = 6): uPlot.Series => ({
  label,
  stroke,
  fill: stroke,
  width: 0,
  paths: () => null,
  points: { show: true, size, stroke, fill: stroke },
});

/** 10000 → "10k", 1e6 → "1M": tick labels of an ohm axis (the unit is in the axis name). */
const ohmTicks = (_u: uPlot, splits: (number | null)[]) =>
  // uPlot's log axis blanks the ticks it does not label (null).
  splits.map((v) =>
    v == null
      ? ''
      : v >= 1e6
        ? `${Number((v / 1e6).toPrecision(3))}M`
        : v >= 1e3
          ? `${Number((v / 1e3).toPrecision(3))}k`
          : String(Number(v.toPrecision(3))),
  );
const line = (stroke: string, label: string, dash?: number[]): uPlot.Series => ({
  label,
  stroke,
  width: 2,
  points: { show: false },
  ...(dash ? { dash } : {}),
});

function PlotFigure({
  title,
  name,
  options,
  data,
  label,
  conditions,
}: {
  title: string;
  name: string;
  options: PlotOptions;
  data: AlignedData;
  label: string;
  conditions: Condition[];
}) {
  const ref = useRef<uPlot | null>(null);
  return (
    <figure className="min-w-0">
      <figcaption className="mb-1 flex items-center justify-between gap-2 text-sm font-medium">
        {title}
        <Button size="sm" variant="quiet" onClick={() => ref.current && downloadPng(ref.current, name, { title, conditions })}>
          PNG
        </Button>
      </figcaption>
      <Plot options={options} data={data} label={label} onReady={(u) => (ref.current = u)} />
    </figure>
  );
}

type PlotOptions = Omit<Options, 'width' | 'height'> & { height?: number };

/** The law drawn for the profile's envelope: the profile's own, or the fitted law when it allows either audio law. */
function envelopeLaw(profileLaw: string | undefined, fitted: TaperLawKind): TaperLawKind | null {
  if (!profileLaw) return fitted;
  if (profileLaw === 'audio-any') return fitted === 'two-segment' ? 'two-segment' : 'audio';
  return profileLaw as TaperLawKind;
}

export function TaperPlots({
  points,
  fit,
  envelope,
  fileName,
  conditions,
}: {
  points: TaperPoint[];
  fit: TaperFit;
  envelope: { law?: string; mMin?: number; mMax?: number } | null;
  fileName: string;
  conditions: Condition[];
}) {
  const { main, residuals, mainOptions, residualOptions } = useMemo(() => {
    const measured = [...points].sort((a, b) => a.rotation - b.rotation);
    const grid = Array.from({ length: 101 }, (_, i) => i);
    const xs = [...new Set([...grid, ...measured.map((p) => p.rotation)])].sort((a, b) => a - b);
    const at = new Map(measured.map((p) => [p.rotation, p.resistance / fit.total]));
    const law = envelopeLaw(envelope?.law, fit.law);
    const showEnvelope = envelope?.mMin != null && envelope?.mMax != null && law !== null;
    const mainData: (number | null)[][] = [xs, xs.map((x) => at.get(x) ?? null), xs.map((x) => taperLawValue(fit.law, fit.m, x / 100))];
    const series: uPlot.Series[] = [
      { label: 'Rotation (%)' },
      pointsOnly(SERIES_COLOURS[0]!, 'Measured'),
      line(SERIES_COLOURS[1]!, `Fitted ${fit.law}, m ${(fit.m * 100).toFixed(1)} %`),
    ];
    if (showEnvelope) {
      mainData.push(
        xs.map((x) => taperLawValue(law, envelope.mMin!, x / 100)),
        xs.map((x) => taperLawValue(law, envelope.mMax!, x / 100)),
      );
      series.push(
        line(SERIES_COLOURS[2]!, `Profile, m ${(envelope.mMin! * 100).toFixed(0)} %`, [6, 4]),
        line(SERIES_COLOURS[2]!, `Profile, m ${(envelope.mMax! * 100).toFixed(0)} %`, [6, 4]),
      );
    }
    const mainOptions: PlotOptions = {
      height: 300,
      scales: { x: { time: false, range: [0, 100] }, y: { range: [0, 1.05] } },
      axes: [axis('Rotation (%)'), axis('R1W / R13 (fraction of total)', { size: 60 })],
      series,
      cursor: { drag: { x: false, y: false } },
    };
    const rx = measured.map((p) => p.rotation);
    const residualData: (number | null)[][] = [
      rx,
      measured.map((p) => (p.resistance / fit.total - taperLawValue(fit.law, fit.m, p.rotation / 100)) * 100),
      rx.map(() => 0),
    ];
    const residualOptions: PlotOptions = {
      height: 170,
      scales: { x: { time: false, range: [0, 100] } },
      axes: [axis('Rotation (%)'), axis('Residual (% of R13)', { size: 60 })],
      series: [{ label: 'Rotation (%)' }, pointsOnly(SERIES_COLOURS[0]!, 'Measured − fitted'), line(SERIES_COLOURS[7]!, 'Zero')],
      cursor: { drag: { x: false, y: false } },
    };
    return { main: mainData as AlignedData, residuals: residualData as AlignedData, mainOptions, residualOptions };
  }, [points, fit, envelope]);

  return (
    <div className="grid gap-4">
      <PlotFigure
        title="Taper: R1W / R13 against rotation"
        name={`${fileName}-taper`}
        options={mainOptions}
        data={main}
        conditions={conditions}
        label="Measured taper points, the fitted law and the profile's envelope, as a fraction of the total resistance against rotation in percent"
      />
      <PlotFigure
        title="Residuals"
        name={`${fileName}-taper-residuals`}
        options={residualOptions}
        data={residuals}
        conditions={conditions}
        label="Difference between measured and fitted taper, percent of total resistance, against rotation"
      />
    </div>
  );
}

const magnitude = (p: { re: number; im: number }) => Math.hypot(p.re, p.im);
const phaseDeg = (p: { re: number; im: number }) => (Math.atan2(p.im, p.re) * 180) / Math.PI;

export function ImpedancePlots({
  points,
  fit,
  fileName,
  conditions,
}: {
  points: { frequency: number; re: number; im: number }[];
  fit: CoilFit;
  fileName: string;
  conditions: Condition[];
}) {
  const plots = useMemo(() => {
    const measured = [...points].sort((a, b) => a.frequency - b.frequency);
    const f = measured.map((p) => p.frequency);
    const model = f.map((x) => coilImpedance({ R: fit.R, L: fit.L, C: fit.C, Rp: fit.Rp }, x));
    const common = { cursor: { drag: { x: false, y: false } } };
    // The frequency axis spans the sweep, not the surrounding decades.
    const xScale: uPlot.Scale = { ...frequencyX.scale, range: (_u, min, max) => [min, max] };
    const dot = measured.length > 60 ? 3.5 : 6;
    const magOptions: PlotOptions = {
      ...common,
      height: 280,
      scales: { x: xScale, y: { distr: 3, log: 10 } },
      axes: [frequencyX.axis, axis('|Z| (Ω)', { size: 60, values: ohmTicks })],
      series: [{ label: 'Frequency (Hz)' }, pointsOnly(SERIES_COLOURS[0]!, 'Measured |Z|', dot), line(SERIES_COLOURS[1]!, 'Fitted model')],
    };
    const phaseOptions: PlotOptions = {
      ...common,
      height: 220,
      scales: { x: xScale, y: { range: [-90, 90] } },
      axes: [frequencyX.axis, axis('Phase (°)', { size: 60 })],
      series: [
        { label: 'Frequency (Hz)' },
        pointsOnly(SERIES_COLOURS[0]!, 'Measured phase', dot),
        line(SERIES_COLOURS[1]!, 'Fitted model'),
      ],
    };
    const rf = fit.residuals.map((r) => r.frequency);
    const residualOptions: PlotOptions = {
      ...common,
      height: 190,
      scales: { x: xScale, y: { auto: true }, deg: { auto: true } },
      axes: [
        frequencyX.axis,
        axis('ln|Z| residual (Np)', {
          size: 60,
          space: 24,
          values: (_u, s) => s.map((v) => (v == null ? '' : String(Number(v.toPrecision(2))))),
        }),
        axis('Phase residual (°)', { side: 1, scale: 'deg', size: 60, grid: { show: false } }),
      ],
      series: [
        { label: 'Frequency (Hz)' },
        pointsOnly(SERIES_COLOURS[0]!, 'ln|Z| measured − fitted', dot),
        { ...pointsOnly(SERIES_COLOURS[3]!, 'Phase measured − fitted (°)', dot), scale: 'deg' },
      ],
    };
    return {
      mag: { options: magOptions, data: [f, measured.map(magnitude), model.map(magnitude)] as AlignedData },
      phase: { options: phaseOptions, data: [f, measured.map(phaseDeg), model.map(phaseDeg)] as AlignedData },
      residuals: {
        options: residualOptions,
        data: [rf, fit.residuals.map((r) => r.logMag), fit.residuals.map((r) => r.phaseDeg)] as AlignedData,
      },
    };
  }, [points, fit]);

  return (
    <div className="grid gap-4">
      <PlotFigure
        title="Impedance magnitude"
        name={`${fileName}-impedance`}
        {...plots.mag}
        conditions={conditions}
        label="Measured impedance magnitude and the fitted coil model, ohms on a log scale, against log frequency"
      />
      <PlotFigure
        title="Phase"
        name={`${fileName}-phase`}
        {...plots.phase}
        conditions={conditions}
        label="Measured phase and the fitted coil model, degrees, against log frequency"
      />
      <PlotFigure
        title="Residuals"
        name={`${fileName}-impedance-residuals`}
        {...plots.residuals}
        conditions={conditions}
        label="Residuals of the coil fit: ln|Z| in nepers and phase in degrees against log frequency"
      />
    </div>
  );
}
