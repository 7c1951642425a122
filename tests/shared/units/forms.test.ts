// Every spelling the value reader accepts, and the exact words of each refusal and of the display
// forms. Prefixes and unit symbols: SI Brochure (BIPM, 9th ed., 2019), Tables 7 and 8 and §5.4.3;
// the RKM code: IEC 60062:2016 §4; `meg` as SPICE writes it; the trade spellings (470K, 470R, ohms,
// a bare decimal on a capacitor in µF) are common practice (no published source). The rules of
// shared/units/parse.ts decide the rest, and these tests hold it to them word for word.
import { describe, expect, it } from 'vitest';
import { parseValue, tryParseValue, ValueParseError } from '@shared/units/parse';
import { formatPercent, formatSi, formatValue } from '@shared/units/format';
import { NON_NEGATIVE_QUANTITIES, QUANTITIES, QUANTITY_LABEL, QUANTITY_UNIT, type Quantity } from '@shared/units/quantities';

const messageOf = (text: string, q?: Quantity): string => {
  try {
    parseValue(text, q);
  } catch (e) {
    if (e instanceof ValueParseError) return `${e.reason}: ${e.message}`;
    throw e;
  }
  throw new Error(`"${text}" was accepted`);
};

describe('the quantity tables', () => {
  it('each quantity has its SI unit symbol (SI Brochure Tables 4 and 8; D, Q and ratios are plain numbers)', () => {
    expect(QUANTITY_UNIT).toEqual({
      resistance: 'Ω',
      capacitance: 'F',
      inductance: 'H',
      frequency: 'Hz',
      dissipation: '',
      esr: 'Ω',
      q: '',
      ratio: '',
      angle: '°',
      voltage: 'V',
    });
    expect([...QUANTITIES].sort()).toEqual(Object.keys(QUANTITY_UNIT).sort());
  });

  it('labels are distinct words, used in the messages with "a" or "an"', () => {
    const labels = QUANTITIES.map((q) => QUANTITY_LABEL[q]);
    expect(new Set(labels).size).toBe(QUANTITIES.length);
    expect(messageOf('-1', 'esr')).toBe('negative: "-1" is negative, but an equivalent series resistance cannot be.');
    expect(messageOf('-1', 'inductance')).toBe('negative: "-1" is negative, but an inductance cannot be.');
    expect(messageOf('5 Ω', 'q')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a quality factor (a plain number).');
    expect(messageOf('5 Ω', 'dissipation')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a dissipation factor (a plain number).');
    expect(messageOf('5 Ω', 'ratio')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a ratio (a plain number).');
    expect(messageOf('5 Ω', 'angle')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a phase angle (°).');
    expect(messageOf('5 Ω', 'voltage')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a voltage (V).');
    expect(messageOf('5 Ω', 'frequency')).toBe('unit-mismatch: "5 Ω" is a resistance (Ω), not a frequency (Hz).');
  });

  it('negative readings: refused exactly for the quantities a passive part cannot have negative', () => {
    expect([...NON_NEGATIVE_QUANTITIES].sort()).toEqual(['capacitance', 'esr', 'frequency', 'inductance', 'resistance']);
    // A bare 2 on a capacitor is refused for its missing unit, so capacitance is read with a prefix.
    for (const q of QUANTITIES) {
      expect(tryParseValue(q === 'capacitance' ? '-2n' : '-2', q).ok, q).toBe(!NON_NEGATIVE_QUANTITIES.has(q));
    }
  });
});

describe('parseValue: every unit spelling', () => {
  it.each([
    ['5 ohm', 'Ω'],
    ['5 ohms', 'Ω'],
    ['5 Ohm', 'Ω'],
    ['5 Ohms', 'Ω'],
    ['5 OHM', 'Ω'],
    ['5 OHMS', 'Ω'],
    ['5R', 'Ω'],
    ['5 Ω', 'Ω'],
    ['5 \u2126', 'Ω'], // the ohm sign U+2126 reads as Ω
    ['5 F', 'F'],
    ['5 H', 'H'],
    ['5 Hz', 'Hz'],
    ['5 hz', 'Hz'],
    ['5 HZ', 'Hz'],
    ['5 V', 'V'],
    ['5°', '°'],
    ['5 deg', '°'],
  ])('%s has the unit %s and the value 5', (text, unit) => {
    expect(parseValue(text)).toEqual({ value: 5, unit });
  });

  it.each([
    ['3 fF', 3e-15],
    ['3pF', 3e-12],
    ['3pf', 3e-12],
    ['3 nF', 3e-9],
    ['3uF', 3e-6],
    ['3µF', 3e-6],
    ['3μF', 3e-6],
    ['3 mF', 3e-3],
  ])('capacitance prefixes: %s = %d F', (text, value) => {
    expect(parseValue(text, 'capacitance')).toEqual({ value, unit: 'F' });
  });

  it.each([
    ['3k', 3e3],
    ['3K', 3e3],
    ['3M', 3e6],
    ['3meg', 3e6],
    ['3Meg', 3e6],
    ['3MEG', 3e6],
    ['3G', 3e9],
    ['3T', 3e12],
    ['3 GΩ', 3e9],
    ['3 TΩ', 3e12],
    ['3 megohm', 3e6],
  ])('resistance prefixes: %s = %d Ω', (text, value) => {
    expect(parseValue(text, 'resistance')).toEqual({ value, unit: 'Ω' });
  });

  it.each([
    ['3G3', 3.3e9],
    ['3T3', 3.3e12],
    ['3p3', 3.3e-12],
    ['3n3', 3.3e-9],
    ['3u3', 3.3e-6],
    ['3µ3', 3.3e-6],
    ['3μ3', 3.3e-6],
    ['3r3', 3.3],
    ['3k3 ohm', 3.3e3],
    ['3R3 Ω', 3.3],
  ])('RKM letters (IEC 60062): %s = %d', (text, value) => {
    expect(parseValue(text).value).toBe(value);
  });

  it('white space of every width and the minus sign U+2212 are read', () => {
    for (const space of ['\u00A0', '\u2009', '\u202F', '\u2007', '\t']) {
      expect(parseValue(`22${space}nF`, 'capacitance').value).toBe(22e-9);
    }
    expect(parseValue('\u22125 V', 'voltage').value).toBe(-5);
    expect(parseValue('  4k7  ', 'resistance').value).toBe(4700);
  });

  it('RKM values keep their sign, a leading point, and no negative zero', () => {
    expect(parseValue('-4k7', 'voltage' as Quantity).value).toBe(-4700);
    expect(parseValue('k47').value).toBe(470);
    expect(parseValue('.5k', 'resistance').value).toBe(500);
    expect(parseValue('5.', 'resistance').value).toBe(5);
    expect(Object.is(parseValue('-0', 'voltage').value, 0)).toBe(true);
    expect(parseValue('1.5e3', 'resistance').value).toBe(1500);
    expect(parseValue('15E-1k', 'resistance').value).toBe(1500);
  });

  it('percentages are fractions of the plain quantities; a quantity-less percentage has no unit', () => {
    expect(parseValue('5%')).toEqual({ value: 0.05, unit: '' });
    expect(parseValue('250 %', 'ratio')).toEqual({ value: 2.5, unit: '' });
    expect(parseValue('1.5%', 'q').value).toBe(0.015);
  });
});

describe('parseValue: the exact words of each refusal', () => {
  it.each([
    ['', 'resistance', 'empty: Empty value: type a number such as 22n, 4k7 or 0.022 µF.'],
    ['1,2,3', undefined, 'syntax: "1,2,3" mixes separators: use one decimal separator (a point or a comma) and no digit grouping.'],
    ['1,2.3', undefined, 'syntax: "1,2.3" mixes separators: use one decimal separator (a point or a comma) and no digit grouping.'],
    ['x5', undefined, 'syntax: "x5" is not a value: it should start with a number (for example 22n, 4k7, 0.022 µF or 2.2e-8).'],
    [
      '5 kq',
      undefined,
      'syntax: "5 kq" is not a value: "kq" after the number is neither an SI prefix nor a unit (for example n, k, meg, nF, kΩ, mH, Hz).',
    ],
    ['4R7 F', undefined, 'syntax: "4R7 F": unexpected "F" after the RKM value 4R7.'],
    ['4k7R', undefined, 'syntax: "4k7R" is not a value: after the RKM value 4k7 (IEC 60062) there is unexpected text "R".'],
    ['4k7%', undefined, 'syntax: "4k7%" is not a value: after the RKM value 4k7 (IEC 60062) there is unexpected text "%".'],
    ['4R7', 'voltage', 'unit-mismatch: "4R7" uses R (ohm) as its decimal point, which marks a resistance, not a voltage.'],
    [
      '5 k%',
      undefined,
      'syntax: "5 k%" is not a value: "k%" after the number is neither an SI prefix nor a unit (for example n, k, meg, nF, kΩ, mH, Hz).',
    ],
    ['5%', 'angle', 'unit-mismatch: "5%" is a percentage, which does not fit a phase angle (°).'],
    ['5 Hz', 'inductance', 'unit-mismatch: "5 Hz" is a frequency (Hz), not an inductance (H).'],
    ['5 V', 'capacitance', 'unit-mismatch: "5 V" is a voltage (V), not a capacitance (F).'],
    ['5°', 'voltage', 'unit-mismatch: "5°" is an angle (°), not a voltage (V).'],
    ['5 H', 'frequency', 'unit-mismatch: "5 H" is an inductance (H), not a frequency (Hz).'],
    ['5 F', 'voltage', 'unit-mismatch: "5 F" is a capacitance (F), not a voltage (V).'],
    [
      '1m',
      'resistance',
      'ambiguous: "1m" is ambiguous for a resistance: "m" could mean milli or mega; write 1M or 1meg for megohms, or 1 mΩ for milliohms.',
    ],
    [
      '1m',
      'esr',
      'ambiguous: "1m" is ambiguous for an equivalent series resistance: "m" could mean milli or mega; write 1M or 1meg for megohms, or 1 mΩ for milliohms.',
    ],
    [
      '1m',
      'capacitance',
      'ambiguous: "1m" is ambiguous for a capacitance: "m" could mean milli, or micro as on old markings; write the unit: 1 mF for millifarads, 1 µF (or 1u) for microfarads.',
    ],
    [
      '1m',
      undefined,
      'ambiguous: "1m" is ambiguous without a quantity: "m" could mean milli or mega; write the unit (1 mH, 1 mΩ) or use 1M / 1meg for mega.',
    ],
    [
      '1M',
      'capacitance',
      'ambiguous: "1M" is ambiguous for a capacitance: "M" would be megafarad, but old markings use M / MF for microfarad; write µF (or u) for microfarads, or mF for millifarads.',
    ],
    ['22f', 'capacitance', 'ambiguous: "22f": "f" alone could be femto or farad; write fF or F.'],
    ['1e309', 'resistance', 'not-finite: "1e309" is too large to be a value.'],
    ['-1e309', 'voltage', 'not-finite: "-1e309" is too large to be a value.'],
    [
      '47',
      'capacitance',
      'ambiguous: "47" has no unit: on a capacitor a bare 47 could be picofarads or a marking code; add a unit: 47p, 47n, 47u.',
    ],
    [
      '-47',
      'capacitance',
      'ambiguous: "-47" has no unit: on a capacitor a bare 47 could be picofarads or a marking code; add a unit: 47p, 47n, 47u.',
    ],
  ] as const)('%s (%s)', (text, q, words) => {
    expect(messageOf(text, q)).toBe(words);
  });

  it('m is milli where it cannot be mega: inductance, frequency, voltage and the plain quantities', () => {
    for (const q of ['inductance', 'frequency', 'voltage', 'dissipation', 'ratio', 'q', 'angle'] as const) {
      expect(parseValue('2m', q).value, q).toBe(2e-3);
    }
    // With a unit written, m is always milli (SI Brochure §3).
    expect(parseValue('2 mΩ', 'resistance').value).toBe(2e-3);
    expect(parseValue('2 mF', 'capacitance').value).toBe(2e-3);
  });

  it('tryParseValue: the same answers without throwing, readAs only when a bare decimal was read in µF', () => {
    expect(tryParseValue('0.1', 'capacitance')).toEqual({
      ok: true,
      value: 1e-7,
      unit: 'F',
      readAs: 'read as 100 nF: a bare decimal on a capacitor is in microfarads',
    });
    expect(tryParseValue('-0.1', 'voltage')).toEqual({ ok: true, value: -0.1, unit: 'V' });
    expect(tryParseValue('22f', 'capacitance')).toEqual({ ok: false, error: '"22f": "f" alone could be femto or farad; write fF or F.' });
    expect(tryParseValue('4k7')).toEqual({ ok: true, value: 4700, unit: '' });
  });
});

describe('formatValue and formatPercent: the display forms', () => {
  it.each([
    [3e-15, 'F', '3 fF'],
    [3e-12, 'F', '3 pF'],
    [3e-9, 'F', '3 nF'],
    [3e-6, 'F', '3 µF'],
    [3e-3, 'H', '3 mH'],
    [3, 'H', '3 H'],
    [3e3, 'Ω', '3 kΩ'],
    [3e6, 'Ω', '3 MΩ'],
    [3e9, 'Ω', '3 GΩ'],
    [3e12, 'Ω', '3 TΩ'],
    [3e15, 'Ω', '3e+15 Ω'],
    [1e-15, 'F', '1 fF'],
    [9.996e-16, 'F', '1 fF'], // rounds into the prefix range
    [9.99e-16, 'F', '9.99e-16 F'],
    [1000, 'Hz', '1 kHz'],
    [1e-9, 'F', '1 nF'],
    [100e-9, 'F', '100 nF'],
    [0.1, 'V', '100 mV'],
  ] as const)('%d %s → %s (SI Brochure Table 7 prefixes)', (value, unit, text) => {
    expect(formatValue(value, unit)).toBe(text);
  });

  it('plain numbers, degrees and percentages take no prefix', () => {
    expect(formatValue(0, '')).toBe('0');
    expect(formatValue(0, '°')).toBe('0°');
    expect(formatValue(12.345, '%')).toBe('12.3 %');
    expect(formatValue(-0.000123456, '')).toBe('-0.000123');
    expect(formatValue(1e-7, '')).toBe('1e-7');
    expect(formatValue(2.5e-7, '', { digits: 2 })).toBe('2.5e-7');
    expect(formatValue(1e15, '')).toBe('1e+15');
    expect(formatValue(1.234e15, '')).toBe('1.23e+15');
    expect(formatValue(999999999999999, '', { digits: 15 })).toBe('999999999999999');
    expect(formatValue(1e-6, '')).toBe('0.000001');
    expect(formatValue(1.5e-6, '', { digits: 2 })).toBe('0.0000015');
  });

  it('non-finite values are written as they are', () => {
    expect(formatValue(Number.NaN, 'Ω')).toBe('NaN Ω');
    expect(formatValue(Infinity, '')).toBe('Infinity');
    expect(formatValue(-Infinity, 'F')).toBe('-Infinity F');
    expect(formatPercent(Number.NaN)).toBe('NaN %');
    expect(formatPercent(Infinity)).toBe('Infinity %');
  });

  it('digits are clamped to 1…17 and rounded', () => {
    expect(formatValue(4712, 'Ω', { digits: 0 })).toBe('5 kΩ');
    expect(formatValue(4712, 'Ω', { digits: -3 })).toBe('5 kΩ');
    expect(formatValue(4712, 'Ω', { digits: 2.4 })).toBe('4.7 kΩ');
    expect(formatValue(1 / 3, '', { digits: 40 })).toBe('0.33333333333333331');
    expect(formatValue(4712.345, 'Ω', { digits: 40 })).toBe('4.712345 kΩ');
  });

  it('formatPercent: sign, decimals clamped to 0…20 and rounded', () => {
    expect(formatPercent(1.25, -2)).toBe('+1 %');
    expect(formatPercent(1.25, 2.4)).toBe('+1.25 %');
    expect(formatPercent(1 / 3, 30)).toBe('+0.33333333333333331483 %');
    expect(formatPercent(-0.04)).toBe('0.0 %');
    expect(formatPercent(-0.05)).toBe('-0.1 %');
    expect(formatPercent(0.05)).toBe('+0.1 %');
  });

  it('formatSi writes each quantity with its own unit', () => {
    expect(formatSi(4700, 'resistance')).toBe('4.7 kΩ');
    expect(formatSi(2.2, 'esr')).toBe('2.2 Ω');
    expect(formatSi(2.5, 'inductance')).toBe('2.5 H');
    expect(formatSi(5931, 'frequency')).toBe('5.93 kHz');
    expect(formatSi(-45, 'angle')).toBe('-45°');
    expect(formatSi(9, 'voltage')).toBe('9 V');
    expect(formatSi(42.4, 'q', { digits: 2 })).toBe('42');
    expect(formatSi(0.5, 'ratio')).toBe('0.5');
  });
});

describe('cases the mutation run found untested', () => {
  it('RKM with R or r and no quantity reads as ohms (IEC 60062), and m as milli where milli is allowed', () => {
    expect(parseValue('3r3')).toStrictEqual({ value: 3.3, unit: 'Ω' });
    expect(parseValue('4R7')).toStrictEqual({ value: 4.7, unit: 'Ω' });
    expect(messageOf('3r3', 'capacitance')).toBe(
      'unit-mismatch: "3r3" uses R (ohm) as its decimal point, which marks a resistance, not a capacitance.',
    );
    expect(parseValue('4m7', 'inductance')).toStrictEqual({ value: 4.7e-3, unit: 'H' });
  });

  it('a prefix with a lower-case f is a farad, and white space between prefix and unit is allowed', () => {
    expect(parseValue('22pf')).toStrictEqual({ value: 22e-12, unit: 'F' });
    expect(parseValue('5 k Ω')).toStrictEqual({ value: 5000, unit: 'Ω' });
  });

  it('an RKM code must start the text, and a no-break space does not join digit groups', () => {
    expect(messageOf('x4k7')).toMatch(/^syntax: "x4k7" is not a value: it should start with a number/);
    expect(tryParseValue('1\u00A0000').ok).toBe(false);
  });

  it('answers carry readAs only when a bare decimal was read in µF, and the error has its own name', () => {
    expect(parseValue('22n', 'capacitance')).toStrictEqual({ value: 22e-9, unit: 'F' });
    expect(tryParseValue('22n', 'capacitance')).toStrictEqual({ ok: true, value: 22e-9, unit: 'F' });
    let caught: unknown;
    try {
      parseValue('abc');
    } catch (e) {
      caught = e;
    }
    expect((caught as Error).name).toBe('ValueParseError');
    // Only the reader's own refusals become messages; anything else is a fault and is thrown.
    expect(() => tryParseValue(Symbol('not text') as unknown as string)).toThrow(TypeError);
  });

  it('display: exponent forms keep the asked digits, a percentage takes no prefix, 17 digits show the double', () => {
    expect(formatValue(1.23456e-18, 'F')).toBe('1.23e-18 F');
    expect(formatValue(2.5e-7, '')).toBe('2.5e-7');
    expect(formatValue(0.005, '%')).toBe('0.005 %');
    // The double 47.12345678901234436… (the one nearest 47.123456789012344) to 17 significant digits.
    expect(formatValue(47.123456789012344, 'Ω', { digits: 17 })).toBe('47.123456789012344 Ω');
  });
});
