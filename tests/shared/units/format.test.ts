import { describe, expect, it } from 'vitest';
import { formatPercent, formatSi, formatValue } from '@shared/units/format';
import { QUANTITY_LABEL, QUANTITY_UNIT, QUANTITIES } from '@shared/units/quantities';

describe('formatValue — engineering notation (SI Brochure 9th ed., Table 7 prefixes)', () => {
  it.each([
    [22e-9, 'F', '22 nF'],
    [487000, 'Ω', '487 kΩ'],
    [2.61, 'H', '2.61 H'],
    [0, 'Ω', '0 Ω'],
    [4700, 'Ω', '4.7 kΩ'],
    [1e6, 'Ω', '1 MΩ'],
    [100e-12, 'F', '100 pF'],
    [1e-6, 'F', '1 µF'], // exact power of ten: the prefix step must not slip
    [1e-3, 'H', '1 mH'],
    [999.7, 'Ω', '1 kΩ'], // rounds up into the next prefix
    [999.4, 'Ω', '999 Ω'],
    [5931.4, 'Hz', '5.93 kHz'],
    [-4700, 'Ω', '-4.7 kΩ'],
    [1.5e-18, 'F', '1.5e-18 F'], // beyond the prefixes used here
    [0.005, '', '0.005'], // dimensionless: no prefix
    [123456, '', '123000'],
    [45, '°', '45°'], // SI Brochure §5.4.3: no space before the degree sign
  ])('%d %s → %s', (v, u, text) => {
    expect(formatValue(v, u)).toBe(text);
  });

  it('honours the digits option', () => {
    expect(formatValue(487_123, 'Ω', { digits: 5 })).toBe('487.12 kΩ');
    expect(formatValue(22e-9, 'F', { digits: 1 })).toBe('20 nF');
    expect(formatValue(2.2e-8, 'F', { digits: 6 })).toBe('22 nF'); // no trailing zeros
  });

  it('formatSi uses the quantity unit', () => {
    expect(formatSi(22e-9, 'capacitance')).toBe('22 nF');
    expect(formatSi(0.0123, 'dissipation')).toBe('0.0123');
    for (const q of QUANTITIES) {
      expect(typeof QUANTITY_UNIT[q]).toBe('string');
      expect(QUANTITY_LABEL[q].length).toBeGreaterThan(0);
    }
  });
});

describe('formatPercent — signed deviations', () => {
  it.each([
    [2.6, 1, '+2.6 %'],
    [-2.64, 1, '-2.6 %'],
    [-0.04, 2, '-0.04 %'],
    [0, 1, '0.0 %'],
    [-0.01, 1, '0.0 %'], // rounds to zero: no sign
    [20, 0, '+20 %'],
  ])('%d with %d decimals → %s', (x, d, text) => {
    expect(formatPercent(x, d)).toBe(text);
  });
});
