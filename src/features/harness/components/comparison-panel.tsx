// A/B: the design pinned as A against the design in the editor (B), both at the current knobs, on
// one plot each for the response, the volume taper and the treble retention, with a table of the
// figures and of the values that differ.
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { getLayout } from '@shared/circuit/layouts';
import { Plot, SERIES_COLOURS, axis, frequencyX } from '@/components/charts/plot';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/page-header';
import { describeValue, isUsed, sameValue, type DesignState } from './design-state';
import { formatDb, formatIndex, formatKnob } from './harness-format';
import { formatMetric, metricRows } from './metrics-table';
import { A_COLOUR, A_DASH, FREQUENCY_RANGE, dbRange } from './response-plot';
import { SweepPlot, taperRange, trebleRange } from './sweep-plot';
import { TAPER_VOLUMES, type DesignInput, type HarnessAnalysis } from './use-harness-analysis';

/** Design A: any layout, with the knobs it was pinned at (knobs B's layout shares follow B's). */
export interface PinnedDesign {
  label: string;
  design: DesignInput;
  knobs: Record<string, number>;
}

/** A's knobs now: the knobs both layouts have follow the screen; A's others stay where they were pinned. */
export function pinnedKnobs(pinned: PinnedDesign, current: Record<string, number>): Record<string, number> {
  const layout = getLayout(pinned.design.layout)!;
  return Object.fromEntries(layout.knobs.map((k) => [k.id, current[k.id] ?? pinned.knobs[k.id] ?? 10]));
}

/** "Two pickups, three-way selector, position 1 (both)" */
export function designWords(d: DesignInput): string {
  const layout = getLayout(d.layout)!;
  return layout.selector.positions.length > 1
    ? `${layout.name}, position ${d.selector} (${layout.selector.positions[d.selector]?.name ?? ''})`
    : layout.name;
}

const B_COLOUR = SERIES_COLOURS[0]!;

function AbResponse({ a, b }: { a: HarnessAnalysis; b: HarnessAnalysis }) {
  const options = useMemo(
    () => ({
      height: 300,
      scales: { x: { ...frequencyX.scale, range: FREQUENCY_RANGE }, y: { range: dbRange } },
      axes: [frequencyX.axis, axis('Level (dB re 1 V of pickup signal)')],
      cursor: { drag: { x: false, y: false } },
      legend: { live: false },
      series: [
        { label: 'Frequency' },
        { label: 'A (pinned)', stroke: A_COLOUR, width: 2.5, dash: A_DASH },
        { label: 'B (editor)', stroke: B_COLOUR, width: 2.5 },
      ],
    }),
    [],
  );
  const data = useMemo(() => [b.current.frequencies, a.current.magnitudeDb, b.current.magnitudeDb] as uPlot.AlignedData, [a, b]);
  return (
    <Plot options={options} data={data} label="Response of design A and design B at the current knobs, level in dB against frequency" />
  );
}

function difference(kind: 'hz' | 'db', a: number | null, b: number | null): string {
  if (a === null || b === null || !Number.isFinite(a) || !Number.isFinite(b)) return '—';
  if (kind === 'db') return formatDb(b - a);
  const pct = (b / a - 1) * 100;
  return `${pct >= 0 ? '+' : '−'}${Math.abs(pct).toFixed(1)} %`;
}

