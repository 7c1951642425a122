// sortWithIndex, quantileSorted7 and orderByKey on the cases lot-stats.test.ts does not reach:
// values one unit in the last place apart (closer than the index carried in the mantissa, so the
// repair pass must order them), empty input, and ties at the ends. The reference is the plain
// comparator sort; the quantile is Hyndman & Fan (1996) definition 7, worked by hand here.
import { describe, expect, it } from 'vitest';
import { orderByKey, quantileSorted7, sortWithIndex } from '@shared/analysis/lot-sort';
import { seededRandom } from '@shared/random/seeded';

const expectSortedWithIndex = (x: Float64Array) => {
  const { sorted, order } = sortWithIndex(x);
  expect(Array.from(sorted)).toEqual(Array.from(x).sort((a, b) => a - b));
  expect(Array.from(order).sort((a, b) => a - b)).toEqual(Array.from(x, (_, i) => i));
  for (let i = 0; i < x.length; i++) expect(sorted[i]).toBe(x[order[i]!]);
};

describe('sortWithIndex', () => {
  it('nothing in, nothing out', () => {
    const { sorted, order } = sortWithIndex(new Float64Array(0));
    expect(sorted.length).toBe(0);
    expect(order.length).toBe(0);
  });

  it('values a few units in the last place apart, in every arrangement of a seeded shuffle', () => {
    const ulp = 2 ** -52;
    const r = seededRandom(5);
    for (const n of [2, 3, 17, 300, 1025]) {
      const x = Float64Array.from({ length: n }, () => 1 + Math.floor(r() * 9) * ulp);
      expectSortedWithIndex(x);
      // Strictly descending: every neighbour pair is within the perturbation.
      expectSortedWithIndex(Float64Array.from({ length: Math.min(n, 9) }, (_, i) => 1 + (8 - i) * ulp));
    }
  });

  it('past the index bits a lot may carry (2^24 values; lowered here) the comparator sort gives the same answer', () => {
    const x = Float64Array.from([3, -1, 2.5, 0, 9, 2.5, -7]); // 7 values need 3 index bits
    for (const maxIndexBits of [2, 3]) {
      const { sorted, order } = sortWithIndex(x, maxIndexBits);
      expect(Array.from(sorted)).toEqual([-7, -1, 0, 2.5, 2.5, 3, 9]);
      expect(Array.from(order).sort((a, b) => a - b)).toEqual([0, 1, 2, 3, 4, 5, 6]);
      for (let i = 0; i < x.length; i++) expect(sorted[i]).toBe(x[order[i]!]);
      expect([order[0], order[1], order[2], order[5], order[6]]).toEqual([6, 1, 3, 0, 4]);
    }
  });

  it('negative, zero and mixed magnitudes', () => {
    expectSortedWithIndex(Float64Array.from([3, -1, 0, -1e-300, 1e300, -2.5, 0, 7]));
    expectSortedWithIndex(Float64Array.from([1]));
  });
});

describe('quantileSorted7 (Hyndman & Fan definition 7)', () => {
  it('interpolates between order statistics: 1, 2, 3, 4 → Q1 1.75, median 2.5, Q3 3.25, ends exact', () => {
    const s = [1, 2, 3, 4];
    expect(quantileSorted7(s, 0.25)).toBe(1.75);
    expect(quantileSorted7(s, 0.5)).toBe(2.5);
    expect(quantileSorted7(s, 0.75)).toBe(3.25);
    expect(quantileSorted7(s, 0)).toBe(1);
    expect(quantileSorted7(s, 1)).toBe(4);
    expect(quantileSorted7([1, 2, 3], 0.5)).toBe(2);
    expect(quantileSorted7([7], 0.3)).toBe(7);
    expect(quantileSorted7([], 0.5)).toBeNaN();
  });
});

describe('orderByKey', () => {
  it('ties at the start, in the middle and at the end are ordered by the second key', () => {
    const keys = Float64Array.from([5, 1, 5, 3, 1, 5, 3, 1]);
    const tie = Float64Array.from([3, 9, 1, 4, 2, 2, 0, 5]);
    expect(Array.from(orderByKey(keys, tie))).toEqual([4, 7, 1, 6, 3, 2, 5, 0]);
  });

  it('all keys equal: the order is the second key', () => {
    expect(Array.from(orderByKey(Float64Array.from([2, 2, 2]), Float64Array.from([3, 1, 2])))).toEqual([1, 2, 0]);
  });
});
