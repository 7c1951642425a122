// The lot statistics refuse what they cannot judge, each in words that name the value (a reading by its
// row and index, the tolerance, the matching settings), and one side of a tolerance below 0 is refused
// even when the other side makes the total positive.
import { describe, expect, it } from 'vitest';
import { lotStatistics, matchSets, summaryStatistics } from '@shared/analysis/lot-stats';

const lot = (over: Partial<Parameters<typeof lotStatistics>[0]>) =>
  lotStatistics({ nominal: 47e-9, tolerancePct: 5, values: [47e-9, 47.5e-9, 46.8e-9], ...over });

describe('refusals', () => {
  it('a reading that is not a finite number, by its row and index', () => {
    expect(() => lot({ values: [47e-9, Number.NaN, 47e-9] })).toThrow('lotStatistics: value 2 (index 1) is not a finite number (NaN).');
    expect(() => summaryStatistics([1, 2, 3, Number.POSITIVE_INFINITY])).toThrow(
      'summaryStatistics: value 4 (index 3) is not a finite number (Infinity).',
    );
    expect(() => summaryStatistics([])).toThrow('summaryStatistics needs at least one value.');
    expect(() => lot({ values: [] })).toThrow('lotStatistics needs at least one value.');
  });

  it('a tolerance that is not finite, or below 0 on either side, or 0 in all', () => {
    const words = 'lotStatistics needs a tolerance above 0 %.';
    expect(() => lot({ tolerancePct: Number.NaN })).toThrow(words);
    expect(() => lot({ tolerancePlusPct: Number.POSITIVE_INFINITY })).toThrow(words);
    expect(() => lot({ tolerancePct: -1, tolerancePlusPct: 5 })).toThrow(words);
    expect(() => lot({ tolerancePct: 5, tolerancePlusPct: -1 })).toThrow(words);
    expect(() => lot({ tolerancePct: 0, tolerancePlusPct: 0 })).toThrow(words);
    // One side of 0 with the other above it is a tolerance (all above, or all below, nominal).
    expect(lot({ tolerancePct: 0, tolerancePlusPct: 10 }).n).toBe(3);
    expect(() => lot({ nominal: 0 })).toThrow('lotStatistics needs a finite, non-zero nominal.');
  });

  it('matching settings: a percentage that is not a finite number ≥ 0, a set size that is not a whole number ≥ 2', () => {
    const sorted = new Float64Array([1, 1.001, 1.002, 1.5]);
    const order = new Uint32Array([0, 1, 2, 3]);
    for (const pct of [Number.NaN, -0.5, Number.POSITIVE_INFINITY])
      expect(() => matchSets(sorted, order, pct)).toThrow('matchPct must be a finite number ≥ 0.');
    for (const size of [1, 2.5, 0]) expect(() => matchSets(sorted, order, 1, size)).toThrow('setSize must be a whole number ≥ 2.');
    // The edges themselves are allowed: 0 % (equal values only) and pairs.
    expect(matchSets(new Float64Array([2, 2, 3]), new Uint32Array([0, 1, 2]), 0, 2)).toHaveLength(1);
  });
});
