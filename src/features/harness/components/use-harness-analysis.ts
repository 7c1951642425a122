// Everything the screen draws, computed in the browser with the shared engine (the server runs the
// same code). The layout's netlist is compiled once per change of layout, position, options or
// values; a knob change only re-stamps the pots and solves again (~0.1–0.5 ms a curve with its
// figures), so dragging a knob redraws at once.
import { useMemo } from 'react';
import {
  buildLayoutNetlist,
  getLayout,
  layoutKnobs,
  resolveLayoutConfig,
  toneKnobs,
  volumeKnobs,
  type LayoutDef,
  type LayoutValue,
} from '@shared/circuit/layouts';
import {
  simulate,
  simulateInstrument,
  sweepKnobs,
  type InstrumentResult,
  type KnobGrid,
  type SimulationResult,
} from '@shared/circuit/metrics';
import { compileHarness, type CompiledHarness } from '@shared/circuit/solver';

export type FamilyMode = 'positions' | 'volume' | 'tone' | 'none';

/** The knob positions of the family of lighter curves. */
export const FAMILY_POSITIONS = [10, 8, 6, 4, 2] as const;

/**
 * Volume axis of the sweep plots: 0.25 to 10 in quarter steps. Volume 0 is left out: there the
 * output is the pot's 1 mΩ end-stop clamp (about −170 dB), silence rather than a point of a taper.
 */
export const TAPER_VOLUMES: readonly number[] = Array.from({ length: 40 }, (_, i) => (i + 1) / 4);
const DIAL = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
const ONE_K = [1000];

/** The instrument a curve is computed for. */
export interface DesignInput {
  layout: string;
  selector: number;
  options: Record<string, string>;
  values: Record<string, LayoutValue>;
}

/** The two knobs the sweeps turn: the layout's first volume and first tone; the other knobs stay where they are. */
export interface SweepAxes {
  volumeKnob: string;
  toneKnob: string;
}

export const axesOf = (layout: LayoutDef): SweepAxes => ({ volumeKnob: volumeKnobs(layout)[0]!, toneKnob: toneKnobs(layout)[0]! });

export interface HarnessAnalysis {
  layout: LayoutDef;
  axes: SweepAxes;
  compiled: CompiledHarness;
  current: SimulationResult;
  /** The same curve as the sum of one source per pickup or coil: each pickup's own curve, and whether the sources cancel. */
  instrument: InstrumentResult;
  /** The current setting's sweep figures: volume taper and treble retention at this volume and tone. */
  point: { volumeTaperDb: number; trebleRetentionDb: number };
  /** Volume sweep at the current tone (TAPER_VOLUMES). */
  taper: KnobGrid;
  /** Interaction index over the 11 × 11 dial grid, dB. */
  interactionIndexDb: number;
}

export function compileDesign(d: DesignInput, selector = d.selector): { compiled: CompiledHarness } | { error: string } {
  const layout = getLayout(d.layout);
  if (!layout) return { error: `Unknown layout "${d.layout}".` };
  const { config, problems } = resolveLayoutConfig(layout, { selector, options: d.options, values: d.values });
  if (problems.length > 0) return { error: problems[0]!.message };
  try {
    return { compiled: compileHarness(buildLayoutNetlist(layout, config)) };
  } catch (err) {
    return { error: err instanceof Error ? err.message : 'The wiring cannot be solved.' };
  }
}

/** The family of curves at the current knobs: other volume positions at this tone, or the reverse. */
export function familyGrid(compiled: CompiledHarness, knobs: Record<string, number>, mode: FamilyMode, axes: SweepAxes): KnobGrid | null {
  if (mode !== 'volume' && mode !== 'tone') return null;
  const v = knobs[axes.volumeKnob] ?? 10;
  const t = knobs[axes.toneKnob] ?? 10;
  return sweepKnobs(
    compiled,
    mode === 'volume' ? { volume: FAMILY_POSITIONS, tone: [t] } : { volume: [v], tone: FAMILY_POSITIONS },
    undefined,
    {
      ...axes,
      knobs,
    },
  );
}

