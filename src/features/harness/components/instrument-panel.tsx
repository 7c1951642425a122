// The whole instrument: a layout (pickups, selector, knobs, options), the load it plays into, every
// selector position overlaid at the current knobs, each pickup's own curve where pickups combine,
// the treble-bleed finder with one-click apply, and an A/B pin that works across layouts. Curves are
// computed in the browser with the shared engine; the finder runs on the server.
import { useMutation } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState } from 'react';
import type { BleedCandidate } from '@shared/circuit/bleed-finder';
import {
  buildLayoutNetlist,
  getLayout,
  LAYOUTS,
  layoutKnobs,
  resolveLayoutConfig,
  type LayoutDef,
  type LayoutId,
} from '@shared/circuit/layouts';
import { simulateInstrument, type InstrumentResult } from '@shared/circuit/metrics';
import { compileHarness } from '@shared/circuit/solver';
import { formatValue } from '@shared/units/format';
import { tryParseValue } from '@shared/units/parse';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/page-header';
import { api } from '@/lib/api-client';
import { formatDb, formatHz, formatKnob } from './harness-format';
import { ResponsePlot, type Curve } from './response-plot';

interface Instrument {
  layout: LayoutId;
  selector: number;
  options: Record<string, string>;
  knobs: Record<string, number>;
  values: Record<string, number>;
}

const LOAD_KEYS: Record<string, string[]> = {
  amp: ['cableCapPerMetre', 'cableLength', 'ampR', 'ampC'],
  buffer: ['cableCapPerMetre', 'cableBeforeBuffer', 'bufferR'],
  'low-impedance-pedal': ['cableCapPerMetre', 'cableLength', 'pedalR'],
};

function solveInstrument(layout: LayoutDef, inst: Instrument, selector = inst.selector): InstrumentResult | { error: string } {
  const { config, problems } = resolveLayoutConfig(layout, { selector, options: inst.options, values: inst.values, knobs: inst.knobs });
  if (problems.length > 0) return { error: problems[0]!.message };
  try {
    return simulateInstrument(compileHarness(buildLayoutNetlist(layout, config)), layoutKnobs(layout, inst.knobs));
  } catch (err) {
    return { error: err instanceof Error ? err.message : String(err) };
  }
}

function ValueField({
  def,
  value,
  onChange,
}: {
  def: LayoutDef['values'][number];
  value: number | undefined;
  onChange: (v: number | undefined) => void;
}) {
  const [text, setText] = useState(value === undefined ? '' : formatValue(value, def.unit));
  const [error, setError] = useState<string | null>(null);
  const id = `inst-${def.key}`;
  return (
    <div>
      <label htmlFor={id} className="block text-xs font-medium text-ink-soft">
        {def.name}
      </label>
      <input
        id={id}
        className="mt-0.5 w-full rounded border border-paper-edge bg-paper-bright px-2 py-1 text-sm num"
        value={text}
        placeholder={def.default === null ? 'none' : ''}
        aria-invalid={error ? true : undefined}
        onChange={(e) => {
          setText(e.target.value);
          if (e.target.value.trim() === '' && def.default === null) {
            setError(null);
            onChange(undefined);
            return;
          }
          const r = tryParseValue(e.target.value);
          if (r.ok && Number.isFinite(r.value) && (def.range === 'positive' ? r.value > 0 : r.value >= 0)) {
            setError(null);
            onChange(r.value);
          } else setError(r.ok ? (def.range === 'positive' ? 'Must be more than zero.' : 'Must not be negative.') : r.error);
        }}
      />
      {error && <p className="text-xs text-fail">{error}</p>}
    </div>
  );
}

