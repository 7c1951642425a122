// How the design behaves as the volume knob turns, at the current tone: the volume taper (with
// the pot's own law, unloaded, for reference), the treble retention, and the interaction index.
import { useMemo } from 'react';
import { lawValue, type TaperLaw } from '@shared/taper/law';
import { SERIES_COLOURS } from '@/components/charts/plot';
import { Panel } from '@/components/ui/page-header';
import { formatDb, formatIndex, formatKnob } from './harness-format';
import { SweepPlot, taperRange, trebleRange, type SweepSeries } from './sweep-plot';
import { TAPER_VOLUMES, type HarnessAnalysis } from './use-harness-analysis';

/** Words for the size of the interaction index (our own bands, for reading the figure). */
function interactionWords(x: number): string {
  if (x < 0.5) return 'the two knobs barely affect each other';
  if (x < 2) return 'the knobs affect each other a little';
  return 'the knobs clearly affect each other';
}

export function SweepsPanel({
  analysis,
  volumeLaw,
  knobs,
}: {
  analysis: HarnessAnalysis;
  volumeLaw: TaperLaw;
  knobs: Record<string, number>;
}) {
  const volumeName = analysis.layout.knobs.find((k) => k.id === analysis.axes.volumeKnob)?.name.toLowerCase() ?? 'volume';
  const toneName = analysis.layout.knobs.find((k) => k.id === analysis.axes.toneKnob)?.name.toLowerCase() ?? 'tone';
  const volume = knobs[analysis.axes.volumeKnob] ?? 10;
  const tone = knobs[analysis.axes.toneKnob] ?? 10;
  // The pot's law on its own: 20·log10(y(x)), what the taper would be with no load and no pickup.
  const bare = useMemo(
    () => Float64Array.from(TAPER_VOLUMES, (v) => 20 * Math.log10(Math.max(lawValue(volumeLaw, v / 10), 1e-9))),
    [volumeLaw],
  );
  const taperSeries = useMemo<SweepSeries[]>(
    () => [
      { label: 'Pot law alone (no load)', values: bare, colour: SERIES_COLOURS[7]!, width: 1.5, dash: [3, 4] },
      { label: 'This design', values: analysis.taper.volumeTaperDb, colour: SERIES_COLOURS[0]!, width: 2.5 },
    ],
    [bare, analysis.taper],
  );
  const trebleSeries = useMemo<SweepSeries[]>(
    () => [{ label: 'This design', values: analysis.taper.trebleRetentionDb, colour: SERIES_COLOURS[0]!, width: 2.5 }],
    [analysis.taper],
  );
  return (
    <Panel
      id="harness-sweeps"
      title={
        <span>
          Turning the {volumeName}, with the {toneName} at <span className="num">{formatKnob(tone)}</span>
        </span>
      }
    >
      <div className="mb-4 flex flex-wrap items-baseline gap-x-4 gap-y-1 rounded-md bg-paper-deep px-3 py-2">
        <p className="text-sm">
          <span className="font-medium">Interaction index</span>{' '}
          <span className="num ml-1 text-lg font-semibold">{formatIndex(analysis.interactionIndexDb)}</span>
        </p>
        <p className="text-sm text-ink-soft">
          How far the volume taper at 1 kHz moves as the tone knob turns (RMS over the 11 × 11 dial grid); 0 means the knobs act
          independently — here {interactionWords(analysis.interactionIndexDb)}.
        </p>
      </div>
      <div className="grid gap-6 md:grid-cols-2">
        <figure className="min-w-0">
          <figcaption className="mb-1">
            <span className="block text-sm font-medium">Volume taper</span>
            <span className="block text-xs text-ink-soft">
              Level at 1 kHz against full volume. Here: <span className="num text-ink">{formatDb(analysis.point.volumeTaperDb)}</span>
            </span>
          </figcaption>
          <SweepPlot
            volumes={TAPER_VOLUMES}
            series={taperSeries}
            yLabel="Level re full volume (dB)"
            range={taperRange}
            marker={volume}
            label="Volume taper: level at 1 kHz relative to full volume, in dB, against the volume knob from 0 to 10"
          />
        </figure>
        <figure className="min-w-0">
          <figcaption className="mb-1">
            <span className="block text-sm font-medium">Treble retention</span>
            <span className="block text-xs text-ink-soft">
              3 kHz against 200 Hz, relative to full volume; below 0 the sound darkens. Here:{' '}
              <span className="num text-ink">{formatDb(analysis.point.trebleRetentionDb)}</span>
            </span>
          </figcaption>
          <SweepPlot
            volumes={TAPER_VOLUMES}
            series={trebleSeries}
            yLabel="Treble re full volume (dB)"
            range={trebleRange}
            marker={volume}
            label="Treble retention in dB against the volume knob from 0 to 10"
          />
        </figure>
      </div>
    </Panel>
  );
}
