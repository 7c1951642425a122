// The Harness screen: choose a wiring, set its part values (typed or measured), turn the knobs and
// see the predicted response at once, with the volume taper, the treble retention, A/B comparison,
// saved designs and downloads. All curves are computed in the browser with the shared engine.
import { HarnessSafetyNote } from '@/components/safety/safety-notes';
import { useCallback, useMemo, useReducer, useRef, useState } from 'react';
import type uPlot from 'uplot';
import { gridCurve } from '@shared/circuit/metrics';
import type { VolumeToneKnobs as Knobs } from '@shared/circuit/netlist';
import { HARNESS_PRESETS, type HarnessPresetId } from '@shared/circuit/presets';
import type { HarnessDesign } from '@shared/schemas/harness';
import { downloadPng } from '@/components/charts/plot';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/field';
import { PageHeader, Panel } from '@/components/ui/page-header';
import { downloadCsv, downloadText } from '@/lib/download';
import { useSpiceNetlist } from '../api/get-netlist';
import { ComparisonPanel, type PinnedDesign } from './comparison-panel';
import { activeErrors, designFromSaved, designReducer, initialDesign, presetOf, usedValues } from './design-state';
import { DesignsPanel, type PresetDesign } from './designs-panel';
import { InstrumentPanel } from './instrument-panel';
import { formatKnob } from './harness-format';
import { harnessConditions } from './harness-conditions';
import { KnobSliders } from './knob-sliders';
import { instrumentChainOf, listenDesignOf, listenInstrumentOf, recordingChainOf, type ListenInstrument } from './listen-design';
import { ListenPanel } from './listen-panel';
import { MetricsTable } from './metrics-table';
import { ResponsePlot, type Curve } from './response-plot';
import { SweepsPanel } from './sweeps-panel';
import { FAMILY_POSITIONS, familyGrid, useHarnessAnalysis, type FamilyMode } from './use-harness-analysis';
import { ValuesEditor } from './values-editor';

const FAMILY_LABEL: Record<FamilyMode, string> = { volume: 'Volume', tone: 'Tone', none: 'None' };