function ValueDifferences({ pinned, design }: { pinned: PinnedDesign; design: DesignState }) {
  const a = pinned.design;
  const layout = getLayout(design.layout)!;
  const sameLayout = a.layout === design.layout;
  const options = layout.options.filter((o) => sameLayout && a.options[o.id] !== design.options[o.id]);
  // A value differs when one design uses it and the other does not, or both use it with different values.
  const rows = sameLayout
    ? layout.values.filter((d) => {
        const ua = isUsed(a, d.key);
        const ub = isUsed(design, d.key);
        return (ua || ub) && (ua !== ub || !sameValue(a.values[d.key], design.values[d.key]));
      })
    : [];
  const positionDiffers = sameLayout && a.selector !== design.selector;
  if (sameLayout && !positionDiffers && options.length === 0 && rows.length === 0)
    return <p className="text-sm text-ink-soft">A and B have the same wiring and values.</p>;
  const choice = (o: (typeof options)[number], id: string | undefined) => o.choices.find((c) => c.id === id)?.name ?? id ?? '';
  return (
    <table className="w-full text-sm">
      <caption className="mb-1 text-left text-sm font-semibold">What differs</caption>
      <thead>
        <tr className="border-b border-paper-edge text-xs text-ink-soft">
          <th scope="col" className="py-1 pr-2 text-left font-medium">
            Value
          </th>
          <th scope="col" className="py-1 pr-2 text-right font-medium">
            A
          </th>
          <th scope="col" className="py-1 text-right font-medium">
            B
          </th>
        </tr>
      </thead>
      <tbody>
        {(!sameLayout || positionDiffers) && (
          <tr className="border-b border-paper-edge/70">
            <th scope="row" className="py-1 pr-2 text-left font-normal">
              Layout and position
            </th>
            <td className="py-1 pr-2 text-right">{designWords(a)}</td>
            <td className="py-1 text-right">{designWords(design)}</td>
          </tr>
        )}
        {!sameLayout && (
          <tr className="border-b border-paper-edge/70">
            <td colSpan={3} className="py-1 text-xs text-ink-soft">
              Different layouts: their values are not compared one by one.
            </td>
          </tr>
        )}
        {options.map((o) => (
          <tr key={o.id} className="border-b border-paper-edge/70">
            <th scope="row" className="py-1 pr-2 text-left font-normal">
              {o.name}
            </th>
            <td className="py-1 pr-2 text-right">{choice(o, a.options[o.id])}</td>
            <td className="py-1 text-right">{choice(o, design.options[o.id])}</td>
          </tr>
        ))}
        {rows.map((d) => (
          <tr key={d.key} className="border-b border-paper-edge/70 last:border-0">
            <th scope="row" className="py-1 pr-2 text-left font-normal">
              {d.name}
            </th>
            <td className="num py-1 pr-2 text-right">{isUsed(a, d.key) ? describeValue(d, a.values) : 'not used'}</td>
            <td className="num py-1 text-right">{isUsed(design, d.key) ? describeValue(d, design.values) : 'not used'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export function ComparisonPanel({
  pinned,
  a,
  design,
  bLabel,
  b,
  knobs,
  onSwap,
  onUnpin,
}: {
  pinned: PinnedDesign;
  /** The analysis of A at the current knobs (computed by the screen, which also draws A on the main plot). */
  a: HarnessAnalysis | { error: string };
  design: DesignState;
  /** B's name in words. */
  bLabel: string;
  b: HarnessAnalysis;
  knobs: Record<string, number>;
  onSwap: () => void;
  onUnpin: () => void;
}) {
  const sweeps = useMemo(() => {
    if ('error' in a) return null;
    return {
      taper: [
        { label: 'A (pinned)', values: a.taper.volumeTaperDb, colour: A_COLOUR, dash: A_DASH },
        { label: 'B (editor)', values: b.taper.volumeTaperDb, colour: B_COLOUR },
      ],
      treble: [
        { label: 'A (pinned)', values: a.taper.trebleRetentionDb, colour: A_COLOUR, dash: A_DASH },
        { label: 'B (editor)', values: b.taper.trebleRetentionDb, colour: B_COLOUR },
      ],
    };
  }, [a, b]);

  return (
    <Panel
      id="harness-ab"
      title={
        <span>A/B comparison at {b.layout.knobs.map((k) => `${k.name.toLowerCase()} ${formatKnob(knobs[k.id] ?? 10)}`).join(', ')}</span>
      }
      actions={
        <div className="flex flex-wrap gap-2">
          <Button size="sm" onClick={onSwap}>
            Swap A and B
          </Button>
          <Button size="sm" variant="quiet" onClick={onUnpin}>
            Stop comparing
          </Button>
        </div>
      }
    >
      <p className="mb-3 text-sm text-ink-soft">
        <span className="font-medium" style={{ color: A_COLOUR }}>
          A, dashed
        </span>
        : {pinned.label} ({designWords(pinned.design)}). <span className="font-medium text-accent">B, solid</span>: the design in the editor
        ({bLabel}, {designWords(design)}). The knobs move both (knobs only A has stay where A was pinned).
      </p>
      {'error' in a || !sweeps ? (
        <Alert>Design A cannot be solved: {'error' in a ? a.error : ''}</Alert>
      ) : (
        <div className="grid gap-5 xl:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <div className="min-w-0 space-y-4">
            <AbResponse a={a} b={b} />
            <div className="grid gap-4 md:grid-cols-2">
              <figure className="min-w-0">
                <figcaption className="mb-1 text-sm font-medium">Volume taper (level at 1 kHz against full volume)</figcaption>
                <SweepPlot
                  volumes={TAPER_VOLUMES}
                  series={sweeps.taper}
                  yLabel="Level re full volume (dB)"
                  range={taperRange}
                  marker={knobs[b.axes.volumeKnob] ?? 10}
                  height={220}
                  label="Volume taper of A and B"
                />
              </figure>
              <figure className="min-w-0">
                <figcaption className="mb-1 text-sm font-medium">Treble retention against the volume knob</figcaption>
                <SweepPlot
                  volumes={TAPER_VOLUMES}
                  series={sweeps.treble}
                  yLabel="Treble re full volume (dB)"
                  range={trebleRange}
                  marker={knobs[b.axes.volumeKnob] ?? 10}
                  height={220}
                  label="Treble retention of A and B"
                />
              </figure>
            </div>
          </div>
          <div className="min-w-0 space-y-5">
            <table className="w-full text-sm">
              <caption className="mb-1 text-left text-sm font-semibold">Figures at these knobs</caption>
              <thead>
                <tr className="border-b border-paper-edge text-xs text-ink-soft">
                  <th scope="col" className="py-1 pr-2 text-left font-medium">
                    Figure
                  </th>
                  <th scope="col" className="py-1 pr-2 text-right font-medium">
                    A
                  </th>
                  <th scope="col" className="py-1 pr-2 text-right font-medium">
                    B
                  </th>
                  <th scope="col" className="py-1 text-right font-medium">
                    B − A
                  </th>
                </tr>
              </thead>
              <tbody>
                {metricRows(a).map((ra, i) => {
                  const rb = metricRows(b)[i]!;
                  return (
                    <tr key={ra.label} className="border-b border-paper-edge/70">
                      <th scope="row" className="py-1 pr-2 text-left font-normal">
                        {ra.label}
                      </th>
                      <td className="num whitespace-nowrap py-1 pr-2 text-right">{formatMetric(ra)}</td>
                      <td className="num whitespace-nowrap py-1 pr-2 text-right">{formatMetric(rb)}</td>
                      <td className="num whitespace-nowrap py-1 text-right">
                        {ra.text !== undefined || rb.text !== undefined ? '—' : difference(ra.kind, ra.value, rb.value)}
                      </td>
                    </tr>
                  );
                })}
                <tr>
                  <th scope="row" className="py-1 pr-2 text-left font-normal">
                    Interaction index
                  </th>
                  <td className="num py-1 pr-2 text-right">{formatIndex(a.interactionIndexDb)}</td>
                  <td className="num py-1 pr-2 text-right">{formatIndex(b.interactionIndexDb)}</td>
                  <td className="num py-1 text-right">{formatDb(b.interactionIndexDb - a.interactionIndexDb)}</td>
                </tr>
              </tbody>
            </table>
            <ValueDifferences pinned={pinned} design={design} />
          </div>
        </div>
      )}
    </Panel>
  );
}
