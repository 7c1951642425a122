// The main plot: transfer in dB against log frequency, the current setting bold and a family of
// lighter curves at other knob positions. Options (series, colours) change only with the family
// mode, so while a knob is dragged the chart keeps its instance and only receives new data.
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { Plot, SERIES_COLOURS, axis, frequencyX } from '@/components/charts/plot';

export interface Curve {
  label: string;
  db: ArrayLike<number>;
}

/** Family curves get the series colours after the first, lighter than the bold current curve. */
export const FAMILY_COLOURS = [SERIES_COLOURS[2], SERIES_COLOURS[3], SERIES_COLOURS[5], SERIES_COLOURS[6], SERIES_COLOURS[7]].map(
  (c) => `${c}99`,
);

/** The engine's axis, 20 Hz – 20 kHz; without a fixed range a log scale widens to whole decades. */
export const FREQUENCY_RANGE: uPlot.Range.MinMax = [20, 20000];

/** Design A of an A/B comparison, everywhere on the screen: orange, dashed. */
export const A_COLOUR = SERIES_COLOURS[1]!;
export const A_DASH = [8, 5];

/** dB range in steps of 10 below and 5 above, so small changes of the curves do not move the axis. */
export function dbRange(_u: uPlot, min: number | null, max: number | null): uPlot.Range.MinMax {
  const lo = min === null || !Number.isFinite(min) ? -40 : Math.max(-80, Math.min(-30, Math.floor((min - 2) / 10) * 10));
  const hi = max === null || !Number.isFinite(max) ? 10 : Math.max(10, Math.ceil((max + 2) / 5) * 5);
  return [lo, hi];
}

export function ResponsePlot({
  frequencies,
  current,
  family,
  pinned,
  label,
  onReady,
  height = 340,
}: {
  frequencies: ArrayLike<number>;
  current: Curve;
  family: Curve[];
  /** Design A when one is pinned, dashed. */
  pinned?: Curve | null;
  label: string;
  onReady?: (u: uPlot | null) => void;
  height?: number;
}) {
  const familyKey = family.map((c) => c.label).join('|');
  const options = useMemo(
    () => ({
      height,
      scales: { x: { ...frequencyX.scale, range: FREQUENCY_RANGE }, y: { range: dbRange } },
      axes: [frequencyX.axis, axis('Level (dB re 1 V of pickup signal)')],
      cursor: { drag: { x: false, y: false } },
      legend: { live: false },
      series: [
        { label: 'Frequency' },
        ...family.map((c, i) => ({ label: c.label, stroke: FAMILY_COLOURS[i % FAMILY_COLOURS.length], width: 1.5 })),
        ...(pinned ? [{ label: pinned.label, stroke: A_COLOUR, width: 2.5, dash: A_DASH }] : []),
        // Drawn last, on top of the family.
        { label: current.label, stroke: SERIES_COLOURS[0], width: 3 },
      ],
    }),
    // Rebuilt only when the set of curves changes, not with the numbers in them.
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the curves enter through familyKey and their labels; numbers change the data, not the options
    [familyKey, current.label, pinned?.label, height],
  );
  const data = useMemo(
    () => [frequencies, ...family.map((c) => c.db), ...(pinned ? [pinned.db] : []), current.db] as unknown as uPlot.AlignedData,
    [frequencies, family, pinned, current],
  );
  return <Plot options={options} data={data} label={label} onReady={onReady} />;
}
