// The Harness screen: one editor for the whole instrument. Choose a layout (one pickup, two or three
// pickups with a selector, a dual-coil pickup) or start from one of the seven presets (the one-pickup
// layout with their options), set the options and the load, give it the parts you have (typed or
// measured), turn the knobs and see the predicted response at once: every selector position, each
// pickup alone, the volume taper and treble retention, the treble-bleed finder, A/B across layouts,
// Listen, saved designs and downloads. All curves are computed in the browser with the shared engine.
import { HarnessSafetyNote } from '@/components/safety/safety-notes';
import { useCallback, useMemo, useReducer, useRef, useState } from 'react';
import type uPlot from 'uplot';
import type { BleedCandidate } from '@shared/circuit/bleed-finder';
import { LAYOUTS, layoutKnobs, volumeKnobs, type LayoutId } from '@shared/circuit/layouts';
import { gridCurve } from '@shared/circuit/metrics';
import { HARNESS_PRESETS, type HarnessPresetId } from '@shared/circuit/presets';
import type { HarnessDesign } from '@shared/schemas/harness';
import type { TaperLaw } from '@shared/taper/law';
import { downloadPng } from '@/components/charts/plot';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { downloadCsv, downloadText } from '@/lib/download';
import { useSpiceNetlist } from '../api/get-netlist';
import { ComparisonPanel, designWords, pinnedKnobs, type PinnedDesign } from './comparison-panel';
import {
  activeErrors,
  designFromSaved,
  designReducer,
  initialDesign,
  instrumentOf,
  layoutOf,
  presetDesign,
  presetOf,
  quickStartOf,
  usedValues,
} from './design-state';
import { DesignsPanel } from './designs-panel';
import { FinderPanel } from './finder-panel';
import { formatDb, formatHz, formatKnob } from './harness-format';
import { designName, harnessConditions } from './harness-conditions';
import { KnobSliders } from './knob-sliders';
import { instrumentChainOf, listenInstrumentOf, type ListenInstrument } from './listen-design';
import { ListenPanel } from './listen-panel';
import { MetricsTable } from './metrics-table';
import { ResponsePlot, type Curve } from './response-plot';
import { SweepsPanel } from './sweeps-panel';
import { FAMILY_POSITIONS, familyGrid, useHarnessAnalysis, usePositionCurves, type FamilyMode } from './use-harness-analysis';
import { ValuesEditor } from './values-editor';

const FAMILY_LABEL: Record<FamilyMode, string> = { positions: 'Positions', volume: 'Volume', tone: 'Tone', none: 'None' };

function FamilyToggle({
  mode,
  modes,
  onChange,
  volumeName,
  toneName,
}: {
  mode: FamilyMode;
  modes: FamilyMode[];
  onChange: (m: FamilyMode) => void;
  volumeName: string;
  toneName: string;
}) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium">Lighter curves at other settings of</legend>
      <div className="inline-flex rounded-md border border-paper-edge bg-paper-deep p-0.5">
        {modes.map((m) => (
          <label
            key={m}
            className={`cursor-pointer rounded px-2.5 py-1 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent ${mode === m ? 'bg-paper-bright font-medium shadow-sm' : 'text-ink-soft'}`}
          >
            <input type="radio" name="family" value={m} checked={mode === m} onChange={() => onChange(m)} className="sr-only" />
            {FAMILY_LABEL[m]}
          </label>
        ))}
      </div>
      <p className="mt-1 text-xs text-ink-soft">
        {mode === 'positions'
          ? 'Every selector position at the current knobs.'
          : mode === 'volume'
            ? `${volumeName} at 10, 8, 6, 4 and 2 with the other knobs where they are.`
            : mode === 'tone'
              ? `${toneName} at 10, 8, 6, 4 and 2 with the other knobs where they are.`
              : 'Only the current setting.'}
      </p>
    </fieldset>
  );
}

const slug = (t: string) =>
  t
    .toLowerCase()
    .replace(/[^a-z0-9.]+/g, '_')
    .replace(/^_|_$/g, '');