function FamilyToggle({ mode, onChange }: { mode: FamilyMode; onChange: (m: FamilyMode) => void }) {
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-medium">Lighter curves at other positions of</legend>
      <div className="inline-flex rounded-md border border-paper-edge bg-paper-deep p-0.5">
        {(Object.keys(FAMILY_LABEL) as FamilyMode[]).map((m) => (
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
        {mode === 'volume'
          ? 'Volume at 10, 8, 6, 4 and 2 with the tone where it is.'
          : mode === 'tone'
            ? 'Tone at 10, 8, 6, 4 and 2 with the volume where it is.'
            : 'Only the current setting.'}
      </p>
    </fieldset>
  );
}

const fileKnobs = (k: Knobs) => `v${formatKnob(k.volume)}-t${formatKnob(k.tone)}`;

export function HarnessScreen() {
  const [design, dispatch] = useReducer(designReducer, undefined, () => initialDesign());
  const [knobs, setKnobs] = useState<Knobs>({ volume: 10, tone: 10 });
  const [family, setFamily] = useState<FamilyMode>('volume');
  const [pinned, setPinned] = useState<PinnedDesign | null>(null);
  // the whole instrument, once the instrument panel is in use: Listen plays it at its selector position and knobs
  const [instrument, setInstrument] = useState<ListenInstrument | null>(null);
  const instrumentDesign = useMemo(() => (instrument ? listenInstrumentOf(instrument) : null), [instrument]);
  const plotRef = useRef<uPlot | null>(null);
  const netlist = useSpiceNetlist();

  const onKnobs = useCallback((k: Knobs) => setKnobs({ volume: Math.round(k.volume * 10) / 10, tone: Math.round(k.tone * 10) / 10 }), []);
  const b = useHarnessAnalysis(design, knobs);
  const a = useHarnessAnalysis(pinned, knobs);
  const preset = presetOf(design.preset);
  const invalid = activeErrors(design);

  const familyCurves = useMemo<Curve[]>(() => {
    if (!b || 'error' in b) return [];
    const grid = familyGrid(b.compiled, knobs, family);
    if (!grid) return [];
    return FAMILY_POSITIONS.map((pos, i) => ({
      label: family === 'volume' ? `Volume ${pos}` : `Tone ${pos}`,
      db: family === 'volume' ? gridCurve(grid, i, 0) : gridCurve(grid, 0, i),
    }));
  }, [b, knobs, family]);

  const currentCurve = useMemo<Curve | null>(
    () => (b && !('error' in b) ? { label: pinned ? 'B: now' : 'Now', db: b.current.magnitudeDb } : null),
    [b, pinned],
  );
  const pinnedCurve = useMemo<Curve | null>(
    () => (pinned && a && !('error' in a) ? { label: `A: ${pinned.label}`, db: a.current.magnitudeDb } : null),
    [pinned, a],
  );

  const openSaved = useCallback((d: PresetDesign) => dispatch({ type: 'replace', state: designFromSaved(d) }), []);
  const pinSaved = useCallback((d: PresetDesign) => {
    const s = designFromSaved(d);
    setPinned({ label: d.name, preset: s.preset, values: s.values });
  }, []);
  const onSaved = useCallback(
    (d: HarnessDesign) => dispatch({ type: 'saved', loaded: { id: d.id, name: d.name, notes: d.notes, ownerId: d.ownerId } }),
    [],
  );
  const onDeleted = useCallback((id: number) => dispatch({ type: 'deleted', id }), []);
  const pinCurrent = () => setPinned({ label: design.loaded?.name ?? preset.name, preset: design.preset, values: design.values });
  const swap = () => {
    if (!pinned) return;
    setPinned({ label: design.loaded?.name ?? preset.name, preset: design.preset, values: design.values });
    dispatch({ type: 'replace', state: initialDesign(pinned.preset, pinned.values) });
  };

  const downloadCurves = () => {
    if (!b || 'error' in b) return;
    const f = b.current.frequencies;
    const slug = (t: string) =>
      t
        .toLowerCase()
        .replace(/[^a-z0-9.]+/g, '_')
        .replace(/^_|_$/g, '');
    const header = [
      'frequency_Hz',
      `${pinnedCurve ? 'B_' : ''}now_v${formatKnob(knobs.volume)}_t${formatKnob(knobs.tone)}_dB`,
      // e.g. volume_8_t10.0_dB: volume 8 at the current tone (or tone_8_v6.5_dB).
      ...familyCurves.map(
        (c) => `${slug(c.label)}_${family === 'volume' ? `t${formatKnob(knobs.tone)}` : `v${formatKnob(knobs.volume)}`}_dB`,
      ),
      ...(pinnedCurve && pinned ? [`A_${slug(pinned.label)}_v${formatKnob(knobs.volume)}_t${formatKnob(knobs.tone)}_dB`] : []),
    ];
    const rows: (string | number)[][] = [header];
    for (let k = 0; k < f.length; k++) {
      rows.push(
        [f[k]!, b.current.magnitudeDb[k]!, ...familyCurves.map((c) => c.db[k]!), ...(pinnedCurve ? [pinnedCurve.db[k]!] : [])].map((x) =>
          typeof x === 'number' ? Number(x.toPrecision(8)) : x,
        ),
      );
    }
    downloadCsv(rows, `harness-${design.preset}-${fileKnobs(knobs)}.csv`, exportConditions());
  };
  // What the curves were computed for; the pinned design A is named when its curve is in the export.
  const exportConditions = () =>
    harnessConditions(design, knobs, [
      {
        key: 'lighter curves',
        value:
          familyCurves.length > 0
            ? family === 'volume'
              ? `volume at ${FAMILY_POSITIONS.join(', ')}`
              : `tone at ${FAMILY_POSITIONS.join(', ')}`
            : 'none',
      },
      { key: 'pinned design A', value: pinnedCurve && pinned ? pinned.label : 'none' },
      { key: 'computed', value: 'circuit model in Lugbook (not measured)' },
    ]);
  const downloadPlot = () =>
    plotRef.current &&
    downloadPng(plotRef.current, `harness-${design.preset}-${fileKnobs(knobs)}.png`, {
      title: `Harness response: ${design.loaded?.name ?? preset.name}`,
      conditions: exportConditions(),
    });
  const downloadNetlist = () =>
    netlist.mutate(
      { preset: design.preset, values: usedValues(design.preset, design.values), knobs },
      { onSuccess: (text) => downloadText(text, `harness-${design.preset}-${fileKnobs(knobs)}.cir`) },
    );

  const ok = b && !('error' in b) ? b : null;

  return (
    <div>
      <PageHeader
        title="Harness"
        description="Pick a wiring, give it the parts you have, and turn the knobs: the curves show what the player will hear, computed here as you move them."
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

      <div className="grid gap-6 lg:grid-cols-[19rem_minmax(0,1fr)]">
        <div className="grid content-start gap-6 md:grid-cols-2 lg:grid-cols-1">
          <Panel id="harness-wiring" title="Wiring">
            <SelectField
              label="Preset"
              value={design.preset}
              onChange={(e) => dispatch({ type: 'preset', preset: e.currentTarget.value as HarnessPresetId })}
            >
              {HARNESS_PRESETS.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </SelectField>
            <p className="mt-2 text-sm text-ink-soft">{preset.description}</p>
            {design.loaded && (
              <p className="mt-2 text-xs text-ink-soft">
                Opened from the saved design <span className="font-medium text-ink">“{design.loaded.name}”</span>.
              </p>
            )}
            <div className="mt-3 flex flex-wrap gap-2">
              <Button size="sm" onClick={pinCurrent} disabled={!ok || invalid.length > 0}>
                {pinned ? 'Pin this as the new A' : 'Pin as A to compare'}
              </Button>
              <Button size="sm" variant="quiet" onClick={() => dispatch({ type: 'replace', state: initialDesign(design.preset) })}>
                Back to typical values
              </Button>
            </div>
          </Panel>
          <Panel id="harness-knobs" title="Knobs">
            <KnobSliders knobs={knobs} onChange={onKnobs} />
            <div className="mt-4">
              <FamilyToggle mode={family} onChange={setFamily} />
            </div>
          </Panel>
        </div>

        <Panel
          id="harness-response"
          className="min-w-0"
          title={
            <span>
              Response at volume <span className="num">{formatKnob(knobs.volume)}</span>, tone{' '}
              <span className="num">{formatKnob(knobs.tone)}</span>
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
              <ResponsePlot
                frequencies={ok.current.frequencies}
                current={currentCurve}
                family={familyCurves}
                pinned={pinnedCurve}
                onReady={(u) => (plotRef.current = u)}
                label={`Predicted response of the ${preset.name.toLowerCase()} wiring: level in dB against frequency from 20 Hz to 20 kHz, at volume ${formatKnob(knobs.volume)} and tone ${formatKnob(knobs.tone)}`}
              />
              <div className="mt-4">
                <MetricsTable analysis={ok} caption="Figures of the current setting" />
              </div>
            </>
          ) : (
            <Alert>The wiring cannot be solved with these values: {b && 'error' in b ? b.error : ''}</Alert>
          )}
        </Panel>
      </div>

      <div className="mt-6">
        <InstrumentPanel onChange={setInstrument} />
      </div>

      {ok && (
        <div className="mt-6">
          <SweepsPanel analysis={ok} volumeLaw={design.values.volumeLaw} knobs={knobs} />
        </div>
      )}

      {ok && (
        <div className="mt-6">
          <ListenPanel
            designs={{
              A: pinned ? listenDesignOf(pinned.label, pinned.preset, pinned.values, knobs) : null,
              B: instrumentDesign ?? listenDesignOf(design.loaded?.name ?? preset.name, design.preset, design.values, knobs),
            }}
            chainFor={(inputR, cable) =>
              instrument && instrumentDesign
                ? instrumentChainOf(instrument, inputR, cable)
                : recordingChainOf(design.preset, design.values, inputR, cable)
            }
            instrument={instrument && instrumentDesign ? instrumentDesign.label : undefined}
          />
        </div>
      )}

      {pinned && ok && a && (
        <div className="mt-6">
          <ComparisonPanel
            pinned={pinned}
            a={a}
            preset={design.preset}
            values={design.values}
            b={ok}
            knobs={knobs}
            onSwap={swap}
            onUnpin={() => setPinned(null)}
          />
        </div>
      )}

      <div className="mt-6">
        <Panel id="harness-values" title={`Part values — ${preset.name}`}>
          <p className="mb-3 text-sm text-ink-soft">
            Type values in engineering notation (22n, 4k7, 1meg). A value taken from a measured part names the part under its field; typing
            over it unlinks it.
          </p>
          <ValuesEditor state={design} dispatch={dispatch} />
        </Panel>
      </div>

      <div className="mt-6">
        <DesignsPanel state={design} onOpen={openSaved} onPin={pinSaved} onSaved={onSaved} onDeleted={onDeleted} />
      </div>
    </div>
  );
}