/** `onChange`: told of the instrument once the user changes anything in the panel (it is then in use), and after every change. */
export function InstrumentPanel({ onChange }: { onChange?: (inst: Instrument) => void } = {}) {
  const [inst, setInst] = useState<Instrument>({ layout: 'two-pickups-3way', selector: 1, options: {}, knobs: {}, values: {} });
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    onChange?.(inst);
  }, [inst, onChange]);
  const [pinned, setPinned] = useState<{ label: string; db: Float64Array } | null>(null);
  const [weight, setWeight] = useState(0.7);
  const layout = getLayout(inst.layout)!;
  const knobs = layoutKnobs(layout, inst.knobs);
  const current = useMemo(() => solveInstrument(layout, inst), [layout, inst]);
  const positions = useMemo(() => layout.selector.positions.map((p) => ({ p, r: solveInstrument(layout, inst, p.index) })), [layout, inst]);
  const finder = useMutation({
    mutationFn: (body: object) => api.post<{ candidates: BleedCandidate[]; evaluated: number }>('/api/harness/bleed-finder', body),
  });

  const option = (id: string) => inst.options[id] ?? layout.options.find((o) => o.id === id)?.choices[0]!.id;
  const setLayout = (id: LayoutId) => {
    const next = getLayout(id)!;
    setInst({ layout: id, selector: Math.min(inst.selector, next.selector.positions.length - 1), options: {}, knobs: {}, values: {} });
    finder.reset();
  };
  const valueOf = (key: string) =>
    (inst.values[key] ?? layout.values.find((v) => v.key === key)?.default ?? undefined) as number | undefined;
  const setValue = (key: string, v: number | undefined) =>
    setInst((s) => {
      const values = { ...s.values };
      if (v === undefined) delete values[key];
      else values[key] = v;
      return { ...s, values };
    });

  const ok = 'error' in current ? null : current;
  const positionName = layout.selector.positions[inst.selector]!.name;
  const currentCurve: Curve | null = ok ? { label: `Now: ${positionName}`, db: ok.magnitudeDb } : null;
  const family: Curve[] = [
    ...positions
      .filter(({ p, r }) => p.index !== inst.selector && !('error' in r))
      .map(({ p, r }) => ({ label: `Position ${p.name}`, db: (r as InstrumentResult).magnitudeDb })),
    ...(ok && ok.perPickup.length > 1
      ? ok.perPickup.map((pp) => ({
          label: `${layout.pickups.find((x) => x.id === pp.pickupId)?.name ?? pp.pickupId} alone`,
          db: pp.magnitudeDb,
        }))
      : []),
  ];
  const loadKeys = LOAD_KEYS[option('load') ?? 'amp'] ?? [];
  const defsByKey = new Map(layout.values.map((v) => [v.key, v]));

  const applyCandidate = (c: BleedCandidate) => {
    const prefixes = layout.knobs.filter((k) => /(^|\.)volume$/.test(k.id)).map((k) => k.id.replace(/\.?volume$/, ''));
    const key = (p: string, n: string) => (p ? `${p}.${n}` : n);
    setInst((s) => {
      const values = { ...s.values };
      for (const p of prefixes) {
        values[key(p, 'bleedC')] = c.values.bleedC;
        if (c.values.bleedR !== undefined) values[key(p, 'bleedR')] = c.values.bleedR;
      }
      return { ...s, options: { ...s.options, bleed: c.topology }, values };
    });
  };

  return (
    <Panel id="harness-instrument" title="Whole instrument: pickups, selector, load">
      <div className="grid gap-6 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
        <div className="space-y-4">
          <div>
            <label htmlFor="inst-layout" className="block text-sm font-medium">
              Layout
            </label>
            <select
              id="inst-layout"
              className="mt-1 w-full rounded border border-paper-edge bg-paper-bright px-2 py-1.5 text-sm"
              value={inst.layout}
              onChange={(e) => setLayout(e.target.value as LayoutId)}
            >
              {LAYOUTS.map((l) => (
                <option key={l.id} value={l.id}>
                  {l.name}
                </option>
              ))}
            </select>
            <p className="mt-1 text-xs text-ink-soft">{layout.description}</p>
          </div>

          {layout.selector.positions.length > 1 && (
            <fieldset>
              <legend className="text-sm font-medium">Selector (arrow keys move it)</legend>
              <div
                role="radiogroup"
                aria-label="Selector position"
                className="mt-1 inline-flex flex-wrap rounded-md border border-paper-edge bg-paper-deep p-0.5"
              >
                {layout.selector.positions.map((p) => (
                  <label
                    key={p.index}
                    className={`cursor-pointer rounded px-2.5 py-1 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent ${inst.selector === p.index ? 'bg-paper-bright font-medium shadow-sm' : 'text-ink-soft'}`}
                  >
                    <input
                      type="radio"
                      name="inst-selector"
                      className="sr-only"
                      checked={inst.selector === p.index}
                      onChange={() => setInst((s) => ({ ...s, selector: p.index }))}
                    />
                    {p.index}: {p.name}
                  </label>
                ))}
              </div>
            </fieldset>
          )}

          <fieldset className="space-y-2">
            <legend className="text-sm font-medium">Knobs</legend>
            {layout.knobs.map((k) => (
              <div key={k.id} className="flex items-center gap-3">
                <label htmlFor={`inst-knob-${k.id}`} className="w-32 text-sm">
                  {k.name}
                </label>
                <input
                  id={`inst-knob-${k.id}`}
                  type="range"
                  min={0}
                  max={10}
                  step={0.1}
                  value={knobs[k.id]}
                  onChange={(e) => setInst((s) => ({ ...s, knobs: { ...s.knobs, [k.id]: Number(e.target.value) } }))}
                  className="flex-1"
                />
                <span className="num w-8 text-right text-sm">{formatKnob(knobs[k.id]!)}</span>
              </div>
            ))}
          </fieldset>

          <fieldset className="space-y-2">
            <legend className="text-sm font-medium">Options</legend>
            {layout.options.map((o) => (
              <div key={o.id}>
                <label htmlFor={`inst-opt-${o.id}`} className="block text-xs font-medium text-ink-soft">
                  {o.name}
                </label>
                <select
                  id={`inst-opt-${o.id}`}
                  className="mt-0.5 w-full rounded border border-paper-edge bg-paper-bright px-2 py-1 text-sm"
                  value={option(o.id)}
                  onChange={(e) => setInst((s) => ({ ...s, options: { ...s.options, [o.id]: e.target.value } }))}
                >
                  {o.choices.map((c) => (
                    <option key={c.id} value={c.id}>
                      {c.name}
                    </option>
                  ))}
                </select>
              </div>
            ))}
          </fieldset>

          <fieldset key={`${inst.layout}-${option('load')}`} className="grid grid-cols-2 gap-2">
            <legend className="text-sm font-medium">The load</legend>
            {loadKeys.map((k) => (
              <ValueField key={k} def={defsByKey.get(k)!} value={valueOf(k)} onChange={(v) => setValue(k, v)} />
            ))}
          </fieldset>

          <details>
            <summary className="cursor-pointer text-sm font-medium">All part values of this layout</summary>
            <div key={inst.layout} className="mt-2 grid grid-cols-2 gap-2">
              {layout.values
                .filter((v) => v.quantity !== 'law' && !loadKeys.includes(v.key))
                .map((v) => (
                  <ValueField
                    key={`${v.key}-${inst.values[v.key] ?? ''}`}
                    def={v}
                    value={valueOf(v.key)}
                    onChange={(x) => setValue(v.key, x)}
                  />
                ))}
            </div>
          </details>
        </div>

        <div className="min-w-0 space-y-4">
          {ok && currentCurve ? (
            <>
              {ok.signal === 'cancelled' ? (
                <Alert tone="info">
                  No signal (cancelled): the sources oppose and cancel exactly at this setting, so there is no curve and no figure to show.
                </Alert>
              ) : null}
              <ResponsePlot
                frequencies={ok.frequencies}
                current={currentCurve}
                family={family}
                pinned={pinned}
                height={320}
                label={`Predicted response of the ${layout.name.toLowerCase()} layout at ${positionName}, with every selector position and each pickup alone, level in dB from 20 Hz to 20 kHz`}
              />
              <p className="text-sm text-ink-soft" data-testid="instrument-figures">
                {ok.metrics
                  ? `${positionName}: resonance ${formatHz(ok.metrics.peak.frequency)}, ${formatDb(ok.metrics.peakRiseDb)} above the bass; −3 dB corner ${formatHz(ok.metrics.cornerHz)}; level at 1 kHz ${formatDb(ok.metrics.level1kDb)}.`
                  : `${positionName}: ${ok.note}.`}
              </p>
              <div className="flex flex-wrap gap-2">
                <Button
                  size="sm"
                  onClick={() => setPinned({ label: `A: ${layout.name}, ${positionName}`, db: Float64Array.from(ok.magnitudeDb) })}
                >
                  {pinned ? 'Pin this as the new A' : 'Pin as A to compare'}
                </Button>
                {pinned && (
                  <Button size="sm" variant="quiet" onClick={() => setPinned(null)}>
                    Unpin A
                  </Button>
                )}
              </div>
            </>
          ) : (
            <Alert>The instrument cannot be solved with these values: {'error' in current ? current.error : ''}</Alert>
          )}

          <section aria-labelledby="finder-heading" className="rounded border border-paper-edge p-3">
            <h3 id="finder-heading" className="text-sm font-semibold">
              Treble-bleed finder
            </h3>
            <p className="mt-1 text-xs text-ink-soft">
              Tries E12 capacitors from 100 pF to 4.7 nF, alone and with E12 resistors from 47 kΩ to 1 MΩ in parallel or in series, on every
              volume of this instrument at this position and load. It ranks by how even the treble stays (3 kHz against 200 Hz) from volume
              10 to 2, and by how little the level at 1 kHz strays from the bare pot.
            </p>
            <div className="mt-2 flex flex-wrap items-center gap-3">
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
                onClick={() =>
                  finder.mutate({
                    layout: inst.layout,
                    selector: inst.selector,
                    options: inst.options,
                    values: inst.values,
                    knobs: inst.knobs,
                    weight,
                  })
                }
              >
                Find a bleed
              </Button>
            </div>
            {finder.error && <Alert>{finder.error.message}</Alert>}
            {finder.data && (
              <table className="mt-3 w-full text-sm">
                <caption className="text-left text-xs text-ink-soft">
                  Best of {finder.data.evaluated} candidates (lower score is better)
                </caption>
                <thead>
                  <tr className="text-left text-xs text-ink-soft">
                    <th>Bleed</th>
                    <th>Treble spread</th>
                    <th>Taper change</th>
                    <th>Score</th>
                    <th />
                  </tr>
                </thead>
                <tbody>
                  {finder.data.candidates.slice(0, 5).map((c, i) => (
                    <tr key={i} className="border-t border-paper-edge">
                      <td>
                        {formatValue(c.values.bleedC, 'F')}
                        {c.values.bleedR !== undefined
                          ? ` with ${formatValue(c.values.bleedR, 'Ω')} ${c.topology === 'cap-parallel-r' ? 'in parallel' : 'in series'}`
                          : ' alone'}
                      </td>
                      <td className="num">{c.figures.trebleSpreadDb.toFixed(2)} dB</td>
                      <td className="num">{c.figures.taperDeviationDb.toFixed(2)} dB</td>
                      <td className="num">{c.figures.score.toFixed(2)}</td>
                      <td>
                        <Button size="sm" variant="quiet" onClick={() => applyCandidate(c)}>
                          Apply
                        </Button>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            )}
          </section>

          <p className="text-xs text-ink-soft">
            Simplifications: every pickup (and every coil) is an equal signal source of 1 V, in phase or at 180° when reversed, so a
            combined position shows what the wiring does to equal signals, not what a string gives at two places; there is no mutual
            inductance between the coils of a dual-coil pickup; switches are ideal contacts.
          </p>
        </div>
      </div>
    </Panel>
  );
}