export function HarnessScreen() {
  const [design, dispatch] = useReducer(designReducer, undefined, () => initialDesign());
  const [knobsSet, setKnobsSet] = useState<Record<string, number>>({});
  const [family, setFamily] = useState<FamilyMode>('volume');
  const [pinned, setPinned] = useState<PinnedDesign | null>(null);
  const plotRef = useRef<uPlot | null>(null);
  const netlist = useSpiceNetlist();

  const layout = layoutOf(design);
  const knobs = useMemo(() => layoutKnobs(layout, knobsSet), [layout, knobsSet]);
  const onKnobs = useCallback(
    (k: Record<string, number>) => setKnobsSet(Object.fromEntries(Object.entries(k).map(([id, v]) => [id, Math.round(v * 10) / 10]))),
    [],
  );
  const b = useHarnessAnalysis(design, knobs);
  const aKnobs = useMemo(() => (pinned ? pinnedKnobs(pinned, knobs) : {}), [pinned, knobs]);
  const a = useHarnessAnalysis(pinned?.design ?? null, aKnobs);
  const positions = usePositionCurves(design, knobs);
  const invalid = activeErrors(design);
  const quickStart = quickStartOf(design);
  const name = designName(design);
  const ok = b && !('error' in b) ? b : null;
  const multiPosition = layout.selector.positions.length > 1;
  const modes: FamilyMode[] = multiPosition ? ['positions', 'volume', 'tone', 'none'] : ['volume', 'tone', 'none'];
  const mode: FamilyMode = modes.includes(family) ? family : 'volume';
  const knobName = (id: string | undefined) => layout.knobs.find((k) => k.id === id)?.name ?? '';
  const volumeName = ok ? knobName(ok.axes.volumeKnob) : 'Volume';
  const toneName = ok ? knobName(ok.axes.toneKnob) : 'Tone';
  const positionName = layout.selector.positions[design.selector]?.name ?? '';

  const switchLayout = (id: LayoutId) => {
    dispatch({ type: 'layout', layout: id });
    setKnobsSet({});
    setFamily(id === 'two-pickups-3way' || id === 'three-pickups-5way' ? 'positions' : 'volume');
  };
  const quickStartTo = (preset: HarnessPresetId) => {
    if (design.layout !== 'one-pickup') {
      setKnobsSet({});
      setFamily('volume');
    }
    dispatch({ type: 'quick-start', preset });
  };

  // the lighter curves: other knob settings or every selector position, then each pickup alone where pickups combine
  const familyCurves = useMemo<Curve[]>(() => {
    if (!ok) return [];
    const out: Curve[] = [];
    if (mode === 'positions') {
      for (const p of positions) if (p.index !== design.selector) out.push({ label: `Position ${p.index}: ${p.name}`, db: p.db });
    } else {
      const grid = familyGrid(ok.compiled, knobs, mode, ok.axes);
      if (grid)
        FAMILY_POSITIONS.forEach((pos, i) =>
          out.push({
            label: mode === 'volume' ? `${volumeName} ${pos}` : `${toneName} ${pos}`,
            db: mode === 'volume' ? gridCurve(grid, i, 0) : gridCurve(grid, 0, i),
          }),
        );
    }
    if (ok.instrument.perPickup.length > 1)
      for (const pp of ok.instrument.perPickup)
        out.push({ label: `${layout.pickups.find((x) => x.id === pp.pickupId)?.name ?? pp.pickupId} alone`, db: pp.magnitudeDb });
    return out;
  }, [ok, knobs, mode, positions, design.selector, layout, volumeName, toneName]);

  const currentCurve = useMemo<Curve | null>(
    () => (ok ? { label: `${pinned ? 'B: now' : 'Now'}${multiPosition ? `, ${positionName}` : ''}`, db: ok.current.magnitudeDb } : null),
    [ok, pinned, multiPosition, positionName],
  );
  const pinnedCurve = useMemo<Curve | null>(
    () => (pinned && a && !('error' in a) ? { label: `A: ${pinned.label}`, db: a.current.magnitudeDb } : null),
    [pinned, a],
  );

  const openSaved = useCallback((d: HarnessDesign) => {
    dispatch({ type: 'replace', state: designFromSaved(d) });
    setKnobsSet(d.knobs ?? {});
    setFamily(d.layout === 'two-pickups-3way' || d.layout === 'three-pickups-5way' ? 'positions' : 'volume');
  }, []);
  const pinSaved = useCallback((d: HarnessDesign) => {
    const s = designFromSaved(d);
    setPinned({
      label: d.name,
      design: { layout: s.layout, selector: s.selector, options: s.options, values: s.values },
      knobs: d.knobs ?? {},
    });
  }, []);
  const onSaved = useCallback(
    (d: HarnessDesign) => dispatch({ type: 'saved', loaded: { id: d.id, name: d.name, notes: d.notes, ownerId: d.ownerId } }),
    [],
  );
  const onDeleted = useCallback((id: number) => dispatch({ type: 'deleted', id }), []);
  const pinCurrent = () =>
    setPinned({
      label: name,
      design: { layout: design.layout, selector: design.selector, options: design.options, values: design.values },
      knobs,
    });
  const swap = () => {
    if (!pinned) return;
    pinCurrent();
    dispatch({ type: 'replace', state: initialDesign(pinned.design.layout as LayoutId, pinned.design) });
    setKnobsSet(pinnedKnobs(pinned, knobs));
  };
  const applyCandidate = useCallback(
    (c: BleedCandidate) => {
      const values: Record<string, number> = {};
      for (const id of volumeKnobs(layout)) {
        const prefix = id.replace(/\.?volume$/, '');
        const key = (n: string) => (prefix ? `${prefix}.${n}` : n);
        values[key('bleedC')] = c.values.bleedC;
        if (c.values.bleedR !== undefined) values[key('bleedR')] = c.values.bleedR;
      }
      dispatch({ type: 'apply', values, options: { bleed: c.topology } });
    },
    [layout],
  );

  const fileKnobs = layout.knobs.map((k) => `${slug(k.id)}${formatKnob(knobs[k.id] ?? 10)}`).join('-');
  const fileStem = `harness-${design.layout}${multiPosition ? `-pos${design.selector}` : ''}-${fileKnobs}`;
  // What the curves were computed for; the pinned design A is named when its curve is in the export.
  const exportConditions = () =>
    harnessConditions(design, knobs, [
      {
        key: 'lighter curves',
        value:
          familyCurves.length === 0
            ? 'none'
            : mode === 'positions'
              ? `every selector position${ok && ok.instrument.perPickup.length > 1 ? ', each pickup alone' : ''}`
              : mode === 'none'
                ? 'each pickup alone'
                : `${mode === 'volume' ? volumeName : toneName} at ${FAMILY_POSITIONS.join(', ')}`,
      },
      { key: 'pinned design A', value: pinnedCurve && pinned ? `${pinned.label} (${designWords(pinned.design)})` : 'none' },
      { key: 'sources', value: 'every pickup or coil a unit source (1 V), reversed ones at 180°; no mutual inductance between coils' },
      { key: 'computed', value: 'circuit model in Lugbook (not measured)' },
    ]);
  const downloadCurves = () => {
    if (!ok) return;
    const f = ok.current.frequencies;
    const header = [
      'frequency_Hz',
      `${pinnedCurve ? 'B_' : ''}now_dB`,
      ...familyCurves.map((c) => `${slug(c.label)}_dB`),
      ...(pinnedCurve && pinned ? [`A_${slug(pinned.label)}_dB`] : []),
    ];
    const rows: (string | number)[][] = [header];
    for (let k = 0; k < f.length; k++) {
      rows.push(
        [f[k]!, ok.current.magnitudeDb[k]!, ...familyCurves.map((c) => c.db[k]!), ...(pinnedCurve ? [pinnedCurve.db[k]!] : [])].map((x) =>
          typeof x === 'number' ? Number(x.toPrecision(8)) : x,
        ),
      );
    }
    downloadCsv(rows, `${fileStem}.csv`, exportConditions());
  };
  const downloadPlot = () =>
    plotRef.current &&
    downloadPng(plotRef.current, `${fileStem}.png`, { title: `Harness response: ${name}`, conditions: exportConditions() });
  const downloadNetlist = () =>
    netlist.mutate(
      { layout: design.layout, selector: design.selector, options: design.options, values: usedValues(design), knobs },
      { onSuccess: (text) => downloadText(text, `${fileStem}.cir`) },
    );

  // Listen: B is the design in the editor at its position and knobs, A the pinned design at its knobs
  const listenB = useMemo(() => {
    const d = listenInstrumentOf(instrumentOf(design, knobs) as ListenInstrument);
    return d ? { ...d, label: name } : null;
  }, [design, knobs, name]);
  const listenA = useMemo(() => {
    if (!pinned) return null;
    const d = listenInstrumentOf({ ...pinned.design, knobs: aKnobs } as ListenInstrument);
    return d ? { ...d, label: pinned.label } : null;
  }, [pinned, aKnobs]);
  const finderDesign = useMemo(
    () => ({ layout: design.layout, selector: design.selector, options: design.options, values: usedValues(design) }),
    [design],
  );
  // the first volume's law: `volume` → `volumeLaw`, `neck.volume` → `neck.volumeLaw`
  const volumeLaw = design.values[`${volumeKnobs(layout)[0]}Law`] as TaperLaw;

  return (
    <div>
      <PageHeader
        title="Harness"
        description="Pick a layout or a quick start, give it the parts you have, and turn the knobs: the curves show what the player will hear, computed here as you move them."
        actions={
          <>
            <Button
              size="sm"
              onClick={downloadNetlist}
              busy={netlist.isPending}
              busyText="Writing netlist…"
              disabled={!ok || invalid.length > 0}
            >
              SPICE netlist
            </Button>
            <Button size="sm" onClick={downloadCurves} disabled={!ok}>
              Curves (CSV)
            </Button>
            <Button size="sm" onClick={downloadPlot} disabled={!ok}>
              Plot (PNG)
            </Button>
          </>
        }
      />
      <HarnessSafetyNote className="mb-4" />
      {netlist.isError && (
        <div className="mb-4">
          <Alert title="The netlist could not be written">{netlist.error.message}</Alert>
        </div>
      )}

      <div className="grid gap-6 lg:grid-cols-[20rem_minmax(0,1fr)]">
        <div className="grid content-start gap-6 md:grid-cols-2 lg:grid-cols-1">
          <Panel id="harness-wiring" title="Wiring">
            <div className="space-y-3">
              <SelectField label="Layout" value={design.layout} onChange={(e) => switchLayout(e.currentTarget.value as LayoutId)}>
                {LAYOUTS.map((l) => (
                  <option key={l.id} value={l.id}>
                    {l.name}
                  </option>
                ))}
              </SelectField>
              <SelectField
                label="Quick start"
                value={quickStart ?? ''}
                onChange={(e) => e.currentTarget.value && quickStartTo(e.currentTarget.value as HarnessPresetId)}
                hint="One pickup with a preset's options; the values stay as they are"
              >
                {!quickStart && <option value="">{design.layout === 'one-pickup' ? 'Options as set below' : 'Choose one…'}</option>}
                {HARNESS_PRESETS.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.name}
                  </option>
                ))}
              </SelectField>
              <p className="text-sm text-ink-soft">{quickStart ? presetOf(quickStart).description : layout.description}</p>

              {multiPosition && (
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
                        className={`cursor-pointer rounded px-2.5 py-1 text-sm has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent ${design.selector === p.index ? 'bg-paper-bright font-medium shadow-sm' : 'text-ink-soft'}`}
                      >
                        <input
                          type="radio"
                          name="harness-selector"
                          className="sr-only"
                          checked={design.selector === p.index}
                          onChange={() => dispatch({ type: 'selector', index: p.index })}
                        />
                        {p.index}: {p.name}
                      </label>
                    ))}
                  </div>
                </fieldset>
              )}

              <fieldset className="space-y-2">
                <legend className="text-sm font-medium">Options</legend>
                {layout.options.map((o) => (
                  <SelectField
                    key={o.id}
                    label={o.name}
                    value={design.options[o.id]}
                    onChange={(e) => dispatch({ type: 'option', id: o.id, choice: e.currentTarget.value })}
                  >
                    {o.choices.map((c) => (
                      <option key={c.id} value={c.id}>
                        {c.name}
                      </option>
                    ))}
                  </SelectField>
                ))}
                <p className="text-xs text-ink-soft">The load&apos;s values (input resistance, cable) are under Part values below.</p>
              </fieldset>

              {design.loaded && (
                <p className="text-xs text-ink-soft">
                  Opened from the saved design <span className="font-medium text-ink">“{design.loaded.name}”</span>.
                </p>
              )}
              <div className="flex flex-wrap gap-2">
                <Button size="sm" onClick={pinCurrent} disabled={!ok || invalid.length > 0}>
                  {pinned ? 'Pin this as the new A' : 'Pin as A to compare'}
                </Button>
                <Button
                  size="sm"
                  variant="quiet"
                  onClick={() =>
                    dispatch({
                      type: 'replace',
                      state: quickStart
                        ? presetDesign(quickStart)
                        : initialDesign(design.layout, { selector: design.selector, options: design.options }),
                    })
                  }
                >
                  Back to typical values
                </Button>
              </div>
            </div>
          </Panel>
          <Panel id="harness-knobs" title="Knobs">
            <KnobSliders defs={layout.knobs} knobs={knobs} onChange={onKnobs} />
            <div className="mt-4">
              <FamilyToggle mode={mode} modes={modes} onChange={setFamily} volumeName={volumeName} toneName={toneName} />
            </div>
          </Panel>
        </div>

        <Panel
          id="harness-response"
          className="min-w-0"
          title={
            <span>
              Response{multiPosition ? ` at position ${design.selector} (${positionName})` : ''}:{' '}
              {layout.knobs.map((k, i) => (
                <span key={k.id}>
                  {i > 0 ? ', ' : ''}
                  {k.name.toLowerCase()} <span className="num">{formatKnob(knobs[k.id] ?? 10)}</span>
                </span>
              ))}
            </span>
          }
        >
          {invalid.length > 0 && (
            <div className="mb-3">
              <Alert tone="info">
                Some values are not readable; the curves use the last readable value of those fields until they are fixed.
              </Alert>
            </div>
          )}
          {ok && currentCurve ? (
            <>
              {ok.instrument.signal === 'cancelled' && (
                <div className="mb-3">
                  <Alert tone="info">
                    No signal (cancelled): the sources oppose and cancel exactly at this setting, so there is no curve and no figure to
                    show.
                  </Alert>
                </div>
              )}
              <ResponsePlot
                frequencies={ok.current.frequencies}
                current={currentCurve}
                family={familyCurves}
                pinned={pinnedCurve}
                onReady={(u) => (plotRef.current = u)}
                label={`Predicted response of the ${name} design (${designWords(design).toLowerCase()}): level in dB against frequency from 20 Hz to 20 kHz${familyCurves.length ? ', with lighter curves at other settings' : ''}`}
              />
              {multiPosition && (
                <p className="mt-2 text-sm text-ink-soft" data-testid="instrument-figures">
                  {ok.instrument.metrics
                    ? `${positionName}: resonance ${formatHz(ok.instrument.metrics.peak.frequency)}, ${formatDb(ok.instrument.metrics.peakRiseDb)} above the bass; −3 dB corner ${formatHz(ok.instrument.metrics.cornerHz)}; level at 1 kHz ${formatDb(ok.instrument.metrics.level1kDb)}.`
                    : `${positionName}: ${ok.instrument.note}.`}
                </p>
              )}
              <div className="mt-4">
                <MetricsTable analysis={ok} caption="Figures of the current setting" />
              </div>
              <p className="mt-3 text-xs text-ink-soft" data-testid="harness-simplifications">
                Simplifications: every pickup (and every coil) is an equal signal source of 1 V (a unit source), in phase or at 180° when
                reversed, so a combined position shows what the wiring does to equal signals, not what a string gives at two places; there
                is no mutual inductance between the coils of a dual-coil pickup; switches are ideal contacts.
              </p>
            </>
          ) : (
            <Alert>The wiring cannot be solved with these values: {b && 'error' in b ? b.error : ''}</Alert>
          )}
        </Panel>
      </div>

      {ok && (
        <div className="mt-6">
          <SweepsPanel analysis={ok} volumeLaw={volumeLaw} knobs={knobs} />
        </div>
      )}

      <div className="mt-6">
        <FinderPanel design={finderDesign} knobs={knobs} onApply={applyCandidate} />
      </div>

      {ok && (
        <div className="mt-6">
          <ListenPanel
            designs={{ A: listenA, B: listenB }}
            chainFor={(inputR, cable) => instrumentChainOf(instrumentOf(design, knobs) as ListenInstrument, inputR, cable)}
            instrument={design.layout !== 'one-pickup' ? designWords(design) : undefined}
          />
        </div>
      )}

      {pinned && ok && a && (
        <div className="mt-6">
          <ComparisonPanel
            pinned={pinned}
            a={a}
            design={design}
            bLabel={name}
            b={ok}
            knobs={knobs}
            onSwap={swap}
            onUnpin={() => setPinned(null)}
          />
        </div>
      )}

      <div className="mt-6">
        <Panel id="harness-values" title={`Part values — ${designWords(design)}`}>
          <p className="mb-3 text-sm text-ink-soft">
            Type values in engineering notation (22n, 4k7, 1meg). A value taken from a measured part (a pickup&apos;s coil fit, a pot&apos;s
            taper fit, a capacitor&apos;s latest capacitance reading) names the part under its field; typing over it unlinks it.
          </p>
          <ValuesEditor state={design} dispatch={dispatch} />
        </Panel>
      </div>

      <div className="mt-6">
        <DesignsPanel state={design} knobs={knobs} onOpen={openSaved} onPin={pinSaved} onSaved={onSaved} onDeleted={onDeleted} />
      </div>
    </div>
  );
}
