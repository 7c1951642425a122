// The whole-instrument layouts (shared/circuit/layouts.ts) against hand-written netlists
// (hand-layout-netlists.ts), solved by the tests' own modified-nodal solver
// (tests/support/spice-reference.ts): no ngspice, so this file also runs in the mutation runs.
// layouts-ngspice.test.ts checks the same netlists, and this solver, with ngspice.
// Limit: 1e-5 dB and 1e-4° wherever the level is above −150 dB; below it (a cancelled or nearly
// cancelled output) the complex values are compared with an absolute floor of 1e-12.
// Also here: the presets as the one-pickup layout, what resolveLayoutConfig refuses and fills in,
// the "no signal (cancelled)" result, each pickup's own transfer, and the layouts' tables.
import { afterAll, describe, expect, it } from 'vitest';
import {
  activePickups,
  buildLayoutNetlist,
  getLayout,
  LAYOUT_IDS,
  LAYOUTS,
  layoutKnobs,
  PRESET_AS_LAYOUT,
  resolveLayoutConfig,
  toneKnobs,
  volumeKnobs,
  type LayoutDef,
} from '@shared/circuit/layouts';
import { simulate, simulateInstrument, type InstrumentResult } from '@shared/circuit/metrics';
import { getPreset, HARNESS_PRESETS } from '@shared/circuit/presets';
import { compileHarness, type CompiledHarness } from '@shared/circuit/solver';
import type { PickupPart } from '@shared/circuit/netlist';
import { acDecade, parseSpice, solveAc } from '../../support/spice-reference';
import { engineLaw, type HandLaw } from './hand-netlists';
import {
  HAND_LAYOUT_DEFAULTS,
  HAND_LAYOUT_IDS,
  HAND_LAYOUT_KNOBS,
  HAND_LAYOUT_OPTIONS,
  HAND_POSITIONS,
  WRITTEN_OUT_NETLISTS,
  handLayoutCases,
  handLayoutNetlist,
  type HandLayoutCase,
  type HandLayoutId,
  type HandLayoutValues,
} from './hand-layout-netlists';

/** The written-out netlists' `.ac dec 50 20 20k` axis. */
const FREQS_50 = acDecade(50, 20, 20000);
/**
 * The generated cases are compared on `.ac dec 10 20 20k` (31 points from 20 Hz to 20 kHz): a
 * wrong part shows at every frequency, and the mutation runs repeat this file for each mutant.
 */
const FREQS_10 = acDecade(10, 20, 20000);

const DB_TOL = 1e-5;
const DEG_TOL = 1e-4;
/** −150 dB in amplitude. */
const LEVEL_FLOOR = 10 ** (-150 / 20);
/** Absolute floor of the complex comparison below −150 dB (about 1e-12 V per volt of EMF). */
const ABS_FLOOR = 1e-12;

type Complex = { re: number; im: number };
const worst = { db: 0, deg: 0, abs: 0, points: 0, below: 0 };
afterAll(() => {
  console.info(
    `layouts against hand-written netlists (reference solver): ${worst.points} points above −150 dB, max |ΔdB| = ${worst.db.toExponential(2)}, max |Δphase| = ${worst.deg.toExponential(2)}°; ${worst.below} points below, max |ΔH| = ${worst.abs.toExponential(2)}`,
  );
});

/** The engine's curve as complex values (from its dB and degrees; −400 dB stands for an exact zero). */
function complexOf(curve: { magnitudeDb: ArrayLike<number>; phaseDeg: ArrayLike<number> }, k: number): Complex {
  const a = 10 ** (curve.magnitudeDb[k]! / 20);
  const p = (curve.phaseDeg[k]! * Math.PI) / 180;
  return { re: a * Math.cos(p), im: a * Math.sin(p) };
}

/**
 * Reference (complex) against the engine's curve: dB and phase above −150 dB, complex below. The
 * largest differences are asserted (one expect each, naming the point where each occurs).
 */
function agree(label: string, ref: readonly Complex[], curve: { magnitudeDb: ArrayLike<number>; phaseDeg: ArrayLike<number> }) {
  expect(curve.magnitudeDb.length, label).toBe(ref.length);
  const most = { db: 0, dbAt: -1, deg: 0, degAt: -1, abs: 0, absAt: -1 };
  ref.forEach((z, k) => {
    const az = Math.hypot(z.re, z.im);
    if (az > LEVEL_FLOOR) {
      const db = Math.abs(20 * Math.log10(az) - curve.magnitudeDb[k]!);
      const d = (Math.atan2(z.im, z.re) * 180) / Math.PI - curve.phaseDeg[k]!;
      const deg = Math.abs(((d + 540) % 360) - 180);
      worst.points++;
      // written so that NaN counts as the largest difference
      if (!(db <= most.db)) Object.assign(most, { db, dbAt: k });
      if (!(deg <= most.deg)) Object.assign(most, { deg, degAt: k });
    } else {
      const h = complexOf(curve, k);
      const abs = Math.hypot(z.re - h.re, z.im - h.im);
      worst.below++;
      if (!(abs <= most.abs)) Object.assign(most, { abs, absAt: k });
    }
  });
  worst.db = Math.max(worst.db, most.db);
  worst.deg = Math.max(worst.deg, most.deg);
  worst.abs = Math.max(worst.abs, most.abs);
  expect(most.db, `${label} at point ${most.dbAt}: dB`).toBeLessThan(DB_TOL);
  expect(most.deg, `${label} at point ${most.degAt}: phase`).toBeLessThan(DEG_TOL);
  expect(most.abs, `${label} at point ${most.absAt}: complex difference below −150 dB`).toBeLessThan(ABS_FLOOR);
}

