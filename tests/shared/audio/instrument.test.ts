// A whole instrument through Listen: the filter's own response of the summed transfer (the FFT of
// the zero-padded impulse response, a fine grid) against the engine's simulateInstrument, and the
// per-pickup transfers adding up to it (superposition, the engine's per-source solve).
// Method: frequency-sampling FIR design (A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal
// Processing" — cited from memory); the reference is the engine's own exact response.
import { describe, expect, it } from 'vitest';
import { filterResponse, impulseResponse, instrumentResponses } from '@shared/audio/impulse';
import { buildLayoutNetlist, getLayout, layoutKnobs, LAYOUTS, type LayoutDef } from '@shared/circuit/layouts';
import { simulateInstrument } from '@shared/circuit/metrics';

const db = (re: number, im: number) => 10 * Math.log10(re * re + im * im);

/** A combined position where there is one (the pickups' transfers both count), else position 0. */
const POSITION: Record<string, number> = { 'one-pickup': 0, 'two-pickups-3way': 1, 'three-pickups-5way': 3, 'dual-coil': 0 };

/** One knob setting: every volume at 6, every tone at 4. */
function knobsFor(layout: LayoutDef): Record<string, number> {
  return layoutKnobs(layout, Object.fromEntries(layout.knobs.map((k) => [k.id, /tone/.test(k.id) ? 4 : 6])));
}

describe('instrumentResponses: a layout as Listen hears it', () => {
  for (const layout of LAYOUTS) {
    it(`${layout.id}: the summed transfer's filter response is within 0.1 dB of simulateInstrument, 50 Hz–10 kHz (48 kHz, volumes 6, tones 4)`, () => {
      const config = {
        selector: POSITION[layout.id]!,
        options: Object.fromEntries(layout.options.map((o) => [o.id, o.choices[0]!.id])),
        values: Object.fromEntries(layout.values.filter((v) => v.default !== null).map((v) => [v.key, v.default!])),
      };
      const net = buildLayoutNetlist(getLayout(layout.id)!, config);
      const knobs = knobsFor(layout);
      const fr = filterResponse(impulseResponse(instrumentResponses(net, knobs).total, 48000), 8);
      const idx: number[] = [];
      for (let k = 0; k < fr.frequencies.length; k++) if (fr.frequencies[k]! >= 50 && fr.frequencies[k]! <= 10000) idx.push(k);
      const sim = simulateInstrument(
        net,
        knobs,
        Float64Array.from(idx, (k) => fr.frequencies[k]!),
      );
      let worst = 0;
      idx.forEach((k, j) => {
        worst = Math.max(worst, Math.abs(db(fr.re[k]!, fr.im[k]!) - sim.magnitudeDb[j]!));
      });
      expect(worst, `${layout.id}: ${worst.toFixed(4)} dB`).toBeLessThan(0.1);
    });
  }

  it('two pickups, reversed phase, "both": one response per pickup, each equal to simulateInstrument\'s perPickup, and they sum to the total', () => {
    const layout = getLayout('two-pickups-3way')!;
    const values = Object.fromEntries(layout.values.filter((v) => v.default !== null).map((v) => [v.key, v.default!]));
    const options = { ...Object.fromEntries(layout.options.map((o) => [o.id, o.choices[0]!.id])), phase: 'reversed' };
    const net = buildLayoutNetlist(layout, { selector: 1, options, values });
    const knobs = knobsFor(layout);
    const r = instrumentResponses(net, knobs);
    expect(r.pickups.map((p) => p.pickupId).sort()).toEqual(['bridge', 'neck']);
    const f = Float64Array.of(100, 200, 1000, 5000);
    const sim = simulateInstrument(net, knobs, f);
    const sumRe = new Float64Array(4);
    const sumIm = new Float64Array(4);
    for (const p of r.pickups) {
      const re = new Float64Array(4);
      const im = new Float64Array(4);
      p.response(f, re, im);
      const ref = sim.perPickup.find((q) => q.pickupId === p.pickupId)!;
      for (let k = 0; k < 4; k++) {
        expect(db(re[k]!, im[k]!)).toBeCloseTo(ref.magnitudeDb[k]!, 9);
        sumRe[k]! += re[k]!;
        sumIm[k]! += im[k]!;
      }
    }
    for (let k = 0; k < 4; k++) expect(db(sumRe[k]!, sumIm[k]!)).toBeCloseTo(sim.magnitudeDb[k]!, 9);
  });
});
