import { describe, expect, it } from 'vitest';
import { detectColumns, parseUnit, resolveColumns, splitHeader } from '@shared/csv/columns';

// Prefix factors: SI Brochure (BIPM, 9th ed., 2019), Table 7 — from memory: p 1e-12, n 1e-9,
// µ 1e-6, m 1e-3, k 1e3, M 1e6.
describe('units in headers', () => {
  it.each([
    ['kΩ', 'Ω', 1e3],
    ['kOhm', 'Ω', 1e3],
    ['kohm', 'Ω', 1e3],
    ['MΩ', 'Ω', 1e6],
    ['mΩ', 'Ω', 1e-3],
    ['ohm', 'Ω', 1],
    ['nF', 'F', 1e-9],
    ['uF', 'F', 1e-6],
    ['µF', 'F', 1e-6],
    ['μF', 'F', 1e-6],
    ['pF', 'F', 1e-12],
    ['mH', 'H', 1e-3],
    ['kHz', 'Hz', 1e3],
    ['Hz', 'Hz', 1],
    ['°', 'deg', 1],
    ['deg', 'deg', 1],
    ['rad', 'rad', 1],
    ['%', 'percent', 1],
    ['percent', 'percent', 1],
  ])('%s → %s × %d', (text, dimension, scale) => {
    expect(parseUnit(text)).toEqual({ dimension, scale });
  });

  it('refuses what is not a unit', () => {
    expect(parseUnit('Z')).toBeNull();
    expect(parseUnit('1e3')).toBeNull();
    expect(parseUnit('V/m')).toBeNull();
  });

  it.each([
    ['R (kΩ)', 'r', 'kΩ'],
    ['Resistance [kOhm]', 'resistance', 'kOhm'],
    ['f / Hz', 'f', 'Hz'],
    ['Position %', 'position', '%'],
    ['Rotation°', 'rotation', '°'],
    ['R_kohm', 'r', 'kohm'],
    ['Re(Z) (ohm)', 're z', 'ohm'],
    ['Re(Z)', 're z', ''],
    ['|Z| (kOhm)', 'z', 'kOhm'],
    ['tan δ', 'tan δ', ''],
  ])('splitHeader(%s)', (header, name, unitText) => {
    const p = splitHeader(header);
    expect([p.name, p.unitText]).toEqual([name, unitText]);
  });
});

