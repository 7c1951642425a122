// Lot statistics at their edges, against values worked by hand in this file: quartiles by
// Hyndman–Fan type 7 (R. J. Hyndman and Y. Fan, "Sample quantiles in statistical packages", The
// American Statistician 50, 1996), Tukey's fences at 1.5 IQR, Freedman–Diaconis and Sturges
// histogram bins (D. Freedman and P. Diaconis 1981; H. A. Sturges 1926, from memory), and Cp from the
// NIST/SEMATECH e-Handbook §6.1.6. No simulator.
import { describe, expect, it } from 'vitest';
import { defaultBinEdgesPct, lotStatistics, summaryStatistics } from '@shared/analysis/lot-stats';

describe('input checks and their messages', () => {
  it('a value that is not finite is named by position and index; no values at all is refused', () => {
    expect(() => summaryStatistics([1, Number.NaN])).toThrow('summaryStatistics: value 2 (index 1) is not a finite number (NaN).');
    expect(() => lotStatistics({ values: [1, 2, Infinity], nominal: 1, tolerancePct: 5 })).toThrow(
      'lotStatistics: value 3 (index 2) is not a finite number (Infinity).',
    );
    expect(() => summaryStatistics([])).toThrow('summaryStatistics needs at least one value.');
  });

  it('tolerances: not finite or negative on either side refused; one side of 0 % is allowed', () => {
    const base = { values: [1, 2, 3], nominal: 2 };
    for (const t of [
      { tolerancePct: Number.NaN },
      { tolerancePct: 5, tolerancePlusPct: Infinity },
      { tolerancePct: Infinity, tolerancePlusPct: 5 },
      { tolerancePct: -1, tolerancePlusPct: 5 },
      { tolerancePct: 5, tolerancePlusPct: -1 },
    ])
      expect(() => lotStatistics({ ...base, ...t })).toThrow('lotStatistics needs a tolerance above 0 %.');
    // −0 %/+100 %: the limits are the nominal and twice it.
    const r = lotStatistics({ ...base, tolerancePct: 0, tolerancePlusPct: 100 });
    expect([r.lower, r.upper]).toEqual([2, 4]);
    const s = lotStatistics({ ...base, tolerancePct: 100, tolerancePlusPct: 0 });
    expect([s.lower, s.upper]).toEqual([0, 2]);
  });

  it('custom bin edges: two are enough; equal or non-finite edges refused', () => {
    expect(lotStatistics({ values: [1], nominal: 1, tolerancePct: 5, binEdgesPct: [-1, 1] }).bins).toHaveLength(3);
    for (const binEdgesPct of [[1], [1, 1], [0, Number.NaN]])
      expect(() => lotStatistics({ values: [1], nominal: 1, tolerancePct: 5, binEdgesPct })).toThrow('strictly ascending');
  });

  it('matched sets: matchPct negative or not finite, and a set size below 2 or a fraction, are refused', () => {
    for (const matchPct of [-1, Number.NaN])
      expect(() => lotStatistics({ values: [1, 2], nominal: 1, tolerancePct: 5, matchPct })).toThrow(
        'matchPct must be a finite number ≥ 0.',
      );
    for (const setSize of [1, 2.5])
      expect(() => lotStatistics({ values: [1, 2], nominal: 1, tolerancePct: 5, matchPct: 1, setSize })).toThrow(
        'setSize must be a whole number ≥ 2.',
      );
  });
});

describe('default deviation-bin edges', () => {
  it('a side of 0 % has no inner edges', () => {
    expect(defaultBinEdgesPct(0, 100)).toEqual([0, 10, 25, 50, 100]);
    expect(defaultBinEdgesPct(20, 0)).toEqual([-20, -10, -5, -2, 0]);
  });
});

