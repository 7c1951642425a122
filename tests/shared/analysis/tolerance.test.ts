// Two-sided tolerances: IEC 60062 letter Z is −20 %/+80 % (tests/fixtures/iec/iec60062-marking-codes.txt).
import { describe, expect, it } from 'vitest';
import { defaultBinEdgesPct, lotStatistics } from '@shared/analysis/lot-stats';
import { judgeReading } from '@shared/analysis/reading-verdict';
import { parseToleranceText, toleranceOf, toleranceWords } from '@shared/analysis/tolerance';
import { decodeMarking } from '@shared/markings/decode';

describe('tolerance words and text', () => {
  it('writes one side as ± and two as −/+', () => {
    expect(toleranceWords(5)).toBe('±5 %');
    expect(toleranceWords(5, 5)).toBe('±5 %');
    expect(toleranceWords(20, 80)).toBe('−20 %/+80 %');
    expect(toleranceWords(null)).toBe('not set');
    expect(toleranceOf(10, null)).toEqual({ minusPct: 10, plusPct: 10 });
  });
  it('reads what people type', () => {
    expect(parseToleranceText('5')).toEqual({ ok: true, value: { minusPct: 5, plusPct: 5 } });
    expect(parseToleranceText('±2,5 %')).toEqual({ ok: true, value: { minusPct: 2.5, plusPct: 2.5 } });
    expect(parseToleranceText('−20/+80')).toEqual({ ok: true, value: { minusPct: 20, plusPct: 80 } });
    expect(parseToleranceText('-20 % +80 %')).toEqual({ ok: true, value: { minusPct: 20, plusPct: 80 } });
    expect(parseToleranceText('+80/-20')).toEqual({ ok: true, value: { minusPct: 20, plusPct: 80 } });
    expect(parseToleranceText('')).toEqual({ ok: true, value: null });
    for (const bad of ['abc', '+20/+80', '0', '150', '-120/+10', '5 5']) expect(parseToleranceText(bad).ok).toBe(false);
  });
});

describe('Z limits in the engine', () => {
  const z = decodeMarking('104Z');
  it('the marking and a part with the same sides give the same limits: 80 nF and 180 nF', () => {
    expect(z.limits).toEqual({ lower: 80e-9, upper: 180e-9 });
    const part = { kind: 'capacitor' as const, nominal: 100e-9, tolerancePct: 20, tolerancePlusPct: 80 };
    const on = judgeReading(part, { quantity: 'capacitance', value: 180e-9 })!;
    expect(on.verdict).toBe('pass');
    expect(on.source).toBe('part tolerance −20 %/+80 %');
    expect(judgeReading(part, { quantity: 'capacitance', value: 80e-9 })!.verdict).toBe('pass');
    expect(judgeReading(part, { quantity: 'capacitance', value: 181e-9 })!.verdict).toBe('fail');
    // without the upper side the part is symmetric, as rows stored before it existed
    expect(judgeReading({ ...part, tolerancePlusPct: null }, { quantity: 'capacitance', value: 150e-9 })!.verdict).toBe('fail');
  });
  it('lot bins follow each side; Cp is about the midpoint, not nominal', () => {
    expect(defaultBinEdgesPct(20, 80)).toEqual([-20, -10, -5, -2, 0, 8, 20, 40, 80]);
    expect(defaultBinEdgesPct(5)).toEqual([-5, -2.5, -1.25, -0.5, 0, 0.5, 1.25, 2.5, 5]);
    const s = lotStatistics({ values: [90e-9, 120e-9, 130e-9, 170e-9, 185e-9], nominal: 100e-9, tolerancePct: 20, tolerancePlusPct: 80 });
    expect([s.lower, s.upper, s.countBelow, s.countAbove, s.asymmetric]).toEqual([80e-9, 180e-9, 0, 1, true]);
    expect(s.midpoint).toBeCloseTo(130e-9, 20);
    const sym = lotStatistics({ values: [99e-9, 101e-9], nominal: 100e-9, tolerancePct: 5 });
    expect(sym.asymmetric).toBe(false);
  });
});
