// The treble-bleed finder: the server searches preferred values for the design as set (its layout,
// position, options, values, the knobs off the volumes); the screen draws the best candidates'
// curves beside the same instrument without a bleed (the 1 kHz level and the treble retention as
// every volume turns from 10 to 2), and applies a candidate to the design in one click.
import { useMutation } from '@tanstack/react-query';
import { useMemo, useState } from 'react';
import { bleedCurves, type BleedCandidate, type BleedCurves } from '@shared/circuit/bleed-finder';
import { getLayout, resolveLayoutConfig } from '@shared/circuit/layouts';
import { formatValue } from '@shared/units/format';
import { SERIES_COLOURS } from '@/components/charts/plot';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/page-header';
import { api } from '@/lib/api-client';
import type { DesignInput } from './use-harness-analysis';
import { SweepPlot, taperRange, trebleRange, type SweepSeries } from './sweep-plot';

const SHOWN = 5;

export const candidateWords = (c: BleedCandidate) =>
  `${formatValue(c.values.bleedC, 'F')}${
    c.values.bleedR !== undefined
      ? ` with ${formatValue(c.values.bleedR, 'Ω')} ${c.topology === 'cap-parallel-r' ? 'in parallel' : 'in series'}`
      : ' alone'
  }`;

/** Ascending volumes for the plot's x axis (the finder lists 10 down to 2). */
function ascending(c: BleedCurves) {
  const order = c.volumes.map((_, i) => i).reverse();
  return {
    volumes: order.map((i) => c.volumes[i]!),
    level: Float64Array.from(order, (i) => c.level1kDb[i]!),
    treble: Float64Array.from(order, (i) => c.trebleDb[i]!),
  };
}

