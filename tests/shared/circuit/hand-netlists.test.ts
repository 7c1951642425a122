// The engine against the hand-written netlists of hand-netlists.ts, solved by the test's own
// modified-nodal solver (tests/support/spice-reference.ts) — no ngspice, so this file also runs in
// the mutation runs. ngspice-agreement.test.ts checks the same netlists, and this solver, with
// ngspice. Limit: 1e-5 dB and 1e-4° wherever the level is above −150 dB.
import { afterAll, describe, expect, it } from 'vitest';
import { HARNESS_PRESETS, getPreset } from '@shared/circuit/presets';
import { simulate } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';
import { compileHarness } from '@shared/circuit/solver';
import { acDecade, parseSpice, solveAc } from '../../support/spice-reference';
import { sized } from '../../support/mutation-run';
import {
  HAND_PRESET_IDS,
  HAND_SETTINGS,
  HUMBUCKER,
  SECTION6,
  SINGLE,
  audioY,
  difference,
  engineValues,
  handNetlist,
  potHalves,
} from './hand-netlists';

// 50 points a decade; 10 in the mutation runs (tests/support/mutation-run.ts).
const FREQS = acDecade(sized(50, 10), 20, 20000);

describe('the hand-written pieces themselves', () => {
  it('the audio law is the published one: y(0) = 0, y(0.5) = y_m, y(1) = 1, and Holmes 2017 b = (1/y_m − 1)²', () => {
    for (const ym of [0.1, 0.15, 0.2]) {
      expect(audioY(ym, 0)).toBe(0);
      expect(audioY(ym, 1)).toBeCloseTo(1, 14);
      expect(audioY(ym, 0.5)).toBeCloseTo(ym, 14);
    }
    // y_m = 0.1: b = 81, y(0.25) = (3 − 1)/80 = 0.025 exactly (81^0.25 = 3)
    expect(audioY(0.1, 0.25)).toBeCloseTo(0.025, 14);
    // a 500 kΩ pot at y_m = 0.15 on dial 5 splits 75 kΩ / 425 kΩ
    const [low, high] = potHalves(500e3, { kind: 'audio', mid: 0.15 }, 5);
    expect(low).toBeCloseTo(75e3, 6);
    expect(high).toBeCloseTo(425e3, 6);
    // a reverse pot described by y(0.5) = 0.8 gives 80 % of the track at mid-rotation
    expect(potHalves(1, { kind: 'reverse', mid: 0.8 }, 5)[0]).toBeCloseTo(0.8, 14);
  });

  it('the reference solver gives the RC low-pass its standard corner: −3.0103 dB and −45° at 1/(2πRC)', () => {
    // standard circuit theory (any introductory circuits text)
    const fc = 1 / (2 * Math.PI * 10e3 * 10e-9);
    const [z] = solveAc(parseSpice('rc\nV1 in 0 DC 0 AC 1\nR1 in out 10000\nC1 out 0 10e-9\n.end'), [fc]);
    expect(10 * Math.log10(z!.re ** 2 + z!.im ** 2)).toBeCloseTo(-10 * Math.log10(2), 12);
    expect((Math.atan2(z!.im, z!.re) * 180) / Math.PI).toBeCloseTo(-45, 11);
  });
});

describe('every preset against its hand-written netlist (reference solver)', () => {
  it('every preset of the engine has a hand-written netlist here', () => {
    expect([...HAND_PRESET_IDS].sort()).toEqual(HARNESS_PRESETS.map((p) => p.id).sort());
  });

  let worst = { db: 0, deg: 0 };
  for (const values of [HUMBUCKER, SINGLE, SECTION6]) {
    for (const id of HAND_PRESET_IDS) {
      it(`${id}, ${values.label}: ${HAND_SETTINGS.length} knob settings within 1e-5 dB and 1e-4°`, () => {
        const netlist = getPreset(id)!.build(engineValues(values));
        for (const [volume, tone] of HAND_SETTINGS) {
          const ref = solveAc(parseSpice(handNetlist(id, values, volume, tone)), FREQS);
          const sim = simulate(netlist, { volume, tone }, FREQS);
          const d = difference(ref, sim);
          const where = `${id} at volume ${volume}, tone ${tone}`;
          expect(d.points, where).toBeGreaterThan((FREQS.length * 2) / 3);
          expect(d.db, where).toBeLessThan(1e-5);
          expect(d.deg, where).toBeLessThan(1e-4);
          worst = { db: Math.max(worst.db, d.db), deg: Math.max(worst.deg, d.deg) };
        }
      });
    }
  }
  afterAll(() => {
    console.info(
      `hand-written netlists, reference solver: max |ΔdB| = ${worst.db.toExponential(2)}, max |Δphase| = ${worst.deg.toExponential(2)}°`,
    );
  });
});

