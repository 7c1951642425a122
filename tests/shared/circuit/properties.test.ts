// Properties of any passive harness (standard circuit theory), over random part values and knob
// settings (fast-check).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { HARNESS_PRESETS, type HarnessValues } from '@shared/circuit/presets';
import { compileHarness, setKnobs, solve, solvePoint } from '@shared/circuit/solver';
import { DEFAULT_FREQUENCIES } from '@shared/circuit/metrics';
import type { Netlist, Part } from '@shared/circuit/netlist';
import type { TaperLaw } from '@shared/taper/law';
import { sized } from '../../support/mutation-run';

/** Log-uniform positive value between lo and hi. */
const logUniform = (lo: number, hi: number) => fc.double({ min: 0, max: 1, noNaN: true }).map((u) => lo * (hi / lo) ** u);
const law: fc.Arbitrary<TaperLaw> = fc.oneof(
  fc.constant<TaperLaw>({ kind: 'linear' }),
  fc.double({ min: 0.05, max: 0.45, noNaN: true }).map((m): TaperLaw => ({ kind: 'audio', m })),
  fc.double({ min: 0.55, max: 0.95, noNaN: true }).map((m): TaperLaw => ({ kind: 'reverse', m })),
  fc.double({ min: 0.05, max: 0.45, noNaN: true }).map((m): TaperLaw => ({ kind: 'two-segment', m })),
);
const values: fc.Arbitrary<HarnessValues> = fc.record({
  pickupR: logUniform(1e3, 20e3),
  pickupL: logUniform(0.5, 10),
  pickupC: logUniform(20e-12, 500e-12),
  volumeR: logUniform(100e3, 1e6),
  volumeLaw: law,
  toneR: logUniform(100e3, 1e6),
  toneLaw: law,
  toneC: logUniform(1e-9, 100e-9),
  bleedC: logUniform(100e-12, 5e-9),
  bleedR: logUniform(10e3, 1e6),
  floorR: logUniform(100, 100e3),
  secondC: logUniform(1e-9, 100e-9),
  cableCapPerMetre: logUniform(50e-12, 200e-12),
  cableLength: fc.double({ min: 0.5, max: 10, noNaN: true }),
  ampR: logUniform(100e3, 10e6),
});
const knob = fc.double({ min: 0, max: 10, noNaN: true });
const preset = fc.constantFrom(...HARNESS_PRESETS);
const FREQS = [20, 100, 500, 1000, 2500, 5000, 10000, 20000];

