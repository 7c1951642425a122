import { describe, expect, it } from 'vitest';
import { decodeMarking } from '@shared/markings/decode';
import { decodeResistorCode } from '@shared/markings/resistor-code';
import { MarkingError } from '@shared/markings/tolerance-letters';
import { rows, siFromText } from './iec60062-fixture';

describe('RKM rows of the IEC 60062 fixture (source: Wikipedia "RKM code" examples, via the fixture)', () => {
  for (const r of rows('rkm')) {
    it(`${r.key} = ${r.value}`, () => {
      const d = decodeMarking(r.key);
      expect(d.nominal).toBe(siFromText(r.value));
      expect(d.kind).toBe(r.value.includes('F') ? 'capacitor' : 'resistor');
    });
  }
});

describe('decodeMarking dispatches by form', () => {
  it.each([
    ['223J', 22e-9, 'F', 5, 'capacitor'],
    ['104', 100e-9, 'F', null, 'capacitor'],
    ['473K', 47e-9, 'F', 10, 'capacitor'],
    ['470K', 47e-12, 'F', 10, 'capacitor'], // digits + upper-case letter: capacitor code (documented rule)
    ['47', 47e-12, 'F', null, 'capacitor'],
    ['2n2', 2.2e-9, 'F', null, 'capacitor'],
    ['4u7J', 4.7e-6, 'F', 5, 'capacitor'],
    ['4k7', 4700, 'Ω', null, 'resistor'],
    ['4K7J', 4700, 'Ω', 5, 'resistor'],
    ['470k', 470e3, 'Ω', null, 'resistor'], // lower-case k after digits: RKM kilo
    ['470R', 470, 'Ω', null, 'resistor'],
    ['1M', 1e6, 'Ω', null, 'resistor'],
    ['1K', 1e3, 'Ω', null, 'resistor'],
    ['R47F', 0.47, 'Ω', 1, 'resistor'],
    ['yellow violet red gold', 4700, 'Ω', 5, 'resistor'],
    ['brown-black-black-red-brown', 10e3, 'Ω', 1, 'resistor'],
  ] as const)('%s → %d %s ±%s %% (%s)', (code, nominal, unit, tol, kind) => {
    const d = decodeMarking(code);
    expect(d).toMatchObject({ nominal, unit, tolerancePct: tol, kind });
  });

  it('refuses what it cannot decide, with a reason', () => {
    expect(() => decodeMarking('')).toThrow(/Empty/);
    expect(() => decodeMarking('4m7')).toThrow(/milli.*mega/);
    expect(() => decodeMarking('12345')).toThrow(MarkingError);
    expect(() => decodeMarking('4k7k')).toThrow(/not a marking/);
    expect(() => decodeMarking('red red gold gold gold gold gold')).toThrow(/7 bands/);
    expect(() => decodeMarking('479')).toThrow(/ambiguous/);
  });

  it('decodeResistorCode refuses a lower-case m and Z', () => {
    expect(() => decodeResistorCode('1m5')).toThrow(/milliohm/);
    expect(() => decodeResistorCode('4K7Z')).toThrow(/capacitors/);
    expect(decodeResistorCode('470K').nominal).toBe(470e3);
  });
});

describe('markings as printed on film capacitors', () => {
  // IEC 60062: value code, tolerance letter, then the rated voltage beside them (the voltage is
  // printed in volts on film capacitors: common practice); Z is −20 %/+80 % (fixture row tolerance-letter|Z).
  it.each([
    ['473J 100V', 47e-9, 5, 100],
    ['104K 63V', 100e-9, 10, 63],
    ['2n2J/400V', 2.2e-9, 5, 400],
  ])('%s: %s F ±%s %, rated %s V', (code, nominal, pct, volts) => {
    const d = decodeMarking(code);
    expect(d.nominal).toBe(nominal);
    expect(d.tolerancePct).toBe(pct);
    expect(d.ratedVoltage).toBe(volts);
  });

  it('Z gives asymmetric limits −20 %/+80 % instead of being dropped', () => {
    const d = decodeMarking('104Z');
    expect(d.tolerance).toEqual({ kind: 'asymmetric', minusPct: 20, plusPct: 80 });
    expect(d.limits).toEqual({ lower: 80e-9, upper: 180e-9 });
  });

  it('10K lists every reading: 10 pF ±10 % (capacitor code) and 10 kΩ (RKM resistor value)', () => {
    const d = decodeMarking('10K');
    expect(d.readings.map((r) => [r.kind, r.nominal, r.tolerancePct])).toEqual([
      ['capacitor', 10e-12, 10],
      ['resistor', 10e3, null],
    ]);
    expect(decodeMarking('473J').readings).toHaveLength(1);
  });
});
