import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { accuracyAt, instrumentUncertainty, judge, limitsFromTolerance, meterRange } from '@shared/analysis/verdict';
import { parseValue } from '@shared/units/parse';
import { sized } from '../../support/mutation-run';

function readSeries(name: string): number[] {
  const text = readFileSync(new URL(`../../fixtures/iec/iec60063-${name}.txt`, import.meta.url), 'utf8');
  return text
    .split('\n')
    .filter((l) => /^\d+$/.test(l.trim()))
    .map(Number);
}

describe('limitsFromTolerance', () => {
  it('nominal ± tolerance, and the asymmetric −20 %/+80 % of the Z letter', () => {
    expect(limitsFromTolerance(500e3, 20)).toEqual({ lower: 400e3, upper: 600e3 });
    const z = limitsFromTolerance(22e-9, { minusPct: 20, plusPct: 80 });
    expect(z.lower).toBeCloseTo(17.6e-9, 20);
    expect(z.upper).toBeCloseTo(39.6e-9, 20);
    expect(() => limitsFromTolerance(1, -5)).toThrow(RangeError);
  });
});

describe('a reading exactly on a decimal tolerance limit conforms (simple acceptance)', () => {
  // The limit a tolerance means is the decimal value nominal · (1 ± tol/100); a reading typed as that
  // decimal conforms (ILAC-G8:09/2019 §4.2.1: simple acceptance, limits inclusive).
  it('101 nF on 100 nF ± 1 % and 12 pF on 10 pF ± 20 % pass', () => {
    const a = limitsFromTolerance(100e-9, 1);
    expect(judge({ value: parseValue('101n', 'capacitance').value, ...a, unit: 'F' }).verdict).toBe('pass');
    expect(judge({ value: parseValue('99n', 'capacitance').value, ...a, unit: 'F' }).verdict).toBe('pass');
    const b = limitsFromTolerance(10e-12, 20);
    expect(judge({ value: parseValue('12p', 'capacitance').value, ...b, unit: 'F' }).verdict).toBe('pass');
    expect(judge({ value: parseValue('12.0001p', 'capacitance').value, ...b, unit: 'F' }).verdict).toBe('fail');
  });

  it('property: E24 nominals 1 pF … 1 MΩ, tolerances 0.1 … 20 %, a reading typed on either limit passes', () => {
    // E24 values: IEC 60063 (tests/fixtures/iec/iec60063-E24.txt).
    const e24 = readSeries('E24');
    fc.assert(
      fc.property(
        fc.constantFrom(...e24),
        fc.integer({ min: -12, max: 5 }), // 10…91 × 10^k covers 1 pF … 1 MΩ (in F or Ω)
        fc.integer({ min: 1, max: 200 }), // tolerance in tenths of a percent: 0.1 … 20 %
        fc.boolean(),
        (d, k, tenths, upperSide) => {
          const nominal = Number(`${d}e${k - 1}`);
          // The limit as decimal text, by integer arithmetic: d·(1000 ± tenths) × 10^(k − 1 − 3).
          const mant = d * (1000 + (upperSide ? tenths : -tenths));
          const typed = `${mant}e${k - 4}`;
          const reading = parseValue(typed).value;
          const lim = limitsFromTolerance(nominal, tenths / 10);
          const v = judge({ value: reading, nominal, ...lim, unit: 'F' });
          expect(v.verdict, `${typed} on ${nominal} ± ${tenths / 10} %`).toBe('pass');
        },
      ),
      { numRuns: sized(2000, 300) },
    );
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
    expect(v.reason).toMatch(
      /^598 kΩ is 19\.6 % over nominal 500 kΩ, within the measurement uncertainty \(±3\.19 kΩ\) of the upper limit 600 kΩ/,
    );
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
    expect(v.reason).toMatch(
      /^397 kΩ is 20\.6 % under nominal 500 kΩ, outside ±20 %: below the lower limit 400 kΩ by 3 kΩ \(simple acceptance/,
    );
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

describe('meter accuracy per range (display counts)', () => {
  // A 6000-count meter: ranges 6 kΩ, 60 kΩ, 600 kΩ …; one count is the range / 6000 (common
  // practice for auto-ranging meters, no published source). Arithmetic by hand.
  it('the range is the smallest counts × 10^k that holds the reading', () => {
    expect(meterRange(598e3, 6000)).toBe(600e3);
    expect(meterRange(5.98e3, 6000)).toBe(6e3);
    expect(meterRange(6e3, 6000)).toBe(60e3); // 6000 counts display 0 … 5999
    expect(meterRange(47e-9, 4000)).toBeCloseTo(400e-9, 20);
  });
  it('±(0.5 % + 2 counts): 100 Ω counts on the 600 kΩ range, 1 Ω counts on the 6 kΩ range', () => {
    const acc = { pctOfReading: 0.5, counts: 2, resolution: 0 };
    expect(instrumentUncertainty(598e3, accuracyAt(598e3, acc, 6000))).toBeCloseTo(2990 + 200, 9);
    expect(instrumentUncertainty(5.98e3, accuracyAt(5.98e3, acc, 6000))).toBeCloseTo(29.9 + 2, 9);
  });
  it('an accuracy stated for one range is used on that range only', () => {
    const acc = { pctOfReading: 0.5, counts: 2, resolution: 0, ranges: [{ range: 6e6, pctOfReading: 1.5, counts: 3 }] };
    expect(accuracyAt(5e6, acc, 6000)).toEqual({ pctOfReading: 1.5, counts: 3, resolution: 1000 });
    expect(accuracyAt(5e5, acc, 6000)).toEqual({ pctOfReading: 0.5, counts: 2, resolution: 100 });
    expect(accuracyAt(5e5, acc, null)).toBe(acc); // no display counts recorded: the fixed resolution
  });
});