describe('harness properties', () => {
  it('passivity: the power into the amplifier input never exceeds what the pickup can deliver', () => {
    // Maximum power transfer theorem: an EMF E behind a series resistance R delivers at most
    // E²/(4R) into any passive network, so |V_out|²/R_amp ≤ 1/(4·R_pickup) for E = 1 V.
    fc.assert(
      fc.property(preset, values, knob, knob, (p, v, volume, tone) => {
        const h = solve(compileHarness(p.build(v)), { volume, tone }, FREQS);
        for (let k = 0; k < FREQS.length; k++) {
          const power = (h.re[k]! ** 2 + h.im[k]! ** 2) / v.ampR;
          expect(power).toBeLessThanOrEqual((1 / (4 * v.pickupR)) * (1 + 1e-9));
        }
      }),
      { numRuns: sized(200, 25) },
    );
  });

  it('volume 0 leaves next to nothing at the output (below −100 dB)', () => {
    fc.assert(
      fc.property(preset, values, knob, (p, v, tone) => {
        const h = solve(compileHarness(p.build(v)), { volume: 0, tone }, FREQS);
        for (let k = 0; k < FREQS.length; k++) expect(10 * Math.log10(h.re[k]! ** 2 + h.im[k]! ** 2)).toBeLessThan(-100);
      }),
      { numRuns: sized(100, 25) },
    );
  });

  it('impedance scaling: all R and L × k, all C ÷ k leaves the transfer unchanged', () => {
    // Standard circuit theory: every impedance scales by k, so voltage ratios do not change.
    fc.assert(
      fc.property(preset, values, knob, knob, logUniform(0.01, 100), (p, v, volume, tone, k) => {
        const scaled: HarnessValues = {
          ...v,
          pickupR: v.pickupR * k,
          pickupL: v.pickupL * k,
          pickupC: v.pickupC / k,
          volumeR: v.volumeR * k,
          toneR: v.toneR * k,
          toneC: v.toneC / k,
          bleedC: v.bleedC / k,
          bleedR: v.bleedR * k,
          floorR: v.floorR * k,
          secondC: v.secondC / k,
          cableCapPerMetre: v.cableCapPerMetre / k,
          ampR: v.ampR * k,
        };
        // keep the pot end stops off the 1 mΩ clamp, which does not scale
        const knobs = { volume: 0.2 + volume * 0.96, tone: 0.2 + tone * 0.96 };
        const a = solve(compileHarness(p.build(v)), knobs, FREQS);
        const b = solve(compileHarness(p.build(scaled)), knobs, FREQS);
        for (let i = 0; i < FREQS.length; i++) {
          const mag = Math.hypot(a.re[i]!, a.im[i]!);
          expect(Math.hypot(a.re[i]! - b.re[i]!, a.im[i]! - b.im[i]!)).toBeLessThan(1e-8 * mag);
        }
      }),
      { numRuns: sized(100, 25) },
    );
  });

  it('frequency scaling: all L and C ÷ k moves the response up by k in frequency', () => {
    fc.assert(
      fc.property(preset, values, knob, knob, logUniform(0.1, 10), (p, v, volume, tone, k) => {
        const scaled: HarnessValues = {
          ...v,
          pickupL: v.pickupL / k,
          pickupC: v.pickupC / k,
          toneC: v.toneC / k,
          bleedC: v.bleedC / k,
          secondC: v.secondC / k,
          cableCapPerMetre: v.cableCapPerMetre / k,
        };
        const a = solve(compileHarness(p.build(v)), { volume, tone }, FREQS);
        const b = solve(
          compileHarness(p.build(scaled)),
          { volume, tone },
          FREQS.map((f) => f * k),
        );
        for (let i = 0; i < FREQS.length; i++) {
          const mag = Math.hypot(a.re[i]!, a.im[i]!);
          expect(Math.hypot(a.re[i]! - b.re[i]!, a.im[i]! - b.im[i]!)).toBeLessThanOrEqual(1e-8 * mag);
        }
      }),
      { numRuns: sized(100, 25) },
    );
  });

  it('a reverse-law pot wired end for end at 10 − x is the audio-law pot at x', () => {
    // With mid-rotation values 1 − m and m, y_reverse(1 − x) = 1 − y_audio(x) (shared/taper/law.ts),
    // so the two halves simply swap ends.
    fc.assert(
      fc.property(preset, values, knob, knob, fc.double({ min: 0.05, max: 0.45, noNaN: true }), (p, v, volume, tone, m) => {
        const audio = p.build({ ...v, volumeLaw: { kind: 'audio', m } });
        const swapped: Netlist = {
          parts: audio.parts.map((part): Part =>
            part.id === 'volume' && part.kind === 'pot'
              ? { ...part, a: part.b!, b: part.a, law: { kind: 'reverse', m: 1 - m }, knob: { fixed: 10 - volume } }
              : part,
          ),
        };
        const a = solve(compileHarness(audio), { volume, tone }, FREQS);
        const b = solve(compileHarness(swapped), { volume, tone }, FREQS);
        for (let i = 0; i < FREQS.length; i++) {
          const mag = Math.hypot(a.re[i]!, a.im[i]!);
          // Floor 1e-12 (−240 dB): with the knob within a hair of 0 the two wirings clamp their
          // pot halves at the 1 mΩ minimum at slightly different points, leaving ~1e-17 V.
          expect(Math.hypot(a.re[i]! - b.re[i]!, a.im[i]! - b.im[i]!)).toBeLessThanOrEqual(1e-9 * mag + 1e-12);
        }
      }),
      { numRuns: sized(100, 25) },
    );
  });

  it('the fixed-order fast path and dense partial pivoting agree', () => {
    fc.assert(
      fc.property(preset, values, knob, knob, (p, v, volume, tone) => {
        const c = compileHarness(p.build(v));
        expect(c.staticOrder).toBe(true);
        const fast = solve(c, { volume, tone }, DEFAULT_FREQUENCIES);
        setKnobs(c, { volume, tone });
        for (let k = 0; k < DEFAULT_FREQUENCIES.length; k += 10) {
          solvePoint(c, DEFAULT_FREQUENCIES[k]!, 'pivoting');
          const mag = Math.hypot(c.hRe, c.hIm);
          expect(Math.hypot(c.hRe - fast.re[k]!, c.hIm - fast.im[k]!)).toBeLessThan(1e-6 * mag);
        }
      }),
      { numRuns: sized(100, 25) },
    );
  });
});
