import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { instrumentUncertainty, judge, limitsFromTolerance } from '@shared/analysis/verdict';

describe('limitsFromTolerance', () => {
  it('nominal ± tolerance, and the asymmetric −20 %/+80 % of the Z letter', () => {
    expect(limitsFromTolerance(500e3, 20)).toEqual({ lower: 400e3, upper: 600e3 });
    const z = limitsFromTolerance(22e-9, { minusPct: 20, plusPct: 80 });
    expect(z.lower).toBeCloseTo(17.6e-9, 20);
    expect(z.upper).toBeCloseTo(39.6e-9, 20);
    expect(() => limitsFromTolerance(1, -5)).toThrow(RangeError);
  });
});

describe('instrumentUncertainty: U = p % · |reading| + counts · resolution', () => {
  it('±(0.5 % + 2 counts) at 598.0 kΩ on a range with 100 Ω per count (arithmetic by hand: 2990 + 200)', () => {
    expect(instrumentUncertainty(598e3, { pctOfReading: 0.5, counts: 2, resolution: 100 })).toBeCloseTo(3190, 9);
  });
  it('uses the magnitude of a negative reading', () => {
    expect(instrumentUncertainty(-10, { pctOfReading: 1, counts: 1, resolution: 0.01 })).toBeCloseTo(0.11, 12);
  });
  it('refuses negative accuracy figures', () => {
    expect(() => instrumentUncertainty(1, { pctOfReading: -1, counts: 0, resolution: 0 })).toThrow(RangeError);
  });
});

// Decision rule: JCGM 106:2012 §8 (guarded acceptance) and ILAC-G8:09/2019 §4.2: pass when
// [value − U, value + U] lies inside the limits, fail when wholly outside, otherwise marginal.
describe('judge — guarded acceptance', () => {
  const L = limitsFromTolerance(500e3, 20); // 400 kΩ … 600 kΩ
  const U = 3190;

  it('pass well inside, with a readable reason', () => {
    const v = judge({ value: 487e3, nominal: 500e3, ...L, uncertainty: U, unit: 'Ω' });
    expect(v.verdict).toBe('pass');
    expect(v.rule).toBe('guarded');
    expect(v.deviationPct).toBeCloseTo(-2.6, 12);
    expect(v.reason).toBe('487 kΩ is 2.6 % under nominal 500 kΩ, inside ±20 % even allowing for the measurement uncertainty (±3.19 kΩ)');
  });

  it('marginal when the upper limit lies within the uncertainty', () => {
    const v = judge({ value: 598e3, nominal: 500e3, ...L, uncertainty: U, unit: 'Ω' });
    expect(v.verdict).toBe('marginal');
    expect(v.reason).toMatch(/^598 kΩ is 19\.6 % over nominal 500 kΩ, within the measurement uncertainty \(±3\.19 kΩ\) of the upper limit 600 kΩ/);
  });

  it('marginal just outside a limit (still within U of it)', () => {
    const v = judge({ value: 398e3, nominal: 500e3, ...L, uncertainty: U, unit: 'Ω' });
    expect(v.verdict).toBe('marginal');
    expect(v.reason).toMatch(/lower limit 400 kΩ/);
  });

  it('fail when the whole interval is outside, saying by how much', () => {
    const v = judge({ value: 620e3, nominal: 500e3, ...L, uncertainty: U, unit: 'Ω' });
    expect(v.verdict).toBe('fail');
    expect(v.reason).toBe(
      '620 kΩ is 24 % over nominal 500 kΩ, outside ±20 %: above the upper limit 600 kΩ by 20 kΩ, more than the measurement uncertainty (±3.19 kΩ)',
    );
  });

  it('an interval straddling both limits names the nearer one (JCGM 106:2012 §8 zones; naming is ours)', () => {
    // 490–510 Ω with U = 25 Ω: at 505 Ω the upper limit is 5 Ω away and the lower 15 Ω, at 495 Ω the reverse.
    const up = judge({ value: 505, lower: 490, upper: 510, uncertainty: 25, unit: 'Ω' });
    expect(up.verdict).toBe('marginal');
    expect(up.reason).toMatch(/of the upper limit 510 Ω/);
    const down = judge({ value: 495, lower: 490, upper: 510, uncertainty: 25, unit: 'Ω' });
    expect(down.verdict).toBe('marginal');
    expect(down.reason).toMatch(/of the lower limit 490 Ω/);
  });

  it('an interval straddling one limit names that limit, from either side of it', () => {
    // U = 10 Ω around each reading; only one limit lies within reach.
    for (const [value, which] of [
      [595, 'upper limit 600 Ω'],
      [605, 'upper limit 600 Ω'],
      [405, 'lower limit 400 Ω'],
      [395, 'lower limit 400 Ω'],
    ] as const) {
      const v = judge({ value, lower: 400, upper: 600, uncertainty: 10, unit: 'Ω' });
      expect(v.verdict, String(value)).toBe('marginal');
      expect(v.reason, String(value)).toContain(`of the ${which}`);
    }
  });

  it('boundaries: an interval touching a limit from inside passes, from outside is marginal', () => {
    expect(judge({ value: 590, lower: 400, upper: 600, uncertainty: 10, unit: 'Ω' }).verdict).toBe('pass');
    expect(judge({ value: 610, lower: 400, upper: 600, uncertainty: 10, unit: 'Ω' }).verdict).toBe('marginal');
    expect(judge({ value: 610.000001, lower: 400, upper: 600, uncertainty: 10, unit: 'Ω' }).verdict).toBe('fail');
  });

  it('an uncertainty wider than the whole tolerance band can never pass', () => {
    expect(judge({ value: 500, lower: 490, upper: 510, uncertainty: 20, unit: 'Ω' }).verdict).toBe('marginal');
  });

  it('agrees with the interval definition for any input (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 0, max: 500, noNaN: true }),
        (value, U, lower, width) => {
          const upper = lower + width;
          const v = judge({ value, lower, upper, uncertainty: U, unit: 'V' });
          const inside = value - U >= lower && value + U <= upper;
          const outside = value + U < lower || value - U > upper;
          expect(v.verdict).toBe(inside ? 'pass' : outside ? 'fail' : 'marginal');
        },
      ),
      { numRuns: 500 },
    );
  });
});

