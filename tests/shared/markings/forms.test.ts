// What each marking decoder accepts and what it refuses, and what its answers say. The values are
// IEC 60062 readings (RKM code, capacitor code, tolerance letters, colour bands: the rows of
// tests/fixtures/iec/iec60062-marking-codes.txt, worked by hand here); which written forms are read
// and which are refused is the decoders' own documented rule (the header comments of
// shared/markings/*.ts), and the message a refusal gives is checked so that each refusal is told
// apart from the others — a code refused for the wrong reason would send the user the wrong way.
import { describe, expect, it } from 'vitest';
import { decodeCapacitorCode } from '@shared/markings/capacitor-code';
import { decodeColourBands } from '@shared/markings/colour-bands';
import { decodeMarking } from '@shared/markings/decode';
import { decodeResistorCode } from '@shared/markings/resistor-code';
import { decodeToleranceLetter, MarkingError } from '@shared/markings/tolerance-letters';

/** The message of the MarkingError `work` throws (anything else fails the test). */
function refusal(work: () => unknown): string {
  try {
    work();
  } catch (e) {
    expect(e).toBeInstanceOf(MarkingError);
    expect((e as Error).name).toBe('MarkingError');
    return (e as Error).message;
  }
  throw new Error('expected a refusal');
}

const NOT_A_MARKING = /is not a marking this reads/;
const MILLI = /lower-case m could be milli/;

describe('decodeMarking: the written forms it reads', () => {
  it.each([
    // Spaces anywhere in a code are ignored; the code is read as if written together.
    [' 473J 100V ', 47e-9, 5, 100],
    ['47 3J', 47e-9, 5, null],
    // A rated voltage straight after the code, in kV, or with a decimal point or comma.
    ['473J100V', 47e-9, 5, 100],
    ['104K 6.3V', 100e-9, 10, 6.3],
    ['104K 6,3V', 100e-9, 10, 6.3],
    ['103K 1.6kV', 10e-9, 10, 1600],
    ['103K 1.25kV', 10e-9, 10, 1250],
    // RKM capacitor codes with one or two digits on either side of the letter (IEC 60062 RKM).
    ['22n', 22e-9, null, null],
    ['47n', 47e-9, null, null],
    ['4n7K', 4.7e-9, 10, null],
    ['1000p', 1e-9, null, null],
    ['2n20', 2.2e-9, null, null],
  ] as const)('%j → %s F ±%s %, rated %s V', (code, nominal, pct, volts) => {
    const d = decodeMarking(code);
    expect(d.kind).toBe('capacitor');
    expect(d.nominal).toBe(nominal);
    expect(d.tolerancePct).toBe(pct);
    expect(d.ratedVoltage).toBe(volts);
  });

  it.each([
    ['470RJ', 470, 5],
    ['1KJ', 1e3, 5],
    ['yellow, violet, red, gold', 4700, 5],
  ] as const)('%j → %s Ω ±%s %', (code, nominal, pct) => {
    const d = decodeMarking(code);
    expect(d.kind).toBe('resistor');
    expect(d.nominal).toBe(nominal);
    expect(d.tolerancePct).toBe(pct);
  });

  it('each reading says how it was read', () => {
    expect(decodeMarking('104').readings[0]!.words).toBe('capacitor code in pF');
    expect(decodeMarking('104K').readings[0]!.words).toBe('capacitor code in pF with tolerance letter K');
    expect(decodeMarking('4K7').readings[0]!.words).toBe('resistor RKM code');
    expect(decodeMarking('yellow violet red gold').readings[0]!.words).toBe('resistor colour bands');
  });

  it('limits follow the tolerance: percent, and absolute in pF below 10 pF (fixture rows tolerance-letter B, J)', () => {
    const j = decodeMarking('473J').limits!;
    expect(j.lower).toBeCloseTo(47e-9 * 0.95, 21);
    expect(j.upper).toBeCloseTo(47e-9 * 1.05, 21);
    // 4p7B: 4.7 pF ±0.1 pF.
    const b = decodeMarking('4p7B');
    expect(b.tolerance).toEqual({ kind: 'absolute', plusMinus: 0.1e-12 });
    expect(b.limits!.lower).toBeCloseTo(4.6e-12, 24);
    expect(b.limits!.upper).toBeCloseTo(4.8e-12, 24);
  });

  it('one black band is a zero-ohm link with no tolerance and no limits (common practice, no published source)', () => {
    const d = decodeMarking('black');
    expect(d).toMatchObject({ nominal: 0, kind: 'resistor', tolerance: null, tolerancePct: null, limits: null });
  });

  it('a code ending in K or M has its resistor reading only when the first reading is a capacitor code', () => {
    const m = decodeMarking('47M');
    expect(m.readings.map((r) => [r.kind, r.nominal])).toEqual([
      ['capacitor', 47e-12],
      ['resistor', 47e6],
    ]);
    expect(m.readings[1]!.words).toBe('resistor 47 MΩ (RKM multiplier, no tolerance marked)');
    expect(m.readings[1]!.unit).toBe('Ω');
    expect(decodeMarking('10K').readings[1]!.words).toBe('resistor 10 kΩ (RKM multiplier, no tolerance marked)');
    expect(decodeMarking('10 K').readings).toHaveLength(2);
    // Already a resistor (one digit and a multiplier), or an RKM capacitor code: one reading.
    expect(decodeMarking('1K').readings).toHaveLength(1);
    expect(decodeMarking('1M').readings).toHaveLength(1);
    expect(decodeMarking('4n7K').readings).toHaveLength(1);
  });
});