describe('inductor parts', () => {
  // Series-L low-pass and shunt-L high-pass, each driven by an ideal source through Rs (a pickup
  // with L = C = 0). First-order RL sections: ω_c = R/L, |H| = 1/√2 (−3.0103 dB) at ω_c, phase
  // −45° (low-pass) and +45° (high-pass) there (J. W. Nilsson and S. A. Riedel, "Electric
  // Circuits", chapter "Introduction to frequency selective circuits", the series RL low-pass and
  // high-pass filters — cited from memory).
  const Rs = 1e3;
  const R = 9e3;
  const L = 0.5;
  const lowPass: Netlist = {
    parts: [
      { kind: 'pickup', id: 'src', hot: 'in', cold: '0', R: Rs, L: 0, C: 0 },
      { kind: 'inductor', id: 'l1', a: 'in', b: 'out', L },
      { kind: 'resistor', id: 'r1', a: 'out', b: '0', R },
    ],
  };
  const highPass: Netlist = {
    parts: [
      { kind: 'pickup', id: 'src', hot: 'in', cold: '0', R: Rs, L: 0, C: 0 },
      { kind: 'resistor', id: 'r1', a: 'in', b: 'out', R },
      { kind: 'inductor', id: 'l1', a: 'out', b: '0', L },
    ],
  };
  const knobs = { volume: 10, tone: 10 };

  it('series L low-pass: R/(Rs + R) in the pass band, 3.0103 dB lower and −45° at f = (Rs + R)/(2πL)', () => {
    const fc = (Rs + R) / (2 * Math.PI * L);
    const sim = simulate(lowPass, knobs, [fc / 1000, fc, fc * 100]);
    const pass = 20 * Math.log10(R / (Rs + R));
    expect(sim.magnitudeDb[0]!).toBeCloseTo(pass, 5);
    expect(sim.magnitudeDb[1]!).toBeCloseTo(pass - 10 * Math.log10(2), 9);
    expect(sim.phaseDeg[1]!).toBeCloseTo(-45, 8);
    // two decades above: −20 dB a decade, |H| = k/√(1 + 100²)
    expect(sim.magnitudeDb[2]!).toBeCloseTo(pass - 10 * Math.log10(1 + 1e4), 9);
    expect(sim.phaseDeg[2]!).toBeCloseTo((-Math.atan(100) * 180) / Math.PI, 8);
  });

  it('shunt L high-pass: −3.0103 dB and +45° at f = (Rs + R)/(2πL)', () => {
    // L sees the Thevenin resistance Rs + R; the output is the voltage across L:
    // H = jωL/(Rs + R + jωL), corner (Rs + R)/(2πL), |H| = 1/√2 and +45° there.
    const fc = (Rs + R) / (2 * Math.PI * L);
    const sim = simulate(highPass, knobs, [fc, fc / 100]);
    expect(sim.magnitudeDb[0]!).toBeCloseTo(-10 * Math.log10(2), 9);
    expect(sim.phaseDeg[0]!).toBeCloseTo(45, 8);
    expect(sim.phaseDeg[1]!).toBeCloseTo((Math.atan(100) * 180) / Math.PI, 8);
  });

  it('both agree with their hand-written netlists within 1e-5 dB and 1e-4°', () => {
    const low = solveAc(parseSpice(`rl\nV1 emf 0 DC 0 AC 1\nRs emf in ${Rs}\nL1 in out ${L}\nR1 out 0 ${R}\n.end`), FREQS);
    const high = solveAc(parseSpice(`rl\nV1 emf 0 DC 0 AC 1\nRs emf in ${Rs}\nR1 in out ${R}\nL1 out 0 ${L}\n.end`), FREQS);
    for (const [ref, net] of [
      [low, lowPass],
      [high, highPass],
    ] as const) {
      const d = difference(ref, simulate(net, knobs, FREQS));
      expect(d.points).toBe(FREQS.length);
      expect(d.db).toBeLessThan(1e-5);
      expect(d.deg).toBeLessThan(1e-4);
    }
  });

  it('series LC band-reject (a node with no resistive path, so the pivoting path): notch at 1/(2π√(LC)), H = Z/(Rs + Z)', () => {
    // Series RLC band-reject filter, centre ω0 = 1/√(LC) (Nilsson and Riedel, same chapter; from memory).
    const C = 22e-9;
    const notch: Netlist = {
      parts: [
        { kind: 'pickup', id: 'src', hot: 'out', cold: '0', R: Rs, L: 0, C: 0 },
        { kind: 'capacitor', id: 'c1', a: 'out', b: 'mid', C },
        { kind: 'inductor', id: 'l1', a: 'mid', b: '0', L },
      ],
    };
    expect(compileHarness(notch).staticOrder).toBe(false);
    const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
    const sim = simulate(notch, knobs, [f0, 2 * f0, f0 / 2]);
    expect(sim.magnitudeDb[0]!).toBeLessThan(-200);
    for (const [k, f] of [
      [1, 2 * f0],
      [2, f0 / 2],
    ] as const) {
      const w = 2 * Math.PI * f;
      const x = w * L - 1 / (w * C); // Z = jx
      expect(sim.magnitudeDb[k]!).toBeCloseTo(10 * Math.log10((x * x) / (Rs * Rs + x * x)), 9);
      expect(sim.phaseDeg[k]!).toBeCloseTo((Math.atan2(x * Rs, x * x) * 180) / Math.PI, 8); // jx/(Rs + jx) = (x² + jxRs)/(Rs² + x²)
    }
    const ref = solveAc(parseSpice(`lc\nV1 emf 0 DC 0 AC 1\nRs emf out ${Rs}\nC1 out mid ${C}\nL1 mid 0 ${L}\n.end`), FREQS);
    const d = difference(ref, simulate(notch, knobs, FREQS));
    expect(d.points).toBeGreaterThan(FREQS.length * 0.9);
    expect(d.db).toBeLessThan(1e-5);
    expect(d.deg).toBeLessThan(1e-4);
  });
});
