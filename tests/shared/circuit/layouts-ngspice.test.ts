// The whole-instrument layouts against ngspice's AC analysis (npm `eecircuit-engine`, one
// instance for this file). Every layout × selector position × option choice (one non-default
// choice at a time, plus one combination with the last choice of every option) at several knob
// settings: within 1e-5 dB and 1e-4° wherever the level is above −150 dB; below that (a cancelled
// or nearly cancelled output) the complex values are compared with an absolute floor. Some
// netlists are written by hand below, not exported by the engine, so the export is checked too.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Ngspice } from '../../support/ngspice';
import { buildLayoutNetlist, getLayout, LAYOUTS, layoutKnobs, resolveLayoutConfig, type LayoutDef } from '@shared/circuit/layouts';
import { simulate, simulateInstrument } from '@shared/circuit/metrics';
import { getPreset, HARNESS_PRESETS } from '@shared/circuit/presets';
import { PRESET_AS_LAYOUT } from '@shared/circuit/layouts';
import { compileHarness, solve } from '@shared/circuit/solver';
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

describe('hand-written netlists (not exported by the engine) agree with the layouts', () => {
  // Linear pots at knob 5 are two 250 kΩ halves; at 10 the near half is the engine's 1 mΩ clamp,
  // written here as 1m. Values are the layouts' defaults, typed in by hand.
  async function check(
    label: string,
    text: string,
    layoutId: string,
    selector: number,
    options: Record<string, string>,
    values: Record<string, unknown>,
    knobs: Record<string, number>,
  ) {
    const layout = getLayout(layoutId)!;
    const { config, problems } = resolveLayoutConfig(layout, { selector, options, values });
    expect(problems).toEqual([]);
    const result = await ng.runAc(text);
    worst.runs++;
    const h = solve(compileHarness(buildLayoutNetlist(layout, config)), knobs, result.frequencies);
    agree(label, result.nodes.out!, h.re, h.im);
    return { result, h };
  }

  it('two pickups, both, bridge reversed, neck volume 5 (linear), bridge volume 10, tones at 10', async () => {
    const text = `two pickups in both, bridge reversed
Vneck en 0 DC 0 AC 1
Rneck en cn 7200
Lneck cn nh 3.9
Cneck nh 0 110p
Vbridge eb 0 DC 0 AC 1 180
Rbridge eb cb 8600
Lbridge cb bh 4.8
Cbridge bh 0 130p
* neck volume: lug 3 on the pickup, wiper to the output, linear at 5
Rnv1 0 out 250k
Rnv2 out nh 250k
* bridge volume at 10 (audio law: all of it to ground, the clamp between lug 3 and wiper)
Rbv1 0 out 500k
Rbv2 out bh 1m
* tones at 10 (audio law) from each pickup hot
Rnt nh nt 500k
Cnt nt 0 22n
Rbt bh bt 500k
Cbt bt 0 22n
Ccable out 0 300p
Ramp out 0 1meg
.ac dec 50 20 20k
.end
`;
    const { h } = await check(
      'two pickups reversed',
      text,
      'two-pickups-3way',
      1,
      { phase: 'reversed' },
      { 'neck.volumeLaw': { kind: 'linear' } },
      { 'neck.volume': 5 },
    );
    expect(h.re.length).toBe(151);
  });

  it('dual-coil, series with one coil reversed: identical coils cancel (complex compare with the floor)', async () => {
    const text = `dual coil, series, south reversed
Vnorth en 0 DC 0 AC 1
Rnorth en cn 4000
Lnorth cn mid 2.2
Cnorth mid 0 240p
Vsouth es mid DC 0 AC 1 180
Rsouth es cs 4000
Lsouth cs hot 2.2
Csouth hot mid 240p
Rv1 0 out 500k
Rv2 out hot 1m
Rt hot t 500k
Ct t 0 22n
Ccable out 0 300p
Ramp out 0 1meg
.ac dec 50 20 20k
.end
`;
    const { result } = await check('series reversed', text, 'dual-coil', 0, { coils: 'series-reversed' }, {}, {});
    // ngspice sees the cancellation too: what is left is rounding, far below −150 dB.
    for (const z of result.nodes.out!) expect(Math.hypot(z.re, z.im)).toBeLessThan(LEVEL_FLOOR);
  });

  it('three pickups, middle and bridge, tone 2 serving both, interactive, into a low-impedance pedal', async () => {
    const text = `three pickups, middle and bridge
Vmid em 0 DC 0 AC 1
Rmid em cm 6000
Lmid cm hot 2.5
Cmid hot 0 100p
Vbr eb 0 DC 0 AC 1
Rbr eb cb 6600
Lbr cb hot 2.9
Cbr hot 0 110p
* master volume linear at 5
Rv1 0 out 250k
Rv2 out hot 250k
* tone 2 from the wiper (interactive), at 10
Rt out t 500k
Ct t 0 22n
Ccable out 0 300p
Rpedal out 0 10k
.ac dec 50 20 20k
.end
`;
    await check(
      'three pickups into a pedal',
      text,
      'three-pickups-5way',
      3,
      { tone2Serves: 'middle-bridge', toneWiring: 'interactive', load: 'low-impedance-pedal' },
      { volumeLaw: { kind: 'linear' } },
      { volume: 5 },
    );
  });

  it('one pickup into a buffer: only the cable before it loads the pickup; an amplifier capacitance adds to the cable', async () => {
    const buffer = `one pickup into a buffer after 1 m of cable
V1 e 0 DC 0 AC 1
Rp e c 8000
Lp c hot 4.4
Cp hot 0 120p
Rv1 0 out 500k
Rv2 out hot 1m
Rt hot t 500k
Ct t 0 22n
Ccable out 0 100p
Rbuf out 0 1meg
.ac dec 50 20 20k
.end
`;
    await check('buffer', buffer, 'one-pickup', 0, { load: 'buffer' }, { cableBeforeBuffer: 1 }, {});
    const amp = buffer.replace('Rbuf out 0 1meg', 'Ramp out 0 1meg\nCamp out 0 150p').replace('Ccable out 0 100p', 'Ccable out 0 300p');
    await check('amp with input capacitance', amp, 'one-pickup', 0, {}, { ampC: 150e-12 }, {});
  });
});

describe('the seven presets are the one-pickup layout with the matching options', () => {
  it('equal to 1e-9 dB at several knob settings', () => {
    const layout = getLayout('one-pickup')!;
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
});
