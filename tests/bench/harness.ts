// Harness engine benchmark (docs/computation.md §7): for each preset, the 11 × 11 knob grid × 151
// frequencies through the engine (warm median) and through ngspice (warm, one netlist per knob
// setting from the engine's SPICE export, `.ac dec 50 20 20k` = the same 151 points) in the same
// run, the largest dB difference between the two grids, and one 151-point curve with its metrics.
import { Ngspice } from '../support/ngspice';
import { timeMedian, timeMedianAsync, type BenchFigure } from './report';
import { HARNESS_PRESETS } from '@shared/circuit/presets';
import { compileHarness } from '@shared/circuit/solver';
import { gridCurve, simulate, sweepKnobs } from '@shared/circuit/metrics';
import { toSpiceNetlist } from '@shared/circuit/spice';

const KNOBS = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
const fmt = (ms: number) => (ms < 1 ? `${(ms * 1000).toFixed(0)} µs` : `${ms.toFixed(2)} ms`);

export async function bench(): Promise<BenchFigure[]> {
  const figures: BenchFigure[] = [];
  const ng = new Ngspice();
  await ng.start();
  for (const preset of HARNESS_PRESETS) {
    const netlist = preset.build(preset.defaults);
    const compiled = compileHarness(netlist);

    // ngspice: the same 121 settings, netlists written beforehand so only the simulation is timed.
    const decks: string[] = [];
    for (const tone of KNOBS) for (const volume of KNOBS) decks.push(toSpiceNetlist(netlist, { volume, tone }));
    const spiceDb: number[][] = [];
    let spiceFrequencies: number[] = [];
    const spiceMs = await timeMedianAsync(
      async () => {
        spiceDb.length = 0;
        for (const deck of decks) {
          const r = await ng.runAc(deck);
          spiceFrequencies = r.frequencies;
          spiceDb.push(r.nodes.out!.map((z) => 10 * Math.log10(z.re * z.re + z.im * z.im)));
        }
      },
      3,
      1,
    );

    // engine: the full grid with its sweep figures, on the default 151-point axis
    const engineMs = timeMedian(() => sweepKnobs(compiled, { volume: KNOBS, tone: KNOBS }), 30, 10);

    // agreement: the engine's grid at exactly ngspice's frequencies
    const check = sweepKnobs(compiled, { volume: KNOBS, tone: KNOBS }, spiceFrequencies);
    let maxDb = 0;
    KNOBS.forEach((_, ti) =>
      KNOBS.forEach((__, vi) => {
        const ours = gridCurve(check, vi, ti);
        const theirs = spiceDb[ti * KNOBS.length + vi]!;
        theirs.forEach((x, k) => (maxDb = Math.max(maxDb, Math.abs(x - ours[k]!))));
      }),
    );

    const ratio = spiceMs / engineMs;
    figures.push({
      name: `harness grid 11×11×151, ${preset.id}`,
      measured: `${fmt(engineMs)} (max |ΔdB| vs ngspice ${maxDb.toExponential(1)})`,
      reference: `ngspice warm ${fmt(spiceMs)} (ratio ${ratio.toFixed(0)}×)`,
      goal: '≤ 4 ms, ≥ 50× ngspice, ≤ 0.001 dB',
      met: engineMs <= 4 && ratio >= 50 && maxDb <= 0.001,
    });

    // one curve with its metrics while a knob is dragged (the volume changes on every call)
    let step = 0;
    const curveMs = timeMedian(() => simulate(compiled, { volume: (step++ % 101) / 10, tone: 6 }), 200, 50);
    figures.push({
      name: `harness curve 151 points + metrics, ${preset.id}`,
      measured: fmt(curveMs),
      reference: `ngspice warm, one setting ${fmt(spiceMs / decks.length)}`,
      goal: '≤ 0.3 ms',
      met: curveMs <= 0.3,
    });
  }
  return figures;
}
