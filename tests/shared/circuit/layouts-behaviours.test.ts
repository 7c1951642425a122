// Behaviours of the whole-instrument layouts that the trade describes (common practice, no
// published source, unless named), with the default cable (3 m at 100 pF/m) and amplifier (1 MΩ).
import { describe, expect, it } from 'vitest';
import { bleedCurves, bleedFigures, findBleed } from '@shared/circuit/bleed-finder';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig } from '@shared/circuit/layouts';
import { simulateInstrument, sweepKnobs } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';
import { compileHarness, setKnobs, solvePoint } from '@shared/circuit/solver';

function instrument(
  layoutId: string,
  input: { selector?: number; options?: Record<string, string>; values?: Record<string, unknown> } = {},
) {
  const layout = getLayout(layoutId)!;
  const { config, problems } = resolveLayoutConfig(layout, input);
  expect(problems).toEqual([]);
  return { layout, config, netlist: buildLayoutNetlist(layout, config) };
}

function levelAt(netlist: Netlist, knobs: Record<string, number>, f: number): number {
  const c = compileHarness(netlist);
  setKnobs(c, knobs);
  solvePoint(c, f);
  return 10 * Math.log10(c.hRe * c.hRe + c.hIm * c.hIm);
}

describe('dual-coil switching (common practice)', () => {
  const peak = (coils: string) => simulateInstrument(instrument('dual-coil', { options: { coils } }).netlist, {}).metrics!.peak;

  it('under load, series coils resonate lower than one coil, and one coil lower than parallel', () => {
    const series = peak('series');
    const single = peak('single');
    const parallel = peak('parallel');
    expect(series.interior && single.interior && parallel.interior).toBe(true);
    expect(series.frequency).toBeLessThan(single.frequency);
    expect(single.frequency).toBeLessThan(parallel.frequency);
  });

  it('unloaded, the three coincide (L·C and the coil Q are the same in each)', () => {
    // The coils alone into an (almost) open output: 1 TΩ, no pots, no cable.
    const coil = { R: 4e3, L: 2.2, C: 240e-12 };
    const open = { kind: 'resistor' as const, id: 'open', a: 'out', b: '0', R: 1e12 };
    const series: Netlist = {
      parts: [
        { kind: 'pickup', id: 'n', hot: 'mid', cold: '0', ...coil },
        { kind: 'pickup', id: 's', hot: 'out', cold: 'mid', ...coil },
        open,
      ],
    };
    const parallel: Netlist = {
      parts: [
        { kind: 'pickup', id: 'n', hot: 'out', cold: '0', ...coil },
        { kind: 'pickup', id: 's', hot: 'out', cold: '0', ...coil },
        open,
      ],
    };
    const single: Netlist = { parts: [{ kind: 'pickup', id: 'n', hot: 'out', cold: '0', ...coil }, open] };
    const f = [series, parallel, single].map((n) => simulateInstrument(n, {}).metrics!.peak.frequency);
    expect(Math.abs(f[0]! / f[2]! - 1)).toBeLessThan(1e-6);
    expect(Math.abs(f[1]! / f[2]! - 1)).toBeLessThan(1e-6);
  });

  it('series gives more output at 200 Hz than parallel', () => {
    const s = levelAt(instrument('dual-coil', { options: { coils: 'series' } }).netlist, {}, 200);
    const p = levelAt(instrument('dual-coil', { options: { coils: 'parallel' } }).netlist, {}, 200);
    expect(s).toBeGreaterThan(p + 3);
  });

  it('a reversed coil cancels: "no signal (cancelled)", no figures', () => {
    const r = simulateInstrument(instrument('dual-coil', { options: { coils: 'series-reversed' } }).netlist, {});
    expect(r.signal).toBe('cancelled');
    expect(r.note).toBe('no signal (cancelled)');
    expect(r.metrics).toBeNull();
    // With unlike coils the reversed pair leaves a (thin) signal, not a cancellation.
    const unlike = simulateInstrument(
      instrument('dual-coil', { options: { coils: 'series-reversed' }, values: { 'south.pickupL': 2.6 } }).netlist,
      {},
    );
    expect(unlike.signal).toBe('present');
    expect(unlike.metrics).not.toBeNull();
  });
});

