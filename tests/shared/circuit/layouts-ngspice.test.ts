// The whole-instrument layouts against ngspice's AC analysis (npm `eecircuit-engine`, one
// instance for this file). Every layout × selector position × option choice (one non-default
// choice at a time, plus one combination with the last choice of every option) at several knob
// settings: within 1e-5 dB and 1e-4° wherever the level is above −150 dB; below that (a cancelled
// or nearly cancelled output) the complex values are compared with an absolute floor. The
// hand-written netlists of hand-layout-netlists.ts (not exported by the engine) are run too, and
// the tests' reference solver is checked against ngspice on them. The presets-as-layout check and
// the same netlists without ngspice are in layout-hand-netlists.test.ts (it runs in the mutation runs).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Ngspice } from '../../support/ngspice';
import { buildLayoutNetlist, getLayout, LAYOUTS, layoutKnobs, resolveLayoutConfig, type LayoutDef } from '@shared/circuit/layouts';
import { compileHarness, solve } from '@shared/circuit/solver';
import { parseSpice, solveAc } from '../../support/spice-reference';
import { engineLaw } from './hand-netlists';
import { HAND_LAYOUT_IDS, WRITTEN_OUT_NETLISTS, handLayoutCases, handLayoutNetlist, type HandLayoutCase } from './hand-layout-netlists';
import { toSpiceNetlist } from '@shared/circuit/spice';
import type { Netlist } from '@shared/circuit/netlist';

const ng = new Ngspice();
beforeAll(async () => {
  await ng.start();
});

const DB_TOL = 1e-5;
const DEG_TOL = 1e-4;
/** −150 dB in amplitude: below it the dB and phase comparison gives way to the complex one. */
const LEVEL_FLOOR = 10 ** (-150 / 20);
/** Absolute floor of the complex comparison below −150 dB (−240 dB, about 1e-12 V per volt of EMF). */
const ABS_FLOOR = 1e-12;

const worst = { db: 0, deg: 0, abs: 0, runs: 0 };
afterAll(() => {
  console.info(
    `layouts against ngspice: ${worst.runs} runs, max |ΔdB| = ${worst.db.toExponential(2)}, max |Δphase| = ${worst.deg.toExponential(2)}°, max |ΔH| below −150 dB = ${worst.abs.toExponential(2)}`,
  );
});

function agree(label: string, spice: { re: number; im: number }[], re: Float64Array, im: Float64Array): void {
  spice.forEach((z, k) => {
    const h = { re: re[k]!, im: im[k]! };
    const az = Math.hypot(z.re, z.im);
    if (az > LEVEL_FLOOR) {
      const db = Math.abs(20 * Math.log10(az / Math.hypot(h.re, h.im)));
      const d = ((Math.atan2(z.im, z.re) - Math.atan2(h.im, h.re)) * 180) / Math.PI;
      const deg = Math.abs(((d + 540) % 360) - 180);
      worst.db = Math.max(worst.db, db);
      worst.deg = Math.max(worst.deg, deg);
      expect(db, `${label} at point ${k}: dB`).toBeLessThan(DB_TOL);
      expect(deg, `${label} at point ${k}: phase`).toBeLessThan(DEG_TOL);
    } else {
      const abs = Math.hypot(z.re - h.re, z.im - h.im);
      worst.abs = Math.max(worst.abs, abs);
      expect(abs, `${label} at point ${k}: complex difference below −150 dB`).toBeLessThan(ABS_FLOOR);
    }
  });
}

async function compareExported(label: string, netlist: Netlist, knobs: Record<string, number>): Promise<void> {
  const result = await ng.runAc(toSpiceNetlist(netlist, knobs));
  worst.runs++;
  expect(result.frequencies.length).toBe(151);
  const h = solve(compileHarness(netlist), knobs, result.frequencies);
  agree(label, result.nodes.out!, h.re, h.im);
}

/** Default, each non-default choice of each option alone, and every option at its last choice. */
function optionCases(layout: LayoutDef): Record<string, string>[] {
  const cases: Record<string, string>[] = [{}];
  for (const o of layout.options) for (const ch of o.choices.slice(1)) cases.push({ [o.id]: ch.id });
  cases.push(Object.fromEntries(layout.options.map((o) => [o.id, o.choices.at(-1)!.id])));
  return cases;
}