describe('decodeMarking: what it refuses, and why', () => {
  it('nothing to read', () => {
    expect(refusal(() => decodeMarking('   '))).toMatch(/^Empty marking/);
    expect(refusal(() => decodeMarking(undefined as unknown as string))).toMatch(/^Empty marking/);
  });

  it('a lower-case m in an RKM code (milli or mega?)', () => {
    for (const code of ['4m7', '47m', '47m5', '4m7J', 'm47', 'm47J'])
      expect(
        refusal(() => decodeMarking(code)),
        code,
      ).toMatch(MILLI);
  });

  it('codes with something before or after the forms it knows', () => {
    for (const code of [
      'x4m7',
      '4m7x',
      'xm47',
      'm47JJ',
      '1470k',
      '470kx',
      'x4K7',
      'x470R',
      '470RJJ',
      '104KJ',
      'x104',
      'x2n2',
      '2n2JJ',
      'red red 104',
      '104 red red',
      '473J 100Vx',
    ])
      expect(
        refusal(() => decodeMarking(code)),
        code,
      ).toMatch(NOT_A_MARKING);
    // A voltage with no code before it is not split off: 100V is read as the code 10 pF with the letter V.
    expect(refusal(() => decodeMarking('100V'))).toMatch(/"V" in "100V" is not an IEC 60062 tolerance letter/);
  });
});