describe('phase and selector (common practice)', () => {
  it('reversed phase in a combined position loses at least 10 dB at 200 Hz against in phase', () => {
    for (const [layoutId, selector] of [
      ['two-pickups-3way', 1],
      ['three-pickups-5way', 1],
      ['three-pickups-5way', 3],
    ] as const) {
      const inPhase = levelAt(instrument(layoutId, { selector }).netlist, {}, 200);
      const reversed = levelAt(instrument(layoutId, { selector, options: { phase: 'reversed' } }).netlist, {}, 200);
      expect(inPhase - reversed, `${layoutId} position ${selector}`).toBeGreaterThanOrEqual(10);
    }
  });

  it('per-pickup transfers add up to the output, and a reversed pickup enters negated', () => {
    const { netlist } = instrument('two-pickups-3way', { selector: 1, options: { phase: 'reversed' } });
    const r = simulateInstrument(netlist, { 'neck.volume': 6 });
    expect(r.perPickup.map((p) => p.pickupId)).toEqual(['neck', 'bridge']);
    const c = compileHarness(netlist);
    setKnobs(c, { 'neck.volume': 6 });
    solvePoint(c, r.frequencies[40]!);
    let re = 0;
    let im = 0;
    for (const p of r.perPickup) {
      const a = 10 ** (p.magnitudeDb[40]! / 20);
      re += a * Math.cos((p.phaseDeg[40]! * Math.PI) / 180);
      im += a * Math.sin((p.phaseDeg[40]! * Math.PI) / 180);
    }
    expect(Math.hypot(re - c.hRe, im - c.hIm)).toBeLessThan(1e-12);
    // The bridge alone (reversed) is the in-phase bridge alone, turned by 180°.
    const inPhase = simulateInstrument(instrument('two-pickups-3way', { selector: 1 }).netlist, { 'neck.volume': 6 });
    const d = r.perPickup[1]!.phaseDeg[40]! - inPhase.perPickup[1]!.phaseDeg[40]!;
    expect(Math.abs(Math.abs(((d + 540) % 360) - 180) - 180)).toBeLessThan(1e-9);
  });

  it('standard volume wiring silences "both" at one volume 0; independent wiring does not', () => {
    const knobs = { 'neck.volume': 0, 'bridge.volume': 10 };
    const standard = levelAt(instrument('two-pickups-3way', { selector: 1 }).netlist, knobs, 1000);
    const independent = levelAt(
      instrument('two-pickups-3way', { selector: 1, options: { volumeWiring: 'independent' } }).netlist,
      knobs,
      1000,
    );
    expect(standard).toBeLessThan(-100);
    expect(independent).toBeGreaterThan(-12);
  });
});

describe('the load (COMPUTATION notes: common practice, from memory)', () => {
  it('into a low-impedance pedal the peak height and the −3 dB corner fall', () => {
    const amp = simulateInstrument(instrument('one-pickup').netlist, {}).metrics!;
    const pedal = simulateInstrument(instrument('one-pickup', { options: { load: 'low-impedance-pedal' } }).netlist, {}).metrics!;
    expect(pedal.peak.levelDb).toBeLessThan(amp.peak.levelDb);
    expect(pedal.cornerHz!).toBeLessThan(amp.cornerHz!);
  });

  it('a bare bleed capacitor brightens more as the volume drops into a low-impedance pedal than into an amplifier', () => {
    const retention = (load: string) => {
      const { netlist } = instrument('one-pickup', { options: { bleed: 'cap', load } });
      return sweepKnobs(netlist, { volume: [5], tone: [10] }).trebleRetentionDb[0]!;
    };
    const amp = retention('amp');
    const pedal = retention('low-impedance-pedal');
    expect(amp).toBeGreaterThan(0);
    expect(pedal).toBeGreaterThan(amp + 6);
  });

  it('a buffer isolates the cable after it: a longer cable after the buffer changes nothing, before it does', () => {
    const level = (values: Record<string, unknown>) =>
      levelAt(instrument('one-pickup', { options: { load: 'buffer' }, values }).netlist, {}, 5000);
    expect(level({ cableLength: 10 })).toBe(level({ cableLength: 1 }));
    expect(level({ cableBeforeBuffer: 10 })).not.toBeCloseTo(level({ cableBeforeBuffer: 1 }), 1);
  });
});