describe('judge — simple acceptance when no uncertainty is known', () => {
  const L = limitsFromTolerance(500e3, 20);
  it('pass inside, and the reason says the rule', () => {
    const v = judge({ value: 487e3, nominal: 500e3, ...L, unit: 'Ω' });
    expect(v).toMatchObject({ verdict: 'pass', rule: 'simple', uncertainty: null });
    expect(v.reason).toBe('487 kΩ is 2.6 % under nominal 500 kΩ, inside ±20 % (simple acceptance: no measurement uncertainty given)');
  });
  it('on the limit passes (limits inclusive); beyond fails with the margin', () => {
    expect(judge({ value: 600e3, nominal: 500e3, ...L, unit: 'Ω' }).verdict).toBe('pass');
    const v = judge({ value: 397e3, nominal: 500e3, ...L, unit: 'Ω' });
    expect(v.verdict).toBe('fail');
    expect(v.reason).toMatch(/^397 kΩ is 20\.6 % under nominal 500 kΩ, outside ±20 %: below the lower limit 400 kΩ by 3 kΩ \(simple acceptance/);
  });
  it('without a nominal the reason names the limits; asymmetric limits are shown as such', () => {
    const v = judge({ value: 1.2e-3, lower: 1e-3, upper: 2e-3, unit: 'H' });
    expect(v.deviationPct).toBeNull();
    expect(v.reason).toMatch(/^1\.2 mH, inside the limits 1 mH … 2 mH/);
    const z = judge({ value: 30e-9, nominal: 22e-9, ...limitsFromTolerance(22e-9, { minusPct: 20, plusPct: 80 }), unit: 'F' });
    expect(z.reason).toMatch(/inside −20 %\/\+80 %/);
  });
  it('refuses inverted limits and non-finite values', () => {
    expect(() => judge({ value: 1, lower: 2, upper: 1, unit: 'Ω' })).toThrow(RangeError);
    expect(() => judge({ value: NaN, lower: 0, upper: 1, unit: 'Ω' })).toThrow(RangeError);
    expect(() => judge({ value: 1, lower: 0, upper: 2, uncertainty: -1, unit: 'Ω' })).toThrow(RangeError);
  });
});