export function FinderPanel({
  design,
  knobs,
  onApply,
}: {
  design: DesignInput;
  knobs: Record<string, number>;
  onApply: (c: BleedCandidate) => void;
}) {
  const [weight, setWeight] = useState(0.7);
  const [asked, setAsked] = useState<string | null>(null);
  const finder = useMutation({
    mutationFn: (body: object) => api.post<{ candidates: BleedCandidate[]; evaluated: number }>('/api/harness/bleed-finder', body),
  });
  const layout = getLayout(design.layout)!;
  const key = JSON.stringify({ design, knobs });
  const stale = finder.data && asked !== key;

  // the curves of the shown candidates and of no bleed, for the instrument the finder was asked about
  const curves = useMemo(() => {
    if (!finder.data || !asked) return null;
    const sent = JSON.parse(asked) as { design: DesignInput; knobs: Record<string, number> };
    const l = getLayout(sent.design.layout)!;
    const { config, problems } = resolveLayoutConfig(l, sent.design);
    if (problems.length > 0) return null;
    try {
      const none = ascending(bleedCurves(l, config, sent.knobs, { topology: 'none' }));
      const shown = finder.data.candidates
        .slice(0, SHOWN)
        .map((c) => ascending(bleedCurves(l, config, sent.knobs, { topology: c.topology, ...c.values })));
      return { none, shown };
    } catch {
      return null;
    }
  }, [finder.data, asked]);

  const series = (pick: 'level' | 'treble'): SweepSeries[] =>
    curves
      ? [
          { label: 'No bleed', values: curves.none[pick], colour: SERIES_COLOURS[7]!, width: 2, dash: [3, 4] },
          ...curves.shown.map((c, i) => ({
            label: `${i + 1}: ${candidateWords(finder.data!.candidates[i]!)}`,
            values: c[pick],
            colour: SERIES_COLOURS[i % 7]!,
            width: i === 0 ? 2.5 : 1.5,
          })),
        ]
      : [];

  return (
    <Panel id="harness-finder" title="Treble-bleed finder">
      <p className="text-sm text-ink-soft">
        Tries E12 capacitors from 100 pF to 4.7 nF, alone and with E12 resistors from 47 kΩ to 1 MΩ in parallel or in series, on every
        volume of this design at its position, options and load, with the other knobs where they are. It ranks by how even the treble stays
        (3 kHz against 200 Hz) from volume 10 to 2, and by how little the level at 1 kHz strays from the same harness without a bleed.
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <label htmlFor="finder-weight" className="text-sm">
          Weight on even treble
        </label>
        <input
          id="finder-weight"
          type="range"
          min={0}
          max={1}
          step={0.05}
          value={weight}
          onChange={(e) => setWeight(Number(e.target.value))}
        />
        <span className="num text-sm">{weight.toFixed(2)}</span>
        <Button
          size="sm"
          busy={finder.isPending}
          busyText="Searching…"
          onClick={() => {
            setAsked(key);
            finder.mutate({
              layout: design.layout,
              selector: design.selector,
              options: design.options,
              values: design.values,
              knobs,
              weight,
            });
          }}
        >
          Find a bleed
        </Button>
      </div>
      {finder.error && (
        <div className="mt-3">
          <Alert>{finder.error.message}</Alert>
        </div>
      )}
      {stale && (
        <p className="mt-3 text-xs text-ink-soft" role="status">
          The design or the knobs changed since this search (applying a candidate changes the design too); the candidates and curves are for
          the design as it was searched. Search again to update.
        </p>
      )}
      {finder.data && (
        <div className="mt-3 space-y-4">
          <table className="w-full max-w-3xl text-sm" data-testid="finder-candidates">
            <caption className="text-left text-xs text-ink-soft">
              Best {Math.min(SHOWN, finder.data.candidates.length)} of {finder.data.evaluated} candidates (lower score is better)
            </caption>
            <thead>
              <tr className="text-left text-xs text-ink-soft">
                <th>#</th>
                <th>Bleed</th>
                <th>Treble spread</th>
                <th>Taper change</th>
                <th>Score</th>
                <th />
              </tr>
            </thead>
            <tbody>
              {finder.data.candidates.slice(0, SHOWN).map((c, i) => (
                <tr key={i} className="border-t border-paper-edge">
                  <td className="num">{i + 1}</td>
                  <td>{candidateWords(c)}</td>
                  <td className="num whitespace-nowrap pr-3">{c.figures.trebleSpreadDb.toFixed(2)} dB</td>
                  <td className="num whitespace-nowrap pr-3">{c.figures.taperDeviationDb.toFixed(2)} dB</td>
                  <td className="num whitespace-nowrap pr-3">{c.figures.score.toFixed(2)}</td>
                  <td>
                    <Button
                      size="sm"
                      variant="quiet"
                      onClick={() => onApply(c)}
                      aria-label={`Apply candidate ${i + 1}: ${candidateWords(c)}`}
                    >
                      Apply
                    </Button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {curves ? (
            <div className="grid min-w-0 gap-4 lg:grid-cols-2">
              <figure className="min-w-0">
                <figcaption className="mb-1 text-sm font-medium">Level at 1 kHz against the volumes</figcaption>
                <SweepPlot
                  volumes={curves.none.volumes}
                  series={series('level')}
                  yLabel="Level re no bleed at 10 (dB)"
                  range={taperRange}
                  marker={10}
                  height={240}
                  label="Level at 1 kHz of each candidate and of no bleed as every volume turns from 10 to 2"
                />
              </figure>
              <figure className="min-w-0">
                <figcaption className="mb-1 text-sm font-medium">Treble retention against the volumes</figcaption>
                <SweepPlot
                  volumes={curves.none.volumes}
                  series={series('treble')}
                  yLabel="Treble re full volume (dB)"
                  range={trebleRange}
                  marker={10}
                  height={240}
                  label="Treble retention of each candidate and of no bleed as every volume turns from 10 to 2"
                />
              </figure>
              <p className="text-xs text-ink-soft lg:col-span-2">
                Every volume of the {layout.name.toLowerCase()} layout turns together, at 10, 9, …, 2; computed here with the same engine as
                the search.
              </p>
            </div>
          ) : (
            <p className="text-sm text-ink-soft">The curves cannot be drawn for this design.</p>
          )}
        </div>
      )}
    </Panel>
  );
}