const isLaw = (v: unknown): v is HandLaw => typeof v === 'object' && v !== null;
/** Values in the engine's form (laws with m = y(0.5)). */
function engineValues(values: HandLayoutValues): Record<string, unknown> {
  return Object.fromEntries(Object.entries(values).map(([key, v]) => [key, isLaw(v) ? engineLaw(v) : v]));
}

function layoutOf(id: string): LayoutDef {
  const layout = getLayout(id);
  if (!layout) throw new Error(`no layout ${id}`);
  return layout;
}

/** The engine's netlist of a configuration, compiled once (the knobs checked against the layout too). */
function engineHarness(
  c: Pick<HandLayoutCase, 'layoutId' | 'selector' | 'options' | 'values'>,
  knobs: readonly Readonly<Record<string, number>>[],
): CompiledHarness {
  const layout = layoutOf(c.layoutId);
  for (const k of knobs) expect(resolveLayoutConfig(layout, { knobs: { ...k } }).problems).toEqual([]);
  const { config, problems } = resolveLayoutConfig(layout, {
    selector: c.selector,
    options: { ...c.options },
    values: engineValues(c.values),
  });
  expect(problems).toEqual([]);
  return compileHarness(buildLayoutNetlist(layout, config));
}

function engineRun(
  c: Pick<HandLayoutCase, 'layoutId' | 'selector' | 'options' | 'values'>,
  knobs: Readonly<Record<string, number>>,
  freqs: readonly number[],
): InstrumentResult {
  return simulateInstrument(engineHarness(c, [knobs]), knobs, freqs);
}

const dec10 = (text: string) => text.replace('.ac dec 50 20 20k', '.ac dec 10 20 20k');

/** The sources of a case (pickups, or a dual-coil pickup's coils, as connected). */
function sourcesOf(c: HandLayoutCase): string[] {
  if (c.layoutId !== 'dual-coil') return [...HAND_POSITIONS[c.layoutId][c.selector]!];
  return (c.options.coils ?? 'series') === 'single' ? ['north'] : ['north', 'south'];
}

describe('every layout, selector position and option choice against its hand-written netlist (reference solver)', () => {
  const cases = handLayoutCases();

  it('the cases reach every position and every choice of every option of every layout', () => {
    for (const id of HAND_LAYOUT_IDS) {
      const mine = cases.filter((c) => c.layoutId === id);
      expect(new Set(mine.map((c) => c.selector)).size).toBe(layoutOf(id).selector.positions.length);
      for (const o of layoutOf(id).options) {
        for (const ch of o.choices.slice(1))
          expect(
            mine.some((c) => c.options[o.id] === ch.id),
            `${id} ${o.id} ${ch.id}`,
          ).toBe(true);
      }
      for (const c of mine) expect(c.knobs.length).toBeGreaterThanOrEqual(3);
    }
  });

  for (const c of cases) {
    it(`${c.label}: ${c.knobs.length} knob settings, the sum and each pickup's own transfer`, () => {
      const sources = sourcesOf(c);
      const harness = engineHarness(c, c.knobs);
      for (const knobs of c.knobs) {
        const where = `${c.label} ${JSON.stringify(knobs)}`;
        const sum = solveAc(parseSpice(dec10(handLayoutNetlist(c, knobs))), FREQS_10);
        const result = simulateInstrument(harness, knobs, FREQS_10);
        agree(where, sum, result);
        // Each source alone, the others silenced (superposition, standard circuit theory).
        const single = new Map(
          sources.map((src) => [
            src,
            sources.length === 1 ? sum : solveAc(parseSpice(dec10(handLayoutNetlist(c, knobs, [src]))), FREQS_10),
          ]),
        );
        // Each pickup's own transfer: its source, or a dual-coil pickup's two coils together.
        const pickups = c.layoutId === 'dual-coil' ? ['pickup'] : sources;
        expect(result.perPickup.map((p) => p.pickupId).sort(), where).toEqual([...pickups].sort());
        for (const p of pickups) {
          agree(
            `${where}, ${p} alone`,
            c.layoutId === 'dual-coil' ? sum : single.get(p)!,
            result.perPickup.find((q) => q.pickupId === p)!,
          );
        }
        // "No signal (cancelled)" exactly when the sum is 1e-9 (180 dB) below the largest single
        // source at every frequency (the documented rule, applied to the reference's own figures).
        const cancelled = sum.every(
          (z, k) => Math.hypot(z.re, z.im) <= 1e-9 * Math.max(...[...single.values()].map((s) => Math.hypot(s[k]!.re, s[k]!.im))),
        );
        expect(result.signal, where).toBe(cancelled ? 'cancelled' : 'present');
        expect(result.note, where).toBe(cancelled ? 'no signal (cancelled)' : null);
        expect(result.metrics === null, where).toBe(cancelled);
      }
    });
  }
});