describe('detectColumns', () => {
  it("taper: rotation in degrees, R1W, RW3 and the sweep's own R13 in kΩ", () => {
    const d = detectColumns(['Rotation (°)', 'R1-W (kΩ)', 'R W-3 (kΩ)', 'R13 (kΩ)'], 'taper');
    expect(d.mapping.rotation).toMatchObject({ index: 0, rotationUnit: 'deg', scale: 1 });
    expect(d.mapping.resistance).toMatchObject({ index: 1, scale: 1e3 });
    expect(d.mapping.resistanceW3).toMatchObject({ index: 2, scale: 1e3 });
    expect(d.mapping.total).toMatchObject({ index: 3, scale: 1e3 });
    expect(d.unknown).toEqual([]);
    expect(d.missing).toEqual([]);
  });

  it.each([
    [['Angle (deg)', 'R (ohm)'], 'deg', 1],
    [['Position %', 'Resistance [kOhm]'], 'percent', 1e3],
    [['Rot', 'R2 (MΩ)', 'R (MΩ)'], undefined, 1e6],
  ])('taper header %j', (header, rotationUnit, scale) => {
    const d = detectColumns(header, 'taper');
    expect(d.missing).toEqual([]);
    expect(d.mapping.rotation?.rotationUnit).toBe(rotationUnit);
    expect(d.mapping.resistance?.scale).toBe(scale);
  });

  it('R2 maps to wiper-to-lug-3, not to R1W', () => {
    const d = detectColumns(['Rot', 'R2 (MΩ)', 'R (MΩ)'], 'taper');
    expect(d.mapping.resistanceW3?.index).toBe(1);
    expect(d.mapping.resistance?.index).toBe(2);
  });

  it('impedance, polar: kHz and phase in radians', () => {
    const d = detectColumns(['f [kHz]', 'Mag (MΩ)', 'θ (rad)'], 'impedance');
    expect(d.missing).toEqual([]);
    expect(d.mapping.frequency?.scale).toBe(1e3);
    expect(d.mapping.magnitude?.scale).toBe(1e6);
    expect(d.mapping.phase?.angleUnit).toBe('rad');
  });

  it('impedance: Angle (°) is the phase there; R (ohm) and X (ohm) are re/im', () => {
    expect(detectColumns(['Freq (Hz)', 'Z (ohm)', 'Angle (°)'], 'impedance').mapping.phase?.index).toBe(2);
    const d = detectColumns(['Frequency', 'R (ohm)', 'X (ohm)'], 'impedance');
    expect(d.missing).toEqual([]);
    expect([d.mapping.re?.index, d.mapping.im?.index]).toEqual([1, 2]);
  });

  it('impedance: the missing part of the closer pair is named', () => {
    expect(detectColumns(['Freq (Hz)', 'Re(Z)', 'Something'], 'impedance').missing).toEqual(['im']);
    expect(detectColumns(['Freq (Hz)', '|Z| (kOhm)', 'Something'], 'impedance').missing).toEqual(['phase']);
    expect(detectColumns(['Kanal 1', 'Kanal 2'], 'impedance').missing).toEqual(['frequency', 'magnitude', 'phase']);
  });

  it('lot: item, C (nF), D, Freq (kHz); D in % becomes a fraction', () => {
    const d = detectColumns(['No.', 'C (nF)', 'D (%)', 'Freq (kHz)'], 'lot');
    expect(d.missing).toEqual([]);
    expect(d.mapping.item?.index).toBe(0);
    expect(d.mapping.value).toMatchObject({ index: 1, scale: 1e-9, dimension: 'F' });
    expect(d.mapping.second).toMatchObject({ index: 2, scale: 0.01, secondQuantity: 'dissipation' });
    expect(d.mapping.testFrequency?.scale).toBe(1e3);
  });

  it('lot: ESR (Ω) is the second reading as ESR; # and Serial are items', () => {
    const d = detectColumns(['#', 'Cs (F)', 'ESR (Ω)'], 'lot');
    expect(d.mapping.second).toMatchObject({ index: 2, secondQuantity: 'esr', scale: 1 });
    expect(detectColumns(['Serial', 'R (kΩ)'], 'lot').mapping.value?.scale).toBe(1e3);
  });
});

describe('resolveColumns with an explicit mapping', () => {
  it('maps unknown headers by index and header text, with units', () => {
    const r = resolveColumns(['Kanal 1', 'Kanal 2', 'Kanal 3'], 'impedance', {
      frequency: { column: 0, unit: 'kHz' },
      magnitude: { column: 'kanal 2', unit: 'kΩ' },
      phase: { column: 2, unit: 'rad' },
    });
    expect(r.issues).toEqual([]);
    expect(r.missing).toEqual([]);
    expect(r.mapping.frequency?.scale).toBe(1e3);
    expect(r.mapping.magnitude).toMatchObject({ index: 1, scale: 1e3 });
    expect(r.mapping.phase?.angleUnit).toBe('rad');
  });

  it('names a column that does not exist and a unit that does not fit', () => {
    const r = resolveColumns(['A', 'B'], 'taper', { rotation: { column: 5 }, resistance: { column: 'B', unit: 'nF' } });
    expect(r.issues.map((i) => i.message)).toEqual([
      'The rotation is mapped to a column the file does not have (its columns: "A", "B").',
      'Column "B": the unit "nF" (farads) does not fit the resistance lug 1 to wiper.',
    ]);
  });

  it('an explicit role takes its column away from a detected role', () => {
    const r = resolveColumns(['Rotation (°)', 'R (kΩ)', 'Other (kΩ)'], 'taper', { resistance: { column: 2 } });
    expect(r.mapping.resistance?.index).toBe(2);
    expect(r.unknown).toEqual(['R (kΩ)']);
  });
});

describe('lug-numbered headers (lug 2 is the wiper; common practice)', () => {
  it.each([
    [
      ['Angle', 'R1-2', 'R2-3', 'R1-3'],
      ['resistance', 'resistanceW3', 'total'],
    ],
    [
      ['Angle', '1-W', 'W-3'],
      ['resistance', 'resistanceW3'],
    ],
  ])('%j', (header, roles) => {
    const d = detectColumns(header as string[], 'taper');
    roles.forEach((role, i) => expect(d.mapping[role as 'resistance']?.index).toBe(i + 1));
    expect(d.unknown).toEqual([]);
  });
});