describe('decodeCapacitorCode', () => {
  it('RKM letters µ (micro sign), μ (Greek mu) and m (milli) (IEC 60062 RKM: the letter is the decimal point and the multiplier)', () => {
    expect(decodeCapacitorCode('4µ7').nominal).toBe(4.7e-6);
    expect(decodeCapacitorCode('4μ7').nominal).toBe(4.7e-6);
    expect(decodeCapacitorCode('1m5').nominal).toBe(1.5e-3);
  });

  it('spaces are ignored, and a lower-case tolerance letter reads as the upper-case one', () => {
    expect(decodeCapacitorCode('10 4').nominal).toBe(100e-9);
    expect(decodeCapacitorCode('104k')).toMatchObject({ nominal: 100e-9, letter: 'K', tolerancePct: 10 });
  });

  it('refusals name their reason', () => {
    expect(refusal(() => decodeCapacitorCode(' '))).toMatch(/^Empty capacitor code/);
    expect(refusal(() => decodeCapacitorCode(undefined as unknown as string))).toMatch(/^Empty capacitor code/);
    for (const code of ['n', 'nJ', 'x2n2', '2n2JJ'])
      expect(
        refusal(() => decodeCapacitorCode(code)),
        code,
      ).toMatch(/is not a capacitor code/);
    // The third digit 9 or 8: both readings are named (fixture rows cap-code 479, 108).
    expect(refusal(() => decodeCapacitorCode('479'))).toMatch(/gives 47 × 10\^9 pF, one maker's convention gives 47 × 0\.1 pF/);
    expect(refusal(() => decodeCapacitorCode('478'))).toMatch(/gives 47 × 10\^8 pF, one maker's convention gives 47 × 0\.01 pF/);
  });
});

describe('decodeResistorCode', () => {
  it('spaces are ignored', () => {
    expect(decodeResistorCode('4K 7').nominal).toBe(4700);
  });

  it('a lower-case m is refused wherever it stands, with the mega spelling offered', () => {
    for (const code of ['m47', '47m', '1m5J'])
      expect(
        refusal(() => decodeResistorCode(code)),
        code,
      ).toMatch(/milliohm/);
    expect(refusal(() => decodeResistorCode('1m5'))).toMatch(/write 1M5 for megohms/);
  });

  it('anything else that is not RKM is refused as such', () => {
    for (const code of ['m', 'K', '1m5x', 'x1m5', 'x4K7', '4K7JJ', 'abc'])
      expect(
        refusal(() => decodeResistorCode(code)),
        code,
      ).toMatch(/is not a resistor code/);
    expect(refusal(() => decodeResistorCode(undefined as unknown as string))).toMatch(/^"" is not a resistor code/);
  });
});

describe('tolerance letters', () => {
  it('B on a resistor is ±0.1 % at any value; absolute pF applies to capacitors below 10 pF only (fixture row tolerance-letter|B)', () => {
    expect(decodeResistorCode('4R7B').tolerance).toEqual({ kind: 'percent', pct: 0.1 });
    expect(decodeToleranceLetter('B', 'resistor', 1)).toEqual({ kind: 'percent', pct: 0.1 });
    expect(decodeToleranceLetter('B', 'resistor', 0)).toEqual({ kind: 'percent', pct: 0.1 });
  });

  it('letters the sources disagree on are refused with the disagreement (fixture rows marked CONFLICT)', () => {
    expect(refusal(() => decodeToleranceLetter('E', 'resistor', 1))).toMatch(/E is used for ±0\.005 %/);
    expect(refusal(() => decodeToleranceLetter('H', 'resistor', 1))).toMatch(/H is ±3 % in some tables/);
    expect(refusal(() => decodeToleranceLetter('L', 'resistor', 1))).toMatch(/L is ±0\.01 % for resistors/);
    expect(refusal(() => decodeToleranceLetter('P', 'resistor', 1))).toMatch(/P is ±0\.02 % for resistors/);
    expect(refusal(() => decodeToleranceLetter('N', 'resistor', 1))).toMatch(/N is used inconsistently/);
  });
});

describe('colour bands', () => {
  it('names are read in any case and with spaces around them, as text or as a list', () => {
    expect(decodeColourBands(['Yellow', ' violet ', 'RED', 'gold']).nominal).toBe(4700);
    expect(decodeColourBands('YELLOW VIOLET RED GOLD').nominal).toBe(4700);
    // Separators at either end (a list pasted with its punctuation) leave no empty name behind.
    expect(decodeColourBands(',yellow violet red gold;').nominal).toBe(4700);
  });

  it('refusals name the bands as written and the reason (fixture rows tolerance-colour marked CONFLICT)', () => {
    expect(refusal(() => decodeColourBands(['red', 'red']))).toMatch(/^2 bands in "red red"/);
    expect(refusal(() => decodeColourBands('red'))).toMatch(/^1 band in "red"/);
    expect(refusal(() => decodeColourBands('gold violet red'))).toMatch(/starts with gold.*wrong end/);
    expect(refusal(() => decodeColourBands('silver violet red'))).toMatch(/starts with silver.*wrong end/);
    expect(refusal(() => decodeColourBands('red red red orange'))).toMatch(/orange is ±0\.05 % in 2016-edition tables/);
    expect(refusal(() => decodeColourBands('red red red yellow'))).toMatch(/yellow is ±0\.02 % in 2016-edition tables/);
    expect(refusal(() => decodeColourBands('red red red grey'))).toMatch(/grey is ±0\.01 % in 2016-edition tables/);
  });
});