describe('netlists written out whole agree with the layouts (reference solver)', () => {
  for (const w of WRITTEN_OUT_NETLISTS) {
    it(w.label, () => {
      const ref = solveAc(parseSpice(w.text), FREQS_50);
      const result = engineRun(w, w.knobs, FREQS_50);
      agree(w.label, ref, result);
      if (w.cancels) {
        // what is left of identical opposing coils is rounding, far below −150 dB, and the engine says so
        for (const z of ref) expect(Math.hypot(z.re, z.im)).toBeLessThan(LEVEL_FLOOR);
        expect(result.signal).toBe('cancelled');
      } else {
        expect(result.signal).toBe('present');
      }
    });
  }
});

describe('the seven presets are the one-pickup layout with the matching options', () => {
  it('equal to 1e-9 dB at several knob settings', () => {
    // The presets and the layout are two descriptions of the same networks (DEVELOPERS.md, "How to
    // add a wiring topology"): the same parts give the same response, to rounding.
    const layout = layoutOf('one-pickup');
    expect(Object.keys(PRESET_AS_LAYOUT).sort()).toEqual(HARNESS_PRESETS.map((p) => p.id).sort());
    for (const preset of HARNESS_PRESETS) {
      const { config, problems } = resolveLayoutConfig(layout, { options: PRESET_AS_LAYOUT[preset.id] });
      expect(problems).toEqual([]);
      const fromLayout = compileHarness(buildLayoutNetlist(layout, config));
      const fromPreset = compileHarness(getPreset(preset.id)!.build(preset.defaults));
      for (const knobs of [
        { volume: 10, tone: 10 },
        { volume: 5, tone: 3 },
        { volume: 0.7, tone: 9.2 },
        { volume: 0, tone: 0 },
      ]) {
        const a = simulateInstrument(fromLayout, knobs);
        const b = simulate(fromPreset, knobs);
        let worstDb = 0;
        a.magnitudeDb.forEach((v, k) => (worstDb = Math.max(worstDb, Math.abs(v - b.magnitudeDb[k]!))));
        expect(worstDb, `${preset.id} ${JSON.stringify(knobs)}`).toBeLessThan(1e-9);
        expect(a.metrics!.level1kDb).toBeCloseTo(b.metrics.level1kDb, 9);
      }
    }
  });

  it('part for part: the same parts, ids, nodes and values (the bleed finder and the export name parts by id)', () => {
    const layout = layoutOf('one-pickup');
    const byId = (parts: readonly { id: string }[]) => [...parts].sort((a, b) => (a.id < b.id ? -1 : 1));
    for (const preset of HARNESS_PRESETS) {
      const { config } = resolveLayoutConfig(layout, { options: PRESET_AS_LAYOUT[preset.id] });
      expect(byId(buildLayoutNetlist(layout, config).parts), preset.id).toEqual(byId(getPreset(preset.id)!.build(preset.defaults).parts));
    }
  });

  it('the preset options are told apart: no two presets give the same network', () => {
    const layout = layoutOf('one-pickup');
    const levels = HARNESS_PRESETS.map((p) => {
      const { config } = resolveLayoutConfig(layout, { options: PRESET_AS_LAYOUT[p.id] });
      return simulateInstrument(buildLayoutNetlist(layout, config), { volume: 4, tone: 3 }, [100, 1000, 5000]).magnitudeDb.join();
    });
    expect(new Set(levels).size).toBe(HARNESS_PRESETS.length);
  });
});

