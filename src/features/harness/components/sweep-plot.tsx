// A figure against the volume knob (0–10): the volume taper or the treble retention. A thin
// vertical line marks the current volume; it is drawn from a ref so that moving the knob only
// redraws the chart instead of rebuilding it.
import { useEffect, useMemo, useRef } from 'react';
import type uPlot from 'uplot';
import { Plot, axis } from '@/components/charts/plot';

export interface SweepSeries {
  label: string;
  values: ArrayLike<number>;
  colour: string;
  width?: number;
  dash?: number[];
}

export function SweepPlot({
  volumes,
  series,
  yLabel,
  range,
  marker,
  label,
  height = 240,
}: {
  volumes: readonly number[];
  series: SweepSeries[];
  yLabel: string;
  range: (u: uPlot, min: number | null, max: number | null) => uPlot.Range.MinMax;
  marker: number;
  label: string;
  height?: number;
}) {
  const markerRef = useRef(marker);
  const plotRef = useRef<uPlot | null>(null);
  // The marker moves with the volume knob while the curves (which depend on the tone) stay put.
  useEffect(() => {
    markerRef.current = marker;
    plotRef.current?.redraw(false, false);
  }, [marker]);
  const key = series.map((s) => `${s.label}:${s.colour}:${s.dash?.join(',') ?? ''}`).join('|');
  const options = useMemo(
    () => ({
      height,
      scales: { x: { time: false, range: [0, 10] as uPlot.Range.MinMax }, y: { range } },
      axes: [
        axis('Volume knob (0–10)', { values: (_u: uPlot, splits: number[]) => splits.map((v) => (Number.isInteger(v) ? String(v) : '')) }),
        axis(yLabel),
      ],
      cursor: { drag: { x: false, y: false } },
      legend: { live: false },
      series: [
        { label: 'Volume knob' },
        ...series.map((s) => ({ label: s.label, stroke: s.colour, width: s.width ?? 2, ...(s.dash ? { dash: s.dash } : {}) })),
      ],
      hooks: {
        draw: [
          (u: uPlot) => {
            const x = u.valToPos(markerRef.current, 'x', true);
            const { top, height: h } = u.bbox;
            const ctx = u.ctx;
            ctx.save();
            ctx.strokeStyle = '#857b70';
            ctx.setLineDash([4, 4]);
            ctx.lineWidth = 1;
            ctx.beginPath();
            ctx.moveTo(x, top);
            ctx.lineTo(x, top + h);
            ctx.stroke();
            ctx.restore();
          },
        ],
      },
    }),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- series enter through their key (label, colour, dash), so new numbers do not rebuild the chart
    [key, yLabel, range, height],
  );
  const data = useMemo(() => [volumes, ...series.map((s) => s.values)] as uPlot.AlignedData, [volumes, series]);
  return <Plot options={options} data={data} label={label} onReady={(u) => (plotRef.current = u)} />;
}

/** Volume taper: 0 dB at full volume down to about −50 dB near the stop; a fixed window. */
export const taperRange = (): uPlot.Range.MinMax => [-60, 5];

/** Treble retention: at least ±6 dB, wider when a bleed network lifts the treble further. */
export function trebleRange(_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax {
  const lo = min === null || !Number.isFinite(min) ? -6 : Math.min(-6, Math.floor(min - 1));
  const hi = max === null || !Number.isFinite(max) ? 6 : Math.max(6, Math.ceil(max + 1));
  return [Math.max(lo, -40), Math.min(hi, 40)];
}