/** Knob settings: all at 10, all at 5, and a mixed one with odd values (volumes 3.3, tones 7.1). */
function knobCases(layout: LayoutDef): Record<string, number>[] {
  const all = (v: number) => layoutKnobs(layout, Object.fromEntries(layout.knobs.map((k) => [k.id, v])));
  const mixed = layoutKnobs(layout, Object.fromEntries(layout.knobs.map((k) => [k.id, /volume$/.test(k.id) ? 3.3 : 7.1])));
  return [all(10), all(5), mixed];
}

describe('every layout × position × option choice agrees with ngspice (1e-5 dB, 1e-4°)', () => {
  for (const layout of LAYOUTS) {
    it(`${layout.id}`, { timeout: 240_000 }, async () => {
      for (const pos of layout.selector.positions) {
        for (const options of optionCases(layout)) {
          const { config, problems } = resolveLayoutConfig(layout, { selector: pos.index, options });
          expect(problems).toEqual([]);
          const netlist = buildLayoutNetlist(layout, config);
          for (const knobs of knobCases(layout)) {
            await compareExported(`${layout.id} position ${pos.index} ${JSON.stringify(options)} ${JSON.stringify(knobs)}`, netlist, knobs);
          }
        }
      }
    });
  }
});

describe('hand-written netlists (hand-layout-netlists.ts, not exported by the engine) agree with the layouts and with the reference solver', () => {
  // The same netlists layout-hand-netlists.test.ts solves with the tests' own solver: here ngspice
  // checks the engine on them, and checks that solver (tests/support/spice-reference.ts) too.
  const ref = { worst: 0, below: 0 };
  afterAll(() => {
    console.info(
      `reference solver against ngspice on the hand-written layout netlists: max |ΔH|/|H| = ${ref.worst.toExponential(2)}, max |ΔH| below −150 dB = ${ref.below.toExponential(2)}`,
    );
  });

  async function check(
    label: string,
    text: string,
    c: Pick<HandLayoutCase, 'layoutId' | 'selector' | 'options' | 'values'>,
    knobs: Record<string, number>,
  ) {
    const layout = getLayout(c.layoutId)!;
    const values = Object.fromEntries(Object.entries(c.values).map(([k, v]) => [k, typeof v === 'object' ? engineLaw(v) : v]));
    const { config, problems } = resolveLayoutConfig(layout, { selector: c.selector, options: { ...c.options }, values });
    expect(problems).toEqual([]);
    const result = await ng.runAc(text);
    worst.runs++;
    const h = solve(compileHarness(buildLayoutNetlist(layout, config)), knobs, result.frequencies);
    agree(label, result.nodes.out!, h.re, h.im);
    // the reference solver on the same text: relative to the level above −150 dB, absolutely below
    const own = solveAc(parseSpice(text), result.frequencies);
    result.nodes.out!.forEach((z, k) => {
      const az = Math.hypot(z.re, z.im);
      const d = Math.hypot(own[k]!.re - z.re, own[k]!.im - z.im);
      if (az > LEVEL_FLOOR) {
        ref.worst = Math.max(ref.worst, d / az);
        expect(d / az, `${label}: reference solver at point ${k}`).toBeLessThan(1e-6);
      } else {
        ref.below = Math.max(ref.below, d);
        expect(d, `${label}: reference solver at point ${k}, below −150 dB`).toBeLessThan(ABS_FLOOR);
      }
    });
    return result;
  }

  for (const w of WRITTEN_OUT_NETLISTS) {
    it(w.label, async () => {
      const result = await check(w.label, w.text, w, w.knobs);
      expect(result.frequencies.length).toBe(151);
      // ngspice sees a cancellation too: what is left is rounding, far below −150 dB
      if (w.cancels) for (const z of result.nodes.out!) expect(Math.hypot(z.re, z.im)).toBeLessThan(LEVEL_FLOOR);
    });
  }

  for (const id of HAND_LAYOUT_IDS) {
    it(`${id}: every generated case at two knob settings`, { timeout: 240_000 }, async () => {
      for (const c of handLayoutCases().filter((x) => x.layoutId === id)) {
        for (const knobs of c.knobs.slice(1, 3)) await check(`${c.label} ${JSON.stringify(knobs)}`, handLayoutNetlist(c, knobs), c, knobs);
      }
    });
  }
});