describe('cancellation and each pickup: identical pickups wired against each other give no signal', () => {
  // Standard circuit theory: two identical sources with opposite EMF feeding a symmetric network
  // (or joined at one node) leave zero at the output; each alone gives the same transfer, the
  // two 180° apart.
  const phaseGap = (a: number, b: number) => Math.abs(((a - b + 540) % 360) - 180);

  it('two pickups, both, bridge reversed, with the bridge set like the neck: cancelled; each pickup alone equal and 180° apart', () => {
    const like = { 'bridge.pickupR': 7200, 'bridge.pickupL': 3.9, 'bridge.pickupC': 110e-12 };
    const r = engineRun({ layoutId: 'two-pickups-3way', selector: 1, options: { phase: 'reversed' }, values: like }, {}, FREQS_10);
    expect(r.signal).toBe('cancelled');
    expect(r.note).toBe('no signal (cancelled)');
    expect(r.metrics).toBeNull();
    const neck = r.perPickup.find((p) => p.pickupId === 'neck')!;
    const bridge = r.perPickup.find((p) => p.pickupId === 'bridge')!;
    neck.magnitudeDb.forEach((db, k) => {
      expect(db).toBeGreaterThan(-60);
      expect(Math.abs(db - bridge.magnitudeDb[k]!)).toBeLessThan(1e-9);
      expect(phaseGap(neck.phaseDeg[k]!, bridge.phaseDeg[k]!)).toBeGreaterThan(180 - 1e-9);
    });
    // in phase, the same pair gives twice either one (+6.02 dB)
    const inPhase = engineRun({ layoutId: 'two-pickups-3way', selector: 1, options: {}, values: like }, {}, FREQS_10);
    inPhase.magnitudeDb.forEach((db, k) => expect(db - neck.magnitudeDb[k]!).toBeCloseTo(20 * Math.log10(2), 9));
  });

  it('three pickups, neck and middle, middle reversed, with the middle set like the neck: cancelled', () => {
    const like = { 'middle.pickupR': 5800, 'middle.pickupL': 2.3, 'middle.pickupC': 95e-12 };
    const r = engineRun(
      { layoutId: 'three-pickups-5way', selector: 1, options: { phase: 'reversed' }, values: like },
      { tone1: 3 },
      FREQS_10,
    );
    expect(r.signal).toBe('cancelled');
    expect(r.metrics).toBeNull();
    // a 1 % difference in one inductance is a (thin) signal, not a cancellation
    const unlike = engineRun(
      { layoutId: 'three-pickups-5way', selector: 1, options: { phase: 'reversed' }, values: { ...like, 'middle.pickupL': 2.323 } },
      {},
      FREQS_10,
    );
    expect(unlike.signal).toBe('present');
    expect(unlike.note).toBeNull();
    expect(unlike.metrics).not.toBeNull();
  });

  it('a reversed pickup alone is the same pickup at 180°: two pickups (bridge) and three pickups (middle)', () => {
    for (const [layoutId, selector, knobs] of [
      ['two-pickups-3way', 2, { 'bridge.tone': 4 }],
      ['three-pickups-5way', 2, { tone2: 4 }],
    ] as const) {
      const a = engineRun({ layoutId, selector, options: {}, values: {} }, knobs, FREQS_10);
      const b = engineRun({ layoutId, selector, options: { phase: 'reversed' }, values: {} }, knobs, FREQS_10);
      a.magnitudeDb.forEach((db, k) => {
        expect(Math.abs(db - b.magnitudeDb[k]!)).toBeLessThan(1e-9);
        expect(phaseGap(a.phaseDeg[k]!, b.phaseDeg[k]!)).toBeGreaterThan(180 - 1e-9);
      });
    }
  });

  it('a reversed source carries a negative EMF in the netlist (DEVELOPERS.md: exported as AC 1 180); the others none', () => {
    const emfOf = (layoutId: HandLayoutId, selector: number, options: Record<string, string>) => {
      const layout = layoutOf(layoutId);
      const { config } = resolveLayoutConfig(layout, { selector, options });
      const pickups = buildLayoutNetlist(layout, config).parts.filter((p): p is PickupPart => p.kind === 'pickup');
      return Object.fromEntries(pickups.map((p) => [p.id, p.emf ?? 1]));
    };
    expect(emfOf('two-pickups-3way', 1, { phase: 'reversed' })).toEqual({ neck: 1, bridge: -1 });
    expect(emfOf('two-pickups-3way', 1, {})).toEqual({ neck: 1, bridge: 1 });
    expect(emfOf('three-pickups-5way', 1, { phase: 'reversed' })).toEqual({ neck: 1, middle: -1 });
    expect(emfOf('three-pickups-5way', 3, { phase: 'reversed' })).toEqual({ middle: -1, bridge: 1 });
    expect(emfOf('dual-coil', 0, { coils: 'series-reversed' })).toEqual({ north: 1, south: -1 });
    expect(emfOf('dual-coil', 0, { coils: 'parallel' })).toEqual({ north: 1, south: 1 });
    // one coil: the north coil alone (the hand-written netlist keeps the north coil too)
    expect(emfOf('dual-coil', 0, { coils: 'single' })).toEqual({ north: 1 });
  });
});

describe('resolveLayoutConfig: defaults filled in', () => {
  for (const id of HAND_LAYOUT_IDS) {
    it(`${id}: every value at its typed default (no loss resistance), every option at its first choice, selector 0`, () => {
      const layout = layoutOf(id);
      const { config, problems } = resolveLayoutConfig(layout, {});
      expect(problems).toEqual([]);
      expect(config.selector).toBe(0);
      expect(config.values).toEqual(engineValues(HAND_LAYOUT_DEFAULTS[id]));
      expect(config.options).toEqual(Object.fromEntries(Object.entries(HAND_LAYOUT_OPTIONS[id]).map(([o, ch]) => [o, ch[0]])));
    });
  }

  it('given values and choices replace the defaults; the rest stay', () => {
    const { config, problems } = resolveLayoutConfig(layoutOf('two-pickups-3way'), {
      selector: 2,
      options: { bleed: 'cap-series-r' },
      values: { 'bridge.pickupRp': 220e3, 'neck.volumeLaw': { kind: 'linear' }, ampC: 0 },
    });
    expect(problems).toEqual([]);
    expect(config.selector).toBe(2);
    expect(config.options).toEqual({
      bleed: 'cap-series-r',
      toneWiring: 'independent',
      toneNetwork: 'plain',
      volumeWiring: 'standard',
      phase: 'in',
      load: 'amp',
    });
    expect(config.values).toEqual({
      ...engineValues(HAND_LAYOUT_DEFAULTS['two-pickups-3way']),
      'bridge.pickupRp': 220e3,
      'neck.volumeLaw': { kind: 'linear' },
    });
  });
});