/**
 * The analysis of one design at the knobs (a record by knob id; missing knobs at 10). Memoised in
 * three layers: the compiled netlist (values), the sweeps that depend on the tone only, and the
 * curve at the exact knobs.
 */
export function useHarnessAnalysis(
  design: DesignInput | null,
  knobsIn: Record<string, number>,
): HarnessAnalysis | { error: string } | null {
  const layoutId = design?.layout;
  const selector = design?.selector;
  const options = design?.options;
  const values = design?.values;
  const layout = layoutId ? (getLayout(layoutId) ?? null) : null;
  const knobsKey = JSON.stringify(knobsIn);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- the knobs enter through their text, so a new object with the same settings does not recompute
  const knobs = useMemo(() => (layout ? layoutKnobs(layout, knobsIn) : {}), [layout, knobsKey]);
  const compiledOr = useMemo(
    () => (layoutId && options && values && selector !== undefined ? compileDesign({ layout: layoutId, selector, options, values }) : null),
    [layoutId, selector, options, values],
  );
  const compiled = compiledOr && 'compiled' in compiledOr ? compiledOr.compiled : null;
  const axes = useMemo(() => (layout ? axesOf(layout) : null), [layout]);
  // the other knobs, as the text of their settings: a move of the volume or tone axis leaves them alone
  const others = axes ? JSON.stringify(Object.entries(knobs).filter(([k]) => k !== axes.volumeKnob && k !== axes.toneKnob)) : '';
  const tone = axes ? (knobs[axes.toneKnob] ?? 10) : 10;
  const interactionIndexDb = useMemo(
    () => (compiled && axes ? sweepKnobs(compiled, { volume: DIAL, tone: DIAL }, ONE_K, { ...axes, knobs }).interactionIndexDb : NaN),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- depends on the knobs off the two axes only (`others`)
    [compiled, axes, others],
  );
  const taper = useMemo(
    () => (compiled && axes ? sweepKnobs(compiled, { volume: TAPER_VOLUMES, tone: [tone] }, ONE_K, { ...axes, knobs }) : null),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- depends on the tone and the knobs off the two axes only
    [compiled, axes, tone, others],
  );
  const current = useMemo(() => (compiled ? simulate(compiled, knobs) : null), [compiled, knobs]);
  const instrument = useMemo(() => (compiled ? simulateInstrument(compiled, knobs) : null), [compiled, knobs]);
  const point = useMemo(() => {
    if (!compiled || !axes) return null;
    const g = sweepKnobs(compiled, { volume: [knobs[axes.volumeKnob] ?? 10], tone: [tone] }, ONE_K, { ...axes, knobs });
    return { volumeTaperDb: g.volumeTaperDb[0]!, trebleRetentionDb: g.trebleRetentionDb[0]! };
  }, [compiled, axes, knobs, tone]);
  if (compiledOr === null || !layout || !axes) return null;
  if (!compiled || !taper || !current || !point || !instrument)
    return { error: 'error' in compiledOr ? compiledOr.error : 'The wiring cannot be solved.' };
  return { layout, axes, compiled, current, instrument, point, taper, interactionIndexDb };
}

/** Every selector position of the design at the current knobs (one compile per position). */
export function usePositionCurves(
  design: DesignInput | null,
  knobs: Record<string, number>,
): { index: number; name: string; db: Float64Array }[] {
  const layout = design ? getLayout(design.layout) : undefined;
  const options = design?.options;
  const values = design?.values;
  const compiled = useMemo(
    () =>
      layout && options && values && layout.selector.positions.length > 1
        ? layout.selector.positions.map((p) => ({
            p,
            c: compileDesign({ layout: layout.id, selector: p.index, options, values }, p.index),
          }))
        : [],
    [layout, options, values],
  );
  const knobsKey = JSON.stringify(knobs);
  return useMemo(
    () =>
      compiled.flatMap(({ p, c }) =>
        'compiled' in c ? [{ index: p.index, name: p.name, db: simulate(c.compiled, layoutKnobs(layout!, knobs)).magnitudeDb }] : [],
      ),
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the knobs enter through their text
    [compiled, knobsKey],
  );
}
