// The pot laws of shared/taper/law.ts (taper fit, harness engine, comparison), checked against the worked examples of
// ../shared/reference/worked-examples.txt (copied here with their source lines).
import { describe, expect, it } from 'vitest';
import { lawMid, lawValue, taperLaw, taperLawValue } from '@shared/taper/law';

describe('lawValue', () => {
  // Source: B. Holmes, "Modelling logarithmic potentiometer laws", 2017 — y = a·b^x − a, a = 1/(b−1),
  // b = (1/ym − 1)² (READ); the y values are DERIVED in worked-examples.txt (lines pot-exp-10/15/20):
  // pot-exp-10|ym=0.10|y(0.25)=0.025; y(0.5)=0.1; y(0.75)=0.325
  // pot-exp-15|ym=0.15|y(0.25)=0.044372; y(0.5)=0.15; y(0.75)=0.401444
  // pot-exp-20|ym=0.20|y(0.25)=0.0666667; y(0.5)=0.2; y(0.75)=0.466667
  const cases: [number, number, number, number][] = [
    [0.1, 0.025, 0.1, 0.325],
    [0.15, 0.044372, 0.15, 0.401444],
    [0.2, 0.0666667, 0.2, 0.466667],
  ];
  for (const [m, q1, mid, q3] of cases) {
    it(`exponential audio law, m = ${m}`, () => {
      const law = { kind: 'audio', m } as const;
      expect(lawValue(law, 0.25)).toBeCloseTo(q1, 6);
      expect(lawValue(law, 0.5)).toBeCloseTo(mid, 12);
      expect(lawValue(law, 0.75)).toBeCloseTo(q3, 6);
      expect(lawValue(law, 0)).toBe(0);
      expect(lawValue(law, 1)).toBeCloseTo(1, 14);
    });
  }

  it('a 10 % log taper of 10 kΩ gives 1 kΩ at mid-rotation', () => {
    // Source: Wikipedia "Potentiometer" (READ via a mirror, worked-examples.txt taper-10pct):
    // "10% log taper on a 10K ohm potentiometer would yield 1K at the midpoint".
    expect(10e3 * lawValue({ kind: 'audio', m: 0.1 }, 0.5)).toBeCloseTo(1e3, 9);
  });

  it('anti-log m = 0.85 passes through 0.85 at mid-rotation', () => {
    // worked-examples.txt pot-exp-85 (Holmes: "for an anti-log pot ... around 0.85").
    expect(lawValue({ kind: 'audio', m: 0.85 }, 0.5)).toBeCloseTo(0.85, 12);
  });

  it('linear and two-segment laws follow their definitions (COMPUTATION.md §3)', () => {
    expect(lawValue({ kind: 'linear' }, 0.37)).toBe(0.37);
    const seg = { kind: 'two-segment', m: 0.2 } as const;
    expect(lawValue(seg, 0.25)).toBeCloseTo(0.1, 15);
    expect(lawValue(seg, 0.5)).toBeCloseTo(0.2, 15);
    expect(lawValue(seg, 0.75)).toBeCloseTo(0.6, 15);
  });

  it('reverse audio is the audio law turned end for end, with m = y(0.5) like every law', () => {
    // The mirror image y = 1 − f(1 − x) of the pot-exp-10 law above (ym = 0.10): at x = 0.75 it is
    // 1 − 0.025, at x = 0.25 it is 1 − 0.325, and at mid-rotation 1 − 0.1 = 0.9, its m.
    const rev = { kind: 'reverse', m: 0.9 } as const;
    expect(lawValue(rev, 0.75)).toBeCloseTo(0.975, 6);
    expect(lawValue(rev, 0.25)).toBeCloseTo(0.675, 6);
    expect(lawValue(rev, 0.5)).toBeCloseTo(0.9, 12);
    expect(lawMid(rev)).toBe(0.9);
    // The identity worked out in shared/taper/law.ts, at every hundredth of the rotation and several m.
    for (const m of [0.55, 0.7, 0.85, 0.95]) {
      for (let k = 0; k <= 100; k++) {
        const x = k / 100;
        expect(lawValue({ kind: 'reverse', m }, x)).toBeCloseTo(1 - lawValue({ kind: 'audio', m: 1 - m }, 1 - x), 12);
      }
    }
  });

  it('taperLaw and lawMid carry the same m for every law (linear is 0.5)', () => {
    expect(taperLaw('linear', 0.3)).toEqual({ kind: 'linear' });
    expect(lawMid(taperLaw('linear', 0.3))).toBe(0.5);
    for (const kind of ['audio', 'reverse', 'two-segment'] as const) {
      const law = taperLaw(kind, 0.8);
      expect(lawMid(law)).toBe(0.8);
      expect(lawValue(law, 0.5)).toBeCloseTo(0.8, 12);
      expect(taperLawValue(kind, 0.8, 0.3)).toBe(lawValue(law, 0.3));
    }
  });

  it('m = 0.5 is the straight line (the limit of the exponential law) and x is clamped to 0–1', () => {
    expect(lawValue({ kind: 'audio', m: 0.5 }, 0.3)).toBe(0.3);
    expect(lawValue({ kind: 'audio', m: 0.1 }, -0.2)).toBe(0);
    expect(lawValue({ kind: 'audio', m: 0.1 }, 1.4)).toBeCloseTo(1, 14);
  });
});
