import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseValue, tryParseValue, ValueParseError } from '@shared/units/parse';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT, type Quantity } from '@shared/units/quantities';

// Relative comparison: parsing goes through one decimal-to-binary rounding, so results are
// compared with the double nearest the decimal value written in the test.
function expectValue(text: string, quantity: Quantity | undefined, value: number, unit: string) {
  const r = parseValue(text, quantity);
  expect(r.unit).toBe(unit);
  expect(r.value).toBe(value);
}

describe('parseValue — accepted forms (docs/computation.md §1)', () => {
  it.each([
    ['22n', 'capacitance', 22e-9],
    ['0.022uF', 'capacitance', 22e-9],
    ['0,022 µF', 'capacitance', 22e-9], // U+00B5 micro sign, comma decimal
    ['0,022 μF', 'capacitance', 22e-9], // U+03BC Greek mu
    ['22 nF', 'capacitance', 22e-9],
    ['22pf', 'capacitance', 22e-12],
    ['100pF', 'capacitance', 100e-12],
    ['2n2', 'capacitance', 2.2e-9], // RKM, IEC 60062 (reference row rkm|4n7)
    ['4u7', 'capacitance', 4.7e-6],
    ['1mF', 'capacitance', 1e-3], // explicit unit: SI milli
    ['470K', 'resistance', 470e3],
    ['4k7', 'resistance', 4.7e3], // RKM
    ['4K7', 'resistance', 4.7e3], // reference row rkm|4K7
    ['47K3', 'resistance', 47.3e3], // reference row rkm|47K3
    ['4M7', 'resistance', 4.7e6], // reference row rkm|4M7
    ['1R5', 'resistance', 1.5],
    ['4R7', 'resistance', 4.7], // reference row rkm|4R7
    ['R47', 'resistance', 0.47], // reference row rkm|R47
    ['470R', 'resistance', 470], // reference row rkm|470R
    ['1M', 'resistance', 1e6],
    ['1meg', 'resistance', 1e6],
    ['1MEG', 'resistance', 1e6],
    ['6.2 kΩ', 'resistance', 6.2e3],
    ['6.2 kΩ', 'resistance', 6.2e3], // U+2126 ohm sign
    ['6.2kohm', 'resistance', 6.2e3],
    ['6.2 kOhm', 'resistance', 6.2e3],
    ['500k', 'resistance', 500e3],
    ['1 mΩ', 'resistance', 1e-3],
    ['2.5 H', 'inductance', 2.5],
    ['1m', 'inductance', 1e-3], // bare m is milli for inductance
    ['120 mH', 'inductance', 0.12],
    ['1M', 'frequency', 1e6],
    ['5.9 kHz', 'frequency', 5.9e3],
    ['2.2e-8', 'capacitance', 2.2e-8],
    ['2.2E-8F', 'capacitance', 2.2e-8],
    ['42', 'resistance', 42],
    ['0', 'resistance', 0],
    ['-45°', 'angle', -45],
    ['0.5%', 'dissipation', 0.005],
    ['+9 V', 'voltage', 9],
  ] as const)('%s as %s → %d', (text, q, v) => {
    expectValue(text, q, v, QUANTITY_UNIT[q]);
  });

  it('returns the written unit when no quantity is given', () => {
    expectValue('22 nF', undefined, 22e-9, 'F');
    expectValue('6.2 kΩ', undefined, 6.2e3, 'Ω');
    expectValue('470R', undefined, 470, 'Ω');
    expectValue('22n', undefined, 22e-9, '');
    expectValue('2.5 H', undefined, 2.5, 'H');
  });
});

