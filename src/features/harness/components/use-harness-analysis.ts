// Everything the screen draws, computed in the browser with the shared engine (the server runs the
// same code). The netlist is compiled once per change of preset or values; a knob change only
// re-stamps the pots and solves again (~0.1–0.5 ms a curve with its figures), so dragging a knob
// redraws at once.
import { useMemo } from 'react';
import { simulate, sweepKnobs, type KnobGrid, type SimulationResult } from '@shared/circuit/metrics';
import type { VolumeToneKnobs as Knobs } from '@shared/circuit/netlist';
import { getPreset, type HarnessPresetId, type HarnessValues } from '@shared/circuit/presets';
import { compileHarness, type CompiledHarness } from '@shared/circuit/solver';

export type FamilyMode = 'volume' | 'tone' | 'none';

/** The knob positions of the family of lighter curves. */
export const FAMILY_POSITIONS = [10, 8, 6, 4, 2] as const;

/**
 * Volume axis of the sweep plots: 0.25 to 10 in quarter steps. Volume 0 is left out: there the
 * output is the pot's 1 mΩ end-stop clamp (about −170 dB), silence rather than a point of a taper.
 */
export const TAPER_VOLUMES: readonly number[] = Array.from({ length: 40 }, (_, i) => (i + 1) / 4);
const DIAL = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
const ONE_K = [1000];

export interface HarnessAnalysis {
  compiled: CompiledHarness;
  current: SimulationResult;
  /** The current setting's sweep figures: volume taper and treble retention at this volume and tone. */
  point: { volumeTaperDb: number; trebleRetentionDb: number };
  /** Volume sweep at the current tone (TAPER_VOLUMES). */
  taper: KnobGrid;
  /** Interaction index over the 11 × 11 dial grid, dB. */
  interactionIndexDb: number;
}

export function compileDesign(preset: HarnessPresetId, values: HarnessValues): { compiled: CompiledHarness } | { error: string } {
  try {
    return { compiled: compileHarness(getPreset(preset)!.build(values)) };
  } catch (err) {
    return { error: err instanceof Error ? err.message : 'The wiring cannot be solved.' };
  }
}

/** The family of curves at the current knobs: other volume positions at this tone, or the reverse. */
export function familyGrid(compiled: CompiledHarness, knobs: Knobs, mode: FamilyMode): KnobGrid | null {
  if (mode === 'none') return null;
  return sweepKnobs(
    compiled,
    mode === 'volume' ? { volume: FAMILY_POSITIONS, tone: [knobs.tone] } : { volume: [knobs.volume], tone: FAMILY_POSITIONS },
  );
}

/**
 * The analysis of one design at the knobs. Memoised in three layers: the compiled netlist (values),
 * the sweeps that depend on the tone only, and the curve at the exact knobs.
 */
export function useHarnessAnalysis(
  design: { preset: HarnessPresetId; values: HarnessValues } | null,
  knobs: Knobs,
): HarnessAnalysis | { error: string } | null {
  const preset = design?.preset;
  const values = design?.values;
  const compiledOr = useMemo(() => (preset && values ? compileDesign(preset, values) : null), [preset, values]);
  const compiled = compiledOr && 'compiled' in compiledOr ? compiledOr.compiled : null;
  const interactionIndexDb = useMemo(
    () => (compiled ? sweepKnobs(compiled, { volume: DIAL, tone: DIAL }, ONE_K).interactionIndexDb : NaN),
    [compiled],
  );
  const taper = useMemo(
    () => (compiled ? sweepKnobs(compiled, { volume: TAPER_VOLUMES, tone: [knobs.tone] }, ONE_K) : null),
    [compiled, knobs.tone],
  );
  const current = useMemo(() => (compiled ? simulate(compiled, knobs) : null), [compiled, knobs]);
  const point = useMemo(() => {
    if (!compiled) return null;
    const g = sweepKnobs(compiled, { volume: [knobs.volume], tone: [knobs.tone] }, ONE_K);
    return { volumeTaperDb: g.volumeTaperDb[0]!, trebleRetentionDb: g.trebleRetentionDb[0]! };
  }, [compiled, knobs]);
  if (compiledOr === null) return null;
  if (!compiled || !taper || !current || !point)
    return { error: 'error' in compiledOr ? compiledOr.error : 'The wiring cannot be solved.' };
  return { compiled, current, point, taper, interactionIndexDb };
}