describe('treble-bleed finder', () => {
  it('with weight 1 the best candidate keeps the treble more even than a bare 1 nF cap and than no bleed', () => {
    for (const [layoutId, selector] of [
      ['one-pickup', 0],
      ['two-pickups-3way', 1],
    ] as const) {
      const { layout, config } = instrument(layoutId, { selector });
      const knobs = layoutKnobs(layout);
      const { candidates, evaluated } = findBleed(layout, config, knobs, { weight: 1 });
      expect(candidates).toHaveLength(10);
      // E12: 21 capacitors (100 pF – 4.7 nF) alone, and with each of 17 resistors (47 kΩ – 1 MΩ) in two ways.
      expect(evaluated).toBe(21 + 2 * 21 * 17);
      const best = candidates[0]!;
      const bare = bleedFigures(layout, config, knobs, { topology: 'cap', bleedC: 1e-9 }, 1);
      const none = bleedFigures(layout, config, knobs, { topology: 'none' }, 1);
      expect(best.figures.trebleSpreadDb).toBeLessThan(bare.trebleSpreadDb);
      expect(best.figures.trebleSpreadDb).toBeLessThan(none.trebleSpreadDb);
      // ranked best first, scores as defined
      for (let i = 1; i < candidates.length; i++)
        expect(candidates[i]!.figures.score).toBeGreaterThanOrEqual(candidates[i - 1]!.figures.score);
      // the finder's in-place value changes give the same figures as building the candidate afresh
      const again = bleedFigures(layout, config, knobs, { topology: best.topology, ...best.values }, 1);
      expect(again.trebleSpreadDb).toBeCloseTo(best.figures.trebleSpreadDb, 9);
      expect(again.taperDeviationDb).toBeCloseTo(best.figures.taperDeviationDb, 9);
    }
  });

  it('with weight 0 only the taper counts: the best candidate strays less from the bare pot than the best of weight 1', () => {
    const { layout, config } = instrument('one-pickup');
    const knobs = layoutKnobs(layout);
    const taper = findBleed(layout, config, knobs, { weight: 0 }).candidates[0]!;
    const treble = findBleed(layout, config, knobs, { weight: 1 }).candidates[0]!;
    expect(taper.figures.taperDeviationDb).toBeLessThan(treble.figures.taperDeviationDb);
    expect(taper.figures.score).toBe(taper.figures.taperDeviationDb);
  });

  it("the curves the screen draws are the ones the figures come from: spread is the treble curve's range, deviation the RMS against no bleed", () => {
    const { layout, config } = instrument('two-pickups-3way', { selector: 1 });
    const knobs = layoutKnobs(layout);
    const best = findBleed(layout, config, knobs, { weight: 0.7 }).candidates[0]!;
    const curves = bleedCurves(layout, config, knobs, { topology: best.topology, ...best.values });
    const none = bleedCurves(layout, config, knobs, { topology: 'none' });
    expect(curves.volumes).toEqual([10, 9, 8, 7, 6, 5, 4, 3, 2]);
    expect(curves.trebleDb[0]).toBe(0);
    expect(none.level1kDb[0]).toBe(0);
    // definitions of the issue: spread = max − min of the treble retention; deviation = RMS of the 1 kHz level with minus without
    expect(Math.max(...curves.trebleDb) - Math.min(...curves.trebleDb)).toBeCloseTo(best.figures.trebleSpreadDb, 9);
    const rms = Math.sqrt(curves.level1kDb.reduce((s, l, i) => s + (l - none.level1kDb[i]!) ** 2, 0) / curves.level1kDb.length);
    expect(rms).toBeCloseTo(best.figures.taperDeviationDb, 9);
  });
});
