// Harness engine benchmark (docs/computation.md §7): for each preset, the 11 × 11 knob grid × 151
// frequencies through the engine (warm median) and through ngspice (warm, one netlist per knob
// setting from the engine's SPICE export, `.ac dec 50 20 20k` = the same 151 points) in the same
// run, the largest dB difference between the two grids, and one 151-point curve with its metrics.
import { Ngspice } from '../support/ngspice';
import { timeMedian, timeMedianAsync, type BenchFigure } from './report';
import { HARNESS_PRESETS } from '@shared/circuit/presets';
import { compileHarness } from '@shared/circuit/solver';
import { gridCurve, simulate, simulateInstrument, sweepKnobs } from '@shared/circuit/metrics';
import { findBleed } from '@shared/circuit/bleed-finder';
import { buildLayoutNetlist, LAYOUTS, layoutKnobs, resolveLayoutConfig, toneKnobs, volumeKnobs } from '@shared/circuit/layouts';
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
  figures.push(...(await benchLayouts(ng)));
  return figures;
}

/**
 * The whole-instrument figures, per layout at its busiest position (the most pickups joined):
 * one curve with metrics and per-pickup transfers, the 11-position volume family, every selector
 * position at the current knobs, and the treble-bleed finder (E12 and E24), each beside ngspice
 * running the same work in this run (one warm setting, scaled by the number of settings).
 */
export async function benchLayouts(ng: Ngspice): Promise<BenchFigure[]> {
  const figures: BenchFigure[] = [];
  for (const layout of LAYOUTS) {
    const busiest = layout.selector.positions.length === 3 ? 1 : layout.selector.positions.length === 5 ? 3 : 0;
    const { config } = resolveLayoutConfig(layout, { selector: busiest, options: { bleed: 'cap-parallel-r' } });
    const netlist = buildLayoutNetlist(layout, config);
    const compiled = compileHarness(netlist);
    const knobs = layoutKnobs(layout, Object.fromEntries(layout.knobs.map((k) => [k.id, 6])));
    const vk = volumeKnobs(layout)[0]!;
    const tk = toneKnobs(layout)[0]!;
    const deck = toSpiceNetlist(netlist, knobs);
    const oneSpiceMs = await timeMedianAsync(() => ng.runAc(deck), 10, 2);

    let step = 0;
    const curveMs = timeMedian(() => simulateInstrument(compiled, { ...knobs, [vk]: (step++ % 101) / 10 }), 200, 50);
    figures.push({
      name: `harness curve 151 points + metrics + per pickup, ${layout.id} position ${busiest}`,
      measured: fmt(curveMs),
      reference: `ngspice warm, one setting ${fmt(oneSpiceMs)}`,
      goal: '≤ 0.3 ms',
      met: curveMs <= 0.3,
    });

    const familyMs = timeMedian(
      () => sweepKnobs(compiled, { volume: KNOBS, tone: [knobs[tk]!] }, undefined, { volumeKnob: vk, toneKnob: tk, knobs }),
      50,
      10,
    );
    figures.push({
      name: `harness volume family (11 curves), ${layout.id}`,
      measured: fmt(familyMs),
      reference: `ngspice warm, 11 settings ≈ ${fmt(11 * oneSpiceMs)}`,
      goal: '≤ 3 ms',
      met: familyMs <= 3,
    });

    // every selector position at the current knobs: build, compile and solve each (the screen's overlay)
    const positionsMs = timeMedian(
      () => {
        for (const pos of layout.selector.positions) {
          const c = resolveLayoutConfig(layout, { selector: pos.index, options: config.options }).config;
          simulateInstrument(compileHarness(buildLayoutNetlist(layout, c)), knobs);
        }
      },
      50,
      10,
    );
    figures.push({
      name: `harness every selector position (${layout.selector.positions.length}), ${layout.id}`,
      measured: fmt(positionsMs),
      reference: `ngspice warm, ${layout.selector.positions.length} settings ≈ ${fmt(layout.selector.positions.length * oneSpiceMs)}`,
      goal: '≤ 3 ms',
      met: positionsMs <= 3,
    });

    for (const series of ['E12', 'E24'] as const) {
      let evaluated = 0;
      const finderMs = timeMedian(() => (evaluated = findBleed(layout, config, knobs, { series }).evaluated), 5, 1);
      // ngspice would run every candidate at 9 volume settings (3 probe frequencies each, like the engine)
      figures.push({
        name: `treble-bleed finder ${series} (${evaluated} candidates × 9 volumes), ${layout.id}`,
        measured: fmt(finderMs),
        reference: `ngspice warm ≈ ${((evaluated * 9 * oneSpiceMs) / 1000).toFixed(0)} s (one setting × candidates × volumes)`,
        goal: series === 'E12' ? '≤ 300 ms' : '≤ 1.2 s',
        met: finderMs <= (series === 'E12' ? 300 : 1200),
      });
    }
  }
  return figures;
}
