import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  E_SERIES,
  E_SERIES_NAMES,
  E_SERIES_TOLERANCE_PCT,
  isPreferredValue,
  nearestPreferred,
  type ESeriesName,
} from '@shared/series/e-series';

// Source: tests/fixtures/iec/iec60063-<series>.txt — IEC 60063 values as tabulated in a public
// library, cross-checked against a university book appendix (each file's first line says so).
function fixture(series: ESeriesName): { source: string; values: number[] } {
  const path = fileURLToPath(new URL(`../../fixtures/iec/iec60063-${series}.txt`, import.meta.url));
  const lines = readFileSync(path, 'utf8').split('\n');
  return {
    source: lines[0]!,
    values: lines.filter((l) => l.trim() !== '' && !l.startsWith('#')).map(Number),
  };
}

describe('E-series constants against the IEC 60063 fixtures, value for value', () => {
  for (const s of E_SERIES_NAMES) {
    it(s, () => {
      const f = fixture(s);
      expect(f.source).toMatch(new RegExp(`^# Source: IEC 60063 preferred-number series ${s} `));
      expect(f.values.length).toBe(Number(s.slice(1)));
      expect([...E_SERIES[s]]).toEqual(f.values);
    });
  }
  it("nesting E6 ⊂ E12 ⊂ E24 and E48 ⊂ E96 ⊂ E192 (IEC 60063 as tabulated in the fixtures' source)", () => {
    const sub = (a: ESeriesName, b: ESeriesName) => E_SERIES[a].every((v) => E_SERIES[b].includes(v));
    expect(sub('E6', 'E12') && sub('E12', 'E24') && sub('E48', 'E96') && sub('E96', 'E192')).toBe(true);
  });
});

describe('nearestPreferred', () => {
  it.each([
    [9.6e3, 'E12', 10e3], // across the decade boundary
    [4.8e3, 'E12', 4.7e3],
    [22.5e-9, 'E6', 22e-9],
    [0.26e-6, 'E6', 0.22e-6], // 0.26/0.22 = 1.18 < 0.33/0.26 = 1.27
    [1e-6, 'E24', 1e-6],
    [0.00999, 'E96', 0.01],
    [487.2, 'E96', 487],
    [250e3, 'E12', 270e3], // geometric: 270/250 = 1.08 < 250/220 = 1.136
    [3.0e3, 'E24', 3.0e3], // an irregular E24 value (reference: 30 instead of 29)
  ] as const)('%d in %s → %d', (v, s, p) => {
    const r = nearestPreferred(v, s);
    expect(r.value).toBe(p);
    expect(r.deviationPct).toBeCloseTo(((v - p) / p) * 100, 12);
  });

  it('names what it refuses: the value, or an unknown series', () => {
    expect(() => nearestPreferred(-2.5, 'E12')).toThrow(/positive finite value, got -2\.5/);
    expect(() => nearestPreferred(1, 'E7' as ESeriesName)).toThrow(/Unknown series "E7"/);
  });

  it('refuses non-positive and non-finite values', () => {
    expect(() => nearestPreferred(0, 'E12')).toThrow(RangeError);
    expect(() => nearestPreferred(-1, 'E12')).toThrow(RangeError);
    expect(() => nearestPreferred(NaN, 'E12')).toThrow(RangeError);
  });

  it('returns a member of the series, and no member is nearer on a log scale (property, brute force over 3 decades)', () => {
    fc.assert(
      fc.property(fc.double({ min: -13, max: 10, noNaN: true }), fc.constantFrom(...E_SERIES_NAMES), (e, s) => {
        const v = 10 ** e;
        const r = nearestPreferred(v, s);
        expect(isPreferredValue(r.value, s)).toBe(true);
        const digits = E_SERIES[s][0]! >= 100 ? 3 : 2;
        const decade = Math.floor(Math.log10(v));
        let best = Infinity;
        for (let d = decade - 1; d <= decade + 1; d++) {
          for (const b of E_SERIES[s]) {
            const p = b * 10 ** (d - (digits - 1));
            best = Math.min(best, Math.abs(Math.log(v / p)));
          }
        }
        expect(Math.abs(Math.log(v / r.value))).toBeLessThanOrEqual(best + 1e-12);
        // The base value must appear in the tabulated decade.
        const mant = r.value / 10 ** (Math.floor(Math.log10(r.value) + 1e-12) - (digits - 1));
        expect(E_SERIES[s]).toContain(Math.round(mant));
      }),
      { numRuns: 500 },
    );
  });

  it('every tabulated value maps to itself in every decade used by parts (1 pF … 10 MΩ)', () => {
    for (const s of E_SERIES_NAMES) {
      const digits = E_SERIES[s][0]! >= 100 ? 3 : 2;
      for (let d = -12; d <= 7; d++) {
        for (const b of E_SERIES[s]) {
          const p = Number(`${b}e${d - (digits - 1)}`);
          const r = nearestPreferred(p, s);
          expect(r.value).toBe(p);
          expect(r.deviationPct).toBe(0);
        }
      }
    }
  });
});

describe('isPreferredValue', () => {
  it('members within the relative tolerance (inclusive), others not; non-positive and non-finite values are not members', () => {
    expect(isPreferredValue(4.7e3, 'E12')).toBe(true);
    expect(isPreferredValue(4.8e3, 'E12')).toBe(false);
    // 10.625 against the E6 member 10: 0.625 apart, exactly 6.25 % of 10 (binary-exact numbers)
    expect(isPreferredValue(10.625, 'E6', 0.0625)).toBe(true);
    expect(isPreferredValue(10.625, 'E6', 0.06)).toBe(false);
    for (const v of [0, -4.7, NaN, Infinity]) expect(isPreferredValue(v, 'E12'), String(v)).toBe(false);
  });
});

describe('E_SERIES_TOLERANCE_PCT against the fixtures ("Nominal tolerance usually associated")', () => {
  for (const s of E_SERIES_NAMES) {
    it(s, () => {
      const pct = Number(/usually associated: ([\d.]+)%/.exec(fixture(s).source)![1]);
      expect(E_SERIES_TOLERANCE_PCT[s]).toBe(pct);
    });
  }
});