describe('buildLayoutNetlist: a choice it is not given, or does not know, counts as the first (the default)', () => {
  // DEVELOPERS.md, "The whole instrument": the first choice of an option is its default.
  const netOf = (id: HandLayoutId, selector: number, options: Record<string, string>) =>
    buildLayoutNetlist(layoutOf(id), { ...resolveLayoutConfig(layoutOf(id), { selector }).config, options });
  for (const id of HAND_LAYOUT_IDS) {
    it(id, () => {
      HAND_POSITIONS[id].forEach((_, selector) => {
        const resolved = resolveLayoutConfig(layoutOf(id), { selector }).config;
        const expected = buildLayoutNetlist(layoutOf(id), resolved);
        expect(netOf(id, selector, {}), `${id} ${selector}: no options`).toEqual(expected);
        const unknown = Object.fromEntries(Object.keys(HAND_LAYOUT_OPTIONS[id]).map((o) => [o, 'no-such-choice']));
        expect(netOf(id, selector, unknown), `${id} ${selector}: unknown choices`).toEqual(expected);
      });
    });
  }
});

describe('resolveLayoutConfig: refusals name their path (DEVELOPERS.md, "The whole instrument")', () => {
  // The layout's rules: an unknown key, option, choice, knob or position is a problem with its path;
  // value ranges as each value defines them ('positive': > 0, 'non-negative': ≥ 0; a length at most
  // 100 m); a law is linear, or audio, reverse or two-segment with 0 < m < 1.
  type Input = Parameters<typeof resolveLayoutConfig>[1];
  const refusals: [string, HandLayoutId, Input, string, RegExp][] = [
    ['selector below 0', 'two-pickups-3way', { selector: -1 }, 'selector', /positions 0 to 2\b/],
    ['selector one past the last', 'two-pickups-3way', { selector: 3 }, 'selector', /positions 0 to 2\b/],
    ['selector one past the last (five-way)', 'three-pickups-5way', { selector: 5 }, 'selector', /positions 0 to 4\b/],
    ['selector 1 of a one-position layout', 'one-pickup', { selector: 1 }, 'selector', /positions 0 to 0\b/],
    ['selector not whole', 'three-pickups-5way', { selector: 1.5 }, 'selector', /positions 0 to 4\b/],
    ['selector NaN', 'dual-coil', { selector: NaN }, 'selector', /positions 0 to 0\b/],
    ['an option of another layout', 'one-pickup', { options: { coils: 'parallel' } }, 'options.coils', /no option "coils"/],
    ['an unknown option', 'dual-coil', { options: { phase: 'reversed' } }, 'options.phase', /no option "phase"/],
    [
      'an unknown choice',
      'one-pickup',
      { options: { bleed: 'resistor' } },
      'options.bleed',
      /^Choose one of none, cap, cap-parallel-r, cap-series-r\.$/,
    ],
    [
      'an unknown coil choice',
      'dual-coil',
      { options: { coils: 'split' } },
      'options.coils',
      /^Choose one of series, parallel, single, series-reversed\.$/,
    ],
    ['an unknown knob', 'three-pickups-5way', { knobs: { tone3: 5 } }, 'knobs.tone3', /no knob "tone3"/],
    ['a knob of another layout', 'two-pickups-3way', { knobs: { volume: 5 } }, 'knobs.volume', /no knob "volume"/],
    ['an unknown value', 'one-pickup', { values: { 'neck.pickupR': 7000 } }, 'values.neck.pickupR', /no value "neck\.pickupR"/],
    [
      'a value of an absent tone',
      'three-pickups-5way',
      { values: { 'tone3.toneC': 1e-9 } },
      'values.tone3.toneC',
      /no value "tone3\.toneC"/,
    ],
    ['a number as text', 'one-pickup', { values: { pickupR: '8k' } }, 'values.pickupR', /^Expected a number \(SI units\)\.$/],
    ['NaN', 'dual-coil', { values: { 'north.pickupL': NaN } }, 'values.north.pickupL', /^Expected a number/],
    ['infinity', 'two-pickups-3way', { values: { 'neck.toneC': Infinity } }, 'values.neck.toneC', /^Expected a number/],
    ['a law for a number', 'one-pickup', { values: { toneR: { kind: 'linear' } } }, 'values.toneR', /^Expected a number/],
    ['zero resistance', 'one-pickup', { values: { pickupR: 0 } }, 'values.pickupR', /^Must be more than zero\.$/],
    [
      'negative capacitance',
      'three-pickups-5way',
      { values: { 'tone2.toneC': -1e-9 } },
      'values.tone2.toneC',
      /^Must be more than zero\.$/,
    ],
    ['zero loss resistance', 'dual-coil', { values: { 'south.pickupRp': 0 } }, 'values.south.pickupRp', /more than zero/],
    ['negative amplifier capacitance', 'one-pickup', { values: { ampC: -1e-12 } }, 'values.ampC', /^Must not be negative\.$/],
    ['negative cable length', 'two-pickups-3way', { values: { cableLength: -1 } }, 'values.cableLength', /^Must not be negative\.$/],
    ['negative capacitance per metre', 'dual-coil', { values: { cableCapPerMetre: -1e-12 } }, 'values.cableCapPerMetre', /not be negative/],
    ['a cable over 100 m', 'one-pickup', { values: { cableLength: 100.5 } }, 'values.cableLength', /^At most 100 m\.$/],
    [
      'a cable before the buffer over 100 m',
      'three-pickups-5way',
      { values: { cableBeforeBuffer: 101 } },
      'values.cableBeforeBuffer',
      /^At most 100 m\.$/,
    ],
    ['a law as text', 'one-pickup', { values: { volumeLaw: 'audio' } }, 'values.volumeLaw', /^Expected a taper law\.$/],
    ['a law null', 'one-pickup', { values: { toneLaw: null } }, 'values.toneLaw', /^Expected a taper law\.$/],
    ['a law without kind', 'dual-coil', { values: { volumeLaw: { m: 0.2 } } }, 'values.volumeLaw', /^Expected a taper law\.$/],
    [
      'an unknown law',
      'two-pickups-3way',
      { values: { 'bridge.toneLaw': { kind: 'log', m: 0.2 } } },
      'values.bridge.toneLaw',
      /^Unknown taper law\.$/,
    ],
    [
      'an audio law without m',
      'one-pickup',
      { values: { volumeLaw: { kind: 'audio' } } },
      'values.volumeLaw',
      /m must lie between 0 and 1/,
    ],
    [
      'an audio law with m as text',
      'one-pickup',
      { values: { volumeLaw: { kind: 'audio', m: '0.2' } } },
      'values.volumeLaw',
      /m must lie between 0 and 1/,
    ],
    [
      'an audio law at m = 0',
      'one-pickup',
      { values: { volumeLaw: { kind: 'audio', m: 0 } } },
      'values.volumeLaw',
      /m must lie between 0 and 1/,
    ],
    [
      'a reverse law at m = 1',
      'three-pickups-5way',
      { values: { 'tone1.toneLaw': { kind: 'reverse', m: 1 } } },
      'values.tone1.toneLaw',
      /m must lie between 0 and 1/,
    ],
    [
      'a two-segment law at m = 1.2',
      'dual-coil',
      { values: { toneLaw: { kind: 'two-segment', m: 1.2 } } },
      'values.toneLaw',
      /m must lie between 0 and 1/,
    ],
  ];

  for (const [what, id, input, path, message] of refusals) {
    it(`${id}: ${what} → ${path}`, () => {
      const { config, problems } = resolveLayoutConfig(layoutOf(id), input);
      expect(problems.map((p) => p.path)).toEqual([path]);
      expect(problems[0]!.message).toMatch(message);
      // nothing refused is taken: the value (or choice) stays at its default
      expect(config.values).toEqual(engineValues(HAND_LAYOUT_DEFAULTS[id]));
      expect(config.options).toEqual(Object.fromEntries(Object.entries(HAND_LAYOUT_OPTIONS[id]).map(([o, ch]) => [o, ch[0]])));
    });
  }

  it('accepted at the edges: the last position, zero where zero is allowed, 100 m, m inside (0, 1), each law kind', () => {
    const accepted: [HandLayoutId, Input][] = [
      ['two-pickups-3way', { selector: 2 }],
      ['three-pickups-5way', { selector: 4 }],
      ['one-pickup', { selector: 0, values: { ampC: 0, cableLength: 0, cableCapPerMetre: 0, cableBeforeBuffer: 0 } }],
      ['one-pickup', { values: { cableLength: 100, cableBeforeBuffer: 100 } }],
      // only a length has the 100 m limit: a (large) capacitance per metre is not a length
      ['dual-coil', { values: { cableCapPerMetre: 150 } }],
      ['one-pickup', { values: { volumeLaw: { kind: 'audio', m: 0.5 }, toneLaw: { kind: 'reverse', m: 0.999 } } }],
      ['dual-coil', { values: { volumeLaw: { kind: 'two-segment', m: 0.001 }, toneLaw: { kind: 'linear' } } }],
      ['two-pickups-3way', { knobs: { 'neck.volume': 0, 'bridge.volume': 10, 'neck.tone': 3, 'bridge.tone': 7 } }],
    ];
    for (const [id, input] of accepted) {
      const { config, problems } = resolveLayoutConfig(layoutOf(id), input);
      expect(problems, `${id} ${JSON.stringify(input)}`).toEqual([]);
      for (const [key, v] of Object.entries(input.values ?? {})) expect(config.values[key]).toEqual(v);
    }
  });

  it('every problem is reported, not only the first', () => {
    const { problems } = resolveLayoutConfig(layoutOf('two-pickups-3way'), {
      selector: 7,
      options: { coils: 'series', phase: 'sideways' },
      knobs: { tone: 5 },
      values: { pickupR: 1, 'neck.pickupR': -1 },
    });
    expect(problems.map((p) => p.path)).toEqual([
      'selector',
      'options.coils',
      'options.phase',
      'knobs.tone',
      'values.pickupR',
      'values.neck.pickupR',
    ]);
  });
});

