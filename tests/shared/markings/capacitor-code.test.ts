import { describe, expect, it } from 'vitest';
import { decodeCapacitorCode } from '@shared/markings/capacitor-code';
import { decodeToleranceLetter, MarkingError, TOLERANCE_LETTER_PCT } from '@shared/markings/tolerance-letters';
import { rows, siFromText } from './iec60062-fixture';

// Source for the table checks: tests/fixtures/iec/iec60062-marking-codes.txt.
describe('capacitor codes against the IEC 60062 fixture (rows cap-code)', () => {
  const capRows = rows('cap-code');
  it('has the rows the checks rely on', () => {
    expect(capRows.map((r) => r.key)).toEqual(['101', '102', '103', '104', '105', '224', '473', '100', '47', '479', '108']);
  });
  for (const r of capRows) {
    if (r.value.includes('CONFLICT')) {
      it(`${r.key}: CONFLICT row is refused by default, naming both readings`, () => {
        expect(() => decodeCapacitorCode(r.key)).toThrow(/ambiguous.*IEC 60062/);
      });
    } else {
      it(`${r.key} = ${r.value}`, () => {
        expect(decodeCapacitorCode(r.key).nominal).toBe(siFromText(r.value));
      });
    }
  }
  it('the ×0.1 / ×0.01 convention for 9 and 8 is available on request (fixture rows 479, 108)', () => {
    expect(decodeCapacitorCode('479', { thirdDigit89: 'fraction' }).nominal).toBe(4.7e-12);
    expect(decodeCapacitorCode('108', { thirdDigit89: 'fraction' }).nominal).toBe(0.1e-12);
  });
});

describe('decodeCapacitorCode', () => {
  it.each([
    ['223J', 22e-9, 5],
    ['104', 100e-9, null],
    ['104K', 100e-9, 10],
    ['104k', 100e-9, 10], // lower-case tolerance letter accepted by the capacitor decoder
    ['473K', 47e-9, 10],
    ['224M', 220e-9, 20], // fixture: "224M ... 0.22 uF ±20%"
    ['105K', 1e-6, 10], // fixture: "105K 330V ... 1 uF (K = ±10%)"
    ['101', 100e-12, null],
    ['2n2', 2.2e-9, null], // RKM
    ['4n7J', 4.7e-9, 5], // fixture rkm|4n7
    ['p47', 0.47e-12, null],
    ['4u7', 4.7e-6, null],
    ['47n', 47e-9, null],
    ['22p', 22e-12, null],
  ] as const)('%s → %d F ±%s %%', (code, nominal, tol) => {
    const r = decodeCapacitorCode(code);
    expect(r.nominal).toBe(nominal);
    expect(r.tolerancePct).toBe(tol);
    expect(r.unit).toBe('F');
  });

  it('Z is −20 %/+80 % (fixture: CONSENSUS, capacitors)', () => {
    const r = decodeCapacitorCode('104Z');
    expect(r.tolerance).toEqual({ kind: 'asymmetric', minusPct: 20, plusPct: 80 });
    expect(r.tolerancePct).toBeNull();
  });

  it('B, C, D are absolute in pF below 10 pF; F there is refused (fixture: "the pF reading is in some tables only")', () => {
    expect(decodeCapacitorCode('2p2C').tolerance).toEqual({ kind: 'absolute', plusMinus: 0.25e-12 });
    expect(decodeCapacitorCode('p47B').tolerance).toEqual({ kind: 'absolute', plusMinus: 0.1e-12 });
    expect(decodeCapacitorCode('4p7D').tolerance).toEqual({ kind: 'absolute', plusMinus: 0.5e-12 });
    expect(() => decodeCapacitorCode('479F', { thirdDigit89: 'fraction' })).toThrow(/±1 % in some tables and ±1 pF/);
    expect(decodeCapacitorCode('479C', { thirdDigit89: 'fraction' }).tolerance).toEqual({ kind: 'absolute', plusMinus: 0.25e-12 });
    // At 10 pF and above the same letters are percentages.
    expect(decodeCapacitorCode('100C').tolerancePct).toBe(0.25);
  });

  it('refuses unreadable codes and the F/farad ambiguity with a reason', () => {
    expect(() => decodeCapacitorCode('')).toThrow(MarkingError);
    expect(() => decodeCapacitorCode('1234')).toThrow(/not a capacitor code/);
    expect(() => decodeCapacitorCode('4n7F')).toThrow(/farad or the tolerance letter F/);
    expect(() => decodeCapacitorCode('000')).toThrow(/0 pF/);
    expect(() => decodeCapacitorCode('104Q')).toThrow(/not an IEC 60062 tolerance letter/);
  });
});

describe('tolerance letters against the fixture (rows tolerance-letter)', () => {
  for (const r of rows('tolerance-letter')) {
    if (r.note.startsWith('CONFLICT')) {
      it(`${r.key}: CONFLICT row is refused`, () => {
        expect(() => decodeToleranceLetter(r.key, 'capacitor', 1e-6)).toThrow(/not decoded/);
      });
    } else if (r.key === 'Z') {
      it('Z: −20 %/+80 %', () => {
        expect(r.value).toBe('-20% / +80%');
        expect(decodeToleranceLetter('Z', 'capacitor', 1e-6)).toEqual({ kind: 'asymmetric', minusPct: 20, plusPct: 80 });
      });
    } else {
      it(`${r.key}: ${r.value}`, () => {
        const pct = Number(/±([\d.]+)%/.exec(r.value)![1]);
        expect(TOLERANCE_LETTER_PCT[r.key]).toBe(pct);
        expect(decodeToleranceLetter(r.key, 'resistor', 1e3)).toEqual({ kind: 'percent', pct });
        expect(decodeToleranceLetter(r.key, 'capacitor', 1e-6)).toEqual({ kind: 'percent', pct });
        // Below 10 pF: the fixture's pF reading where it gives one (F is refused: its row says the
        // pF reading is in some tables only), otherwise the same percentage.
        const abs = /±([\d.]+) pF for C < 10 pF/.exec(r.value);
        const small = () => decodeToleranceLetter(r.key, 'capacitor', 4.7e-12);
        if (r.key === 'F') expect(small).toThrow(/±1 % in some tables and ±1 pF/);
        else if (abs) expect(small()).toEqual({ kind: 'absolute', plusMinus: Number(abs[1]) * 1e-12 });
        else expect(small()).toEqual({ kind: 'percent', pct });
      });
    }
  }
  it('Z on a resistor is refused', () => {
    expect(() => decodeToleranceLetter('Z', 'resistor', 1e3)).toThrow(/capacitors/);
  });
});