describe('histogram layout', () => {
  it('Freedman–Diaconis: 1…8 against 4.5 ± 100 % (limits 0 and 9): IQR 3.5, width 2·3.5/∛8 = 3.5, three bins', () => {
    const r = lotStatistics({ values: [1, 2, 3, 4, 5, 6, 7, 8], nominal: 4.5, tolerancePct: 100 });
    // Type 7 quartiles of 1…8: 1 + 0.25·7 = 2.75 and 1 + 0.75·7 = 6.25.
    expect([r.q1, r.q3]).toEqual([2.75, 6.25]);
    expect(r.histogram.binWidth).toBe(3.5);
    // ⌈9/3.5⌉ = 3 bins from 0; the last edge 10.5 already covers 9.
    expect(r.histogram.edges).toEqual([0, 3.5, 7, 10.5]);
    expect(r.histogram.counts).toEqual([3, 3, 2]);
  });

  it('IQR 0: Sturges, ⌈log2 8⌉ + 1 = 4 bins over the limits; a value on the upper limit goes in the last bin', () => {
    const r = lotStatistics({ values: [100, 100, 100, 100, 100, 100, 100, 110], nominal: 100, tolerancePct: 10 });
    expect(r.histogram.binWidth).toBe(5);
    expect(r.histogram.edges).toEqual([90, 95, 100, 105, 110]);
    expect(r.histogram.counts).toEqual([0, 0, 7, 1]);
  });

  it('more than 1000 Freedman–Diaconis bins are cut to 1000 over the whole range, with every value counted', () => {
    const r = lotStatistics({ values: [100, 100.001, 100.002, 100.003], nominal: 100, tolerancePct: 10 });
    expect(r.histogram.counts).toHaveLength(1000);
    expect(r.histogram.edges).toHaveLength(1001);
    expect(r.histogram.binWidth).toBeCloseTo(20 / 1000, 15);
    expect(r.histogram.edges[0]).toBe(90);
    expect(r.histogram.edges[1000]).toBeGreaterThanOrEqual(110);
    expect(r.histogram.counts.reduce((a, b) => a + b, 0)).toBe(4);
  });
});

describe('fences, bins and capability at their edges', () => {
  it("Tukey's fences: a value on a fence is not an outlier", () => {
    // 0, 10, 10, 10, 10, 20: q1 = q3 = 10 (type 7), IQR 0, fences 10 and 10: only 0 and 20 are outside.
    const r = lotStatistics({ values: [0, 10, 10, 10, 10, 20], nominal: 10, tolerancePct: 100 });
    expect(r.outliers).toEqual({ lowFence: 10, highFence: 10, indices: [0, 5] });
  });

  it('custom edges: a deviation exactly on the first edge is inside, exactly on the last edge is in the last inner bin', () => {
    const r = lotStatistics({ values: [98, 102, 97.9, 102.1], nominal: 100, tolerancePct: 10, binEdgesPct: [-2, 0, 2] });
    expect(r.bins.map((b) => b.count)).toEqual([1, 1, 1, 1]);
    expect(r.bins[0]!.fromPct).toBe(-Infinity);
    expect(r.bins[3]!.toPct).toBe(Infinity);
    // No indices unless asked for.
    expect(r.bins.some((b) => 'indices' in b)).toBe(false);
  });

  it('Cp and Cpk with two parts (n = 2 is enough)', () => {
    // 99 and 101 against 100 ± 10 %: SD = √2, Cp = (110 − 90)/(6√2), Cpk = min(10, 10)/(3√2).
    const r = lotStatistics({ values: [99, 101], nominal: 100, tolerancePct: 10 });
    expect(r.cp).toBeCloseTo(20 / (6 * Math.SQRT2), 12);
    expect(r.cpk).toBeCloseTo(10 / (3 * Math.SQRT2), 12);
  });

  it('a second quantity exactly at its limit is not a failure', () => {
    const r = lotStatistics({ values: [1, 2], nominal: 1, tolerancePct: 50, second: { values: [0.02, 0.0201], max: 0.02 } });
    expect(r.secondFailures).toEqual([1]);
  });
});

describe('matched sets at their edges', () => {
  it('zeros never match, with or without a set size', () => {
    expect(lotStatistics({ values: [0, 0, 5], nominal: 5, tolerancePct: 100, matchPct: 1, setSize: 2 }).matchedSets).toEqual([]);
    expect(lotStatistics({ values: [0, 0, 5], nominal: 5, tolerancePct: 100, matchPct: 1 }).matchedSets).toEqual([]);
  });

  it('without a set size: larger sets first, then the tighter of equal size', () => {
    // From 100 every value within 10 % of it: 100, 105, 109 (spread 9 %); then 200, 201 (0.5 %);
    // then 300, 303 (1 %). By hand.
    const values = [300, 105, 200, 100, 303, 109, 201];
    const r = lotStatistics({ values, nominal: 200, tolerancePct: 100, matchPct: 10 });
    expect(r.matchedSets.map((s) => s.indices.map((i) => values[i]))).toEqual([
      [100, 105, 109],
      [200, 201],
      [300, 303],
    ]);
    expect(r.matchedSets[1]!.spreadPct).toBeCloseTo(0.5, 12);
    expect(r.matchedSets[0]!.meanValue).toBeCloseTo(314 / 3, 12);
  });
});