describe("the layouts' tables", () => {
  // What each layout is: DEVELOPERS.md, "The whole instrument" (layouts, pickups and coils, knob
  // ids, options with the first choice as default, dot-separated value keys) and each layout's own
  // description (which pickups a selector position joins).
  it('the four layouts, in order, found by id; an unknown id finds none', () => {
    expect(LAYOUT_IDS).toEqual(HAND_LAYOUT_IDS);
    expect(LAYOUTS.map((l) => l.id)).toEqual(HAND_LAYOUT_IDS);
    for (const id of HAND_LAYOUT_IDS) expect(getLayout(id)!.id).toBe(id);
    expect(getLayout('four-pickups')).toBeUndefined();
  });

  it('pickups and coils, positions and the pickups each joins, options and their choices (first = default), knobs', () => {
    const pickups: Record<HandLayoutId, string[]> = {
      'one-pickup': ['pickup'],
      'two-pickups-3way': ['neck', 'bridge'],
      'three-pickups-5way': ['neck', 'middle', 'bridge'],
      'dual-coil': ['pickup'],
    };
    for (const id of HAND_LAYOUT_IDS) {
      const layout = layoutOf(id);
      expect(layout.pickups.map((p) => p.id)).toEqual(pickups[id]);
      expect(layout.pickups.flatMap((p) => p.coils.map((c) => c.id))).toEqual(id === 'dual-coil' ? ['north', 'south'] : []);
      expect(layout.selector.positions.map((p) => p.index)).toEqual(HAND_POSITIONS[id].map((_, i) => i));
      HAND_POSITIONS[id].forEach((joined, i) => expect(activePickups(layout, i)).toEqual(joined));
      expect(layout.options.map((o) => [o.id, o.choices.map((c) => c.id)])).toEqual(Object.entries(HAND_LAYOUT_OPTIONS[id]));
      expect(layout.knobs.map((k) => k.id)).toEqual(HAND_LAYOUT_KNOBS[id]);
    }
  });

  it('every name a screen shows is there, starts with a letter, and is unique in its list', () => {
    const check = (what: string, names: string[]) => {
      for (const name of names) expect(name, what).toMatch(/^\p{L}/u);
      expect(new Set(names).size, what).toBe(names.length);
    };
    check(
      'layouts',
      LAYOUTS.map((l) => l.name),
    );
    for (const l of LAYOUTS) {
      expect(l.description.length, l.id).toBeGreaterThan(20);
      check(
        `${l.id} pickups`,
        l.pickups.map((p) => p.name),
      );
      for (const p of l.pickups)
        check(
          `${l.id} ${p.id} coils`,
          p.coils.map((c) => c.name),
        );
      check(
        `${l.id} positions`,
        l.selector.positions.map((p) => p.name),
      );
      check(
        `${l.id} knobs`,
        l.knobs.map((k) => k.name),
      );
      check(
        `${l.id} options`,
        l.options.map((o) => o.name),
      );
      for (const o of l.options)
        check(
          `${l.id} ${o.id} choices`,
          o.choices.map((c) => c.name),
        );
      check(
        `${l.id} values`,
        l.values.map((v) => v.name),
      );
    }
  });

  it("every value's name says what it is and, where the layout has several, whose it is", () => {
    // The Harness screen lists a layout's values in one list, so a name is "group: what" or "what":
    // the what is never empty; a pickup's (or coil's) values name their pickup or coil; a value of
    // a pickup's or a tone's controls (neck.volumeR, tone1.toneC) names the group its knob's name
    // starts with; an ungrouped control's group, if any, is a word of the layout's description (the
    // five-way layout's master volume); with several pickups every part value (not the load's) names
    // its group.
    const loadKeys = new Set(['cableCapPerMetre', 'cableLength', 'ampR', 'ampC', 'bufferR', 'cableBeforeBuffer', 'pedalR']);
    for (const l of LAYOUTS) {
      for (const v of l.values) {
        const where = `${l.id} ${v.key}: "${v.name}"`;
        const parts = v.name.split(': ');
        expect(parts.length, where).toBeLessThanOrEqual(2);
        const what = parts.at(-1)!;
        const group = parts.length === 2 ? parts[0]! : null;
        expect(what, where).toMatch(/^\p{L}/u);
        if (group !== null) expect(group, where).toMatch(/^\p{L}/u);
        const [prefix, last] = v.key.includes('.') ? v.key.split('.') : [null, v.key];
        if (loadKeys.has(v.key)) {
          expect(group, where).toBeNull();
        } else if (last!.startsWith('pickup')) {
          const owner =
            prefix === null
              ? l.pickups[0]!
              : (l.pickups.find((p) => p.id === prefix) ?? l.pickups.flatMap((p) => p.coils).find((c) => c.id === prefix)!);
          expect(group, where).not.toBeNull();
          expect(group!.startsWith(owner.name), where).toBe(true);
        } else if (prefix !== null) {
          const knobNames = l.knobs.filter((k) => k.id === prefix || k.id.startsWith(`${prefix}.`)).map((k) => k.name);
          expect(knobNames.length, where).toBeGreaterThan(0);
          expect(group !== null && knobNames.every((n) => n.startsWith(group)), where).toBe(true);
        } else {
          if (group !== null) expect(l.description.toLowerCase().split(/\W+/), where).toContain(group.toLowerCase());
          if (l.pickups.length > 1) expect(group, where).not.toBeNull();
        }
      }
    }
  });

  it('every value: its quantity, SI unit and range (resistances, inductances, capacitances > 0; cable and amplifier capacitance ≥ 0)', () => {
    // SI units (BIPM, The International System of Units, 9th edition); ranges as DEVELOPERS.md
    // describes the values: a part value is positive, the load's cable and input capacitance may be 0.
    const unit = { resistance: 'Ω', capacitance: 'F', inductance: 'H', length: 'm', 'capacitance-per-length': 'F/m', law: '' };
    const nonNegative = new Set(['cableCapPerMetre', 'cableLength', 'ampC', 'cableBeforeBuffer']);
    for (const l of LAYOUTS) {
      expect(l.values.map((v) => v.key).sort(), l.id).toEqual(
        [
          ...Object.keys(HAND_LAYOUT_DEFAULTS[l.id]),
          ...l.pickups.flatMap((p) =>
            p.coils.length ? p.coils.map((c) => `${c.id}.pickupRp`) : [p.id === 'pickup' ? 'pickupRp' : `${p.id}.pickupRp`],
          ),
        ].sort(),
      );
      for (const v of l.values) {
        const last = v.key.split('.').at(-1)!;
        const quantity = /R(p)?$/.test(last)
          ? 'resistance'
          : /L$/.test(last)
            ? 'inductance'
            : /Law$/.test(last)
              ? 'law'
              : last === 'cableCapPerMetre'
                ? 'capacitance-per-length'
                : /Length$|Buffer$/.test(last)
                  ? 'length'
                  : 'capacitance';
        expect(v.quantity, `${l.id} ${v.key}`).toBe(quantity);
        expect(v.unit, `${l.id} ${v.key}`).toBe(unit[quantity]);
        expect(v.range, `${l.id} ${v.key}`).toBe(nonNegative.has(v.key) ? 'non-negative' : 'positive');
        expect(v.default, `${l.id} ${v.key}`).toEqual(last === 'pickupRp' ? null : engineValues(HAND_LAYOUT_DEFAULTS[l.id])[v.key]);
      }
    }
  });

  it('layoutKnobs: every knob of the layout, a knob left out at 10, a knob given kept (0 too), others dropped', () => {
    // DEVELOPERS.md: "Knobs are a record by knob id (a knob left out is at 10)".
    expect(layoutKnobs(layoutOf('two-pickups-3way'), { 'neck.volume': 0, 'bridge.tone': 3.5, volume: 2 })).toEqual({
      'neck.volume': 0,
      'bridge.volume': 10,
      'neck.tone': 10,
      'bridge.tone': 3.5,
    });
    expect(layoutKnobs(layoutOf('three-pickups-5way'))).toEqual({ volume: 10, tone1: 10, tone2: 10 });
    expect(layoutKnobs(layoutOf('dual-coil'), { tone: 7 })).toEqual({ volume: 10, tone: 7 });
  });

  it('volumeKnobs and toneKnobs: the knobs named volume and tone (or toneN), alone or after a pickup', () => {
    // the knob ids of DEVELOPERS.md ('volume', 'tone', 'neck.volume', 'tone1' …); the first of each
    // are the sweeps' axes, so no other knob may be taken for one
    expect(volumeKnobs(layoutOf('one-pickup'))).toEqual(['volume']);
    expect(toneKnobs(layoutOf('one-pickup'))).toEqual(['tone']);
    expect(volumeKnobs(layoutOf('two-pickups-3way'))).toEqual(['neck.volume', 'bridge.volume']);
    expect(toneKnobs(layoutOf('two-pickups-3way'))).toEqual(['neck.tone', 'bridge.tone']);
    expect(volumeKnobs(layoutOf('three-pickups-5way'))).toEqual(['volume']);
    expect(toneKnobs(layoutOf('three-pickups-5way'))).toEqual(['tone1', 'tone2']);
    // a made-up layout: only whole names count
    const made = {
      ...layoutOf('one-pickup'),
      knobs: ['volume2', 'mastervolume', 'neck.volume', 'tones', 'xtone', 'bridge.tone12', 'tone.x', 'volume.tone', 'neckvolume'].map(
        (id) => ({ id, name: id }),
      ),
    };
    expect(volumeKnobs(made)).toEqual(['neck.volume']);
    expect(toneKnobs(made)).toEqual(['bridge.tone12', 'volume.tone']);
  });

  it('the netlist title names the layout and the selector position', () => {
    // the title is the first line of the SPICE export, where it says what was exported
    for (const id of HAND_LAYOUT_IDS) {
      const layout = layoutOf(id);
      for (const pos of layout.selector.positions) {
        const { config } = resolveLayoutConfig(layout, { selector: pos.index });
        expect(buildLayoutNetlist(layout, config).title).toBe(`${layout.name}: ${pos.name}`);
      }
    }
  });
});
