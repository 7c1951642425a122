// Degenerate harnesses whose response has a closed form (standard theory, derived here; the
// formulas are those of C. K. Alexander and M. N. O. Sadiku, "Fundamentals of Electric Circuits",
// from memory): RC low-pass corner, series RLC resonance, capacitors in series,
// a loaded pot divider. Each checks the solver and the metrics against the formula.
import { describe, expect, it } from 'vitest';
import type { Netlist } from '@shared/circuit/netlist';
import { compileHarness, solve } from '@shared/circuit/solver';
import { simulate } from '@shared/circuit/metrics';

const db = (re: number, im: number) => 10 * Math.log10(re * re + im * im);
const deg = (re: number, im: number) => (Math.atan2(im, re) * 180) / Math.PI;

/** An ideal-ish source: EMF behind R only (L = 0, C = 0), its hot terminal on the output. */
function sourceR(R: number, extra: Netlist['parts']): Netlist {
  return { parts: [{ kind: 'pickup', id: 'src', hot: 'out', cold: '0', R, L: 0, C: 0 }, ...extra] };
}

describe('closed-form circuits (standard theory, derived here)', () => {
  it('RC low-pass: −3.0103 dB and −45° at f = 1/(2πRC)', () => {
    const R = 10e3;
    const C = 10e-9;
    const fc = 1 / (2 * Math.PI * R * C);
    const h = solve(compileHarness(sourceR(R, [{ kind: 'capacitor', id: 'c', a: 'out', b: '0', C }])), { volume: 10, tone: 10 }, [
      fc,
      fc / 100,
      fc * 100,
    ]);
    expect(db(h.re[0]!, h.im[0]!)).toBeCloseTo(-10 * Math.log10(2), 10); // −3.0103 dB
    expect(deg(h.re[0]!, h.im[0]!)).toBeCloseTo(-45, 9);
    // far below: flat; far above: −20 dB a decade, so −40 dB two decades up (1/√(1 + 100²))
    expect(db(h.re[1]!, h.im[1]!)).toBeCloseTo(-10 * Math.log10(1 + 1e-4), 10);
    expect(db(h.re[2]!, h.im[2]!)).toBeCloseTo(-10 * Math.log10(1 + 1e4), 10);
  });

  it('series RLC: −90° at f0 = 1/(2π√(LC)) with |H| = Q = √(L/C)/R, peak at f0·√(1 − 1/(2Q²))', () => {
    // tests/fixtures/examples/lc-resonance.txt row resonance-1: L = 2.4 H, C = 300 pF gives
    // f0 = 5931 Hz — standard theory, derived there; pickup-like inputs are common practice (no published source).
    const L = 2.4;
    const C = 300e-12;
    const R = 5e3;
    const netlist: Netlist = { parts: [{ kind: 'pickup', id: 'coil', hot: 'out', cold: '0', R, L, C }] };
    const f0 = 1 / (2 * Math.PI * Math.sqrt(L * C));
    // the engine's phase crosses −90° between 5930.5 Hz and 5931.5 Hz, i.e. at the worked 5931 Hz
    const around = solve(compileHarness(netlist), { volume: 10, tone: 10 }, [5930.5, 5931.5]);
    expect(deg(around.re[0]!, around.im[0]!)).toBeGreaterThan(-90);
    expect(deg(around.re[1]!, around.im[1]!)).toBeLessThan(-90);
    const h = solve(compileHarness(netlist), { volume: 10, tone: 10 }, [f0]);
    const Q = Math.sqrt(L / C) / R;
    expect(deg(h.re[0]!, h.im[0]!)).toBeCloseTo(-90, 8);
    expect(db(h.re[0]!, h.im[0]!)).toBeCloseTo(20 * Math.log10(Q), 9);
    // maximum of |1/(1 − u² + ju/Q)| at u² = 1 − 1/(2Q²), height Q/√(1 − 1/(4Q²))
    const sim = simulate(netlist, { volume: 10, tone: 10 });
    expect(sim.metrics.peak.interior).toBe(true);
    expect(sim.metrics.peak.frequency / (f0 * Math.sqrt(1 - 1 / (2 * Q * Q)))).toBeCloseTo(1, 7);
    expect(sim.metrics.peak.levelDb).toBeCloseTo(20 * Math.log10(Q / Math.sqrt(1 - 1 / (4 * Q * Q))), 9);
  });

  it('lc-resonance.txt row resonance-2: 2.4 H with 2.4 nF resonates at 2097 Hz', () => {
    const netlist: Netlist = { parts: [{ kind: 'pickup', id: 'coil', hot: 'out', cold: '0', R: 1e3, L: 2.4, C: 2.4e-9 }] };
    const f0 = 1 / (2 * Math.PI * Math.sqrt(2.4 * 2.4e-9));
    const h = solve(compileHarness(netlist), { volume: 10, tone: 10 }, [f0, 2096.5, 2097.5]);
    expect(deg(h.re[0]!, h.im[0]!)).toBeCloseTo(-90, 8);
    // the −90° crossing lies between 2096.5 Hz and 2097.5 Hz: the worked 2097 Hz
    expect(deg(h.re[1]!, h.im[1]!)).toBeGreaterThan(-90);
    expect(deg(h.re[2]!, h.im[2]!)).toBeLessThan(-90);
  });

  it('capacitors in series act as C1·C2/(C1 + C2): the RC corner moves to 1/(2πR·Cs)', () => {
    // The middle node has no resistive path to ground, so this also exercises the pivoting path.
    const C1 = 22e-9;
    const C2 = 10e-9;
    const Cs = (C1 * C2) / (C1 + C2);
    const R = 10e3;
    const netlist = sourceR(R, [
      { kind: 'capacitor', id: 'c1', a: 'out', b: 'mid', C: C1 },
      { kind: 'capacitor', id: 'c2', a: 'mid', b: '0', C: C2 },
    ]);
    const c = compileHarness(netlist);
    expect(c.staticOrder).toBe(false);
    const fc = 1 / (2 * Math.PI * R * Cs);
    const h = solve(c, { volume: 10, tone: 10 }, [fc]);
    expect(db(h.re[0]!, h.im[0]!)).toBeCloseTo(-10 * Math.log10(2), 10);
    expect(deg(h.re[0]!, h.im[0]!)).toBeCloseTo(-45, 9);
    // the pair and a single capacitor of Cs give the same response at every frequency
    const single = compileHarness(sourceR(R, [{ kind: 'capacitor', id: 'cs', a: 'out', b: '0', C: Cs }]));
    const freqs = [20, 200, 2000, 20000];
    const pair = solve(c, { volume: 10, tone: 10 }, freqs);
    const one = solve(single, { volume: 10, tone: 10 }, freqs);
    freqs.forEach((_, k) => {
      expect(pair.re[k]!).toBeCloseTo(one.re[k]!, 12);
      expect(pair.im[k]!).toBeCloseTo(one.im[k]!, 12);
    });
  });

  it('loaded linear pot: Vout/Vin = x·k / ((1 − x)(x + k) + x·k), k = RL/R', () => {
    // tests/fixtures/examples/law-faking.txt (standard theory, derived there by circuit analysis):
    // lawfake-k0.10|g(0.25)=0.0869565; g(0.5)=0.142857; g(0.75)=0.260870
    // lawfake-k0.20|g(0.25)=0.129032; g(0.5)=0.222222; g(0.75)=0.387097
    // An EMF behind 1 nΩ stands for the ideal source (its effect is ~1e-15 relative).
    const R = 500e3;
    const cases: [number, number[]][] = [
      [0.1, [0.0869565, 0.142857, 0.26087]],
      [0.2, [0.129032, 0.222222, 0.387097]],
    ];
    for (const [k, expected] of cases) {
      const netlist: Netlist = {
        parts: [
          { kind: 'pickup', id: 'src', hot: 'hot', cold: '0', R: 1e-9, L: 0, C: 0 },
          { kind: 'pot', id: 'vol', a: '0', b: 'hot', w: 'out', R, law: { kind: 'linear' }, knob: 'volume' },
          { kind: 'resistor', id: 'load', a: 'out', b: '0', R: k * R },
        ],
      };
      const c = compileHarness(netlist);
      [0.25, 0.5, 0.75].forEach((x, i) => {
        const h = solve(c, { volume: x * 10, tone: 0 }, [1000]);
        expect(h.re[0]!).toBeCloseTo(expected[i]!, 6);
        expect(h.re[0]!).toBeCloseTo((x * k) / ((1 - x) * (x + k) + x * k), 12);
        expect(Math.abs(h.im[0]!)).toBeLessThan(1e-12);
      });
    }
  });
});