describe('parseValue — refused input says why', () => {
  const refuse = (text: string, q: Quantity | undefined, reason: string, words: RegExp) => {
    let caught: unknown;
    try {
      parseValue(text, q);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ValueParseError);
    const err = caught as ValueParseError;
    expect(err.reason).toBe(reason);
    expect(err.message).toMatch(words);
  };

  it('refuses a unit that does not match the quantity, naming both', () => {
    refuse('22nF', 'resistance', 'unit-mismatch', /capacitance.*resistance/);
    refuse('4k7Ω', 'capacitance', 'unit-mismatch', /resistance.*capacitance/);
    refuse('470R', 'inductance', 'unit-mismatch', /resistance/);
    refuse('1R5', 'capacitance', 'unit-mismatch', /resistance/);
    refuse('5%', 'resistance', 'unit-mismatch', /percentage/);
  });

  it('refuses a bare m where milli and mega are both plausible, and suggests a spelling', () => {
    refuse('1m', 'resistance', 'ambiguous', /milli or mega.*1meg/);
    refuse('1m', 'esr', 'ambiguous', /milli or mega/);
    refuse('1m', 'capacitance', 'ambiguous', /milli.*micro/);
    refuse('1m', undefined, 'ambiguous', /milli or mega/);
    refuse('4m7', 'resistance', 'ambiguous', /milli or mega/);
  });

  it('refuses M on a capacitance (megafarad vs the old MF = microfarad)', () => {
    refuse('1M', 'capacitance', 'ambiguous', /microfarad/);
    refuse('1MF', undefined, 'ambiguous', /microfarad/);
  });

  it('refuses empty, NaN, garbage, negatives and overflow', () => {
    refuse('', 'resistance', 'empty', /Empty/);
    refuse('   ', undefined, 'empty', /Empty/);
    refuse('NaN', undefined, 'syntax', /number/);
    refuse('abc', undefined, 'syntax', /number/);
    refuse('4k7k', 'resistance', 'syntax', /4k7.*"k"/);
    refuse('1.2.3', undefined, 'syntax', /\.3/);
    refuse('1,000.5', undefined, 'syntax', /separator/);
    refuse('1 000', undefined, 'syntax', /000/);
    refuse('22x', undefined, 'syntax', /prefix nor a unit/);
    refuse('22f', undefined, 'ambiguous', /femto or farad/);
    refuse('-5', 'resistance', 'negative', /negative/);
    refuse('-1n', 'capacitance', 'negative', /negative/);
    refuse('-2 H', 'inductance', 'negative', /negative/);
    refuse('-50', 'frequency', 'negative', /negative/);
    refuse('1e400', undefined, 'not-finite', /too large/);
  });

  it('tryParseValue returns the message instead of throwing', () => {
    expect(tryParseValue('22n', 'capacitance')).toEqual({ ok: true, value: 22e-9, unit: 'F' });
    const r = tryParseValue('1m', 'resistance');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/ambiguous/);
  });
});

describe('parseValue ∘ formatValue round trip (property)', () => {
  const quantities = [
    ['resistance', 1e-3, 1e10],
    ['capacitance', 1e-14, 1e4], // above 1e5 F formatValue would write MF, which parse refuses
    ['inductance', 1e-9, 1e3],
    ['frequency', 1e-2, 1e12],
  ] as const;
  for (const [q, lo, hi] of quantities) {
    it(`${q}: parse(format(x)) is within half a unit of the last of 3 significant digits`, () => {
      fc.assert(
        fc.property(fc.double({ min: Math.log10(lo), max: Math.log10(hi), noNaN: true }), (e) => {
          const x = 10 ** e;
          const text = formatValue(x, QUANTITY_UNIT[q]);
          const back = parseValue(text, q).value;
          // 3 significant digits: the rounding error is at most 0.5 in the third digit, i.e. a
          // relative 0.5e-2 of a mantissa ≥ 1 (plus double rounding noise).
          expect(Math.abs(back - x) / x).toBeLessThanOrEqual(0.005 + 1e-12);
        }),
        { numRuns: 300 },
      );
    });
  }
  it('with 6 digits the round trip is within 5e-6', () => {
    fc.assert(
      fc.property(fc.double({ min: -12, max: 9, noNaN: true }), (e) => {
        const x = 10 ** e;
        const back = parseValue(formatValue(x, 'Ω', { digits: 6 }), 'resistance').value;
        expect(Math.abs(back - x) / x).toBeLessThanOrEqual(5e-6 + 1e-12);
      }),
      { numRuns: 300 },
    );
  });
});
