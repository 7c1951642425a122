// The words of a verdict for limits that touch the nominal and for a nominal that gives no
// percentage (the rules of docs/computation.md §2; simple acceptance as in ILAC-G8:09/2019 §4.2.1).
// The expected sentences are written out by hand from the figures. No simulator.
import { describe, expect, it } from 'vitest';
import { judge } from '@shared/analysis/verdict';

const note = ' (simple acceptance: no measurement uncertainty given)';

describe('judge: limits in words', () => {
  it('limits from the nominal up (−0 %/+80 %) and up to the nominal (−20 %/+0 %)', () => {
    expect(judge({ value: 150, nominal: 100, lower: 100, upper: 180, unit: 'Ω' }).reason).toBe(
      `150 Ω is 50 % over nominal 100 Ω, inside −0 %/+80 %${note}`,
    );
    expect(judge({ value: 90, nominal: 100, lower: 80, upper: 100, unit: 'Ω' }).reason).toBe(
      `90 Ω is 10 % under nominal 100 Ω, inside −20 %/+0 %${note}`,
    );
  });

  it('no nominal, a zero nominal or one that is not finite: no deviation, and the limits by value', () => {
    for (const nominal of [undefined, 0, Number.NaN]) {
      const v = judge({ value: 1, nominal, lower: -2, upper: 2, unit: 'V' });
      expect(v.deviationPct).toBeNull();
      expect(v.reason).toBe(`1 V, inside the limits -2 V … 2 V${note}`);
    }
  });
});
