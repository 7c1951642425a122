import { describe, expect, it } from 'vitest';
import { DEFAULT_CABLE, LOADS, loadedResponse, loadValues } from '@shared/circuit/loads';

// Textbook LC resonance f0 = 1/(2π√(LC)) (any circuits text, e.g. Horowitz & Hill, "The Art of
// Electronics", 3rd ed., §1.7.14): the pickup's inductance with its own capacitance plus the cable's.
const f0 = (L: number, C: number) => 1 / (2 * Math.PI * Math.sqrt(L * C));

describe('loaded resonance of a measured pickup (harness engine)', () => {
  const pickup = { R: 6e3, L: 2.5, C: 100e-12 };

  it('into an amplifier through 3 m of 100 pF/m cable: near the LC resonance with 400 pF', () => {
    const m = loadedResponse(pickup, { load: LOADS['amplifier-input'], cable: DEFAULT_CABLE });
    expect(m.peak.interior).toBe(true);
    // With pots at 10 (≈ 200 kΩ of load) the peak sits a few per cent below the undamped f0.
    const want = f0(2.5, 400e-12);
    expect(m.peak.frequency / want).toBeGreaterThan(0.9);
    expect(m.peak.frequency / want).toBeLessThan(1.02);
    expect(m.peakRiseDb).toBeGreaterThan(3);
  });

  it('a longer cable lowers the resonance as √(C) says', () => {
    const short = loadedResponse(pickup, { cable: { lengthM: 1, capPerMetre: 100e-12 } }).peak.frequency;
    const long = loadedResponse(pickup, { cable: { lengthM: 6, capPerMetre: 100e-12 } }).peak.frequency;
    expect(long).toBeLessThan(short);
    expect(short / long).toBeCloseTo(Math.sqrt(700 / 200), 0);
  });

  it('a low-impedance pedal input damps the peak away', () => {
    const m = loadedResponse(pickup, { load: LOADS['low-impedance-pedal'] });
    expect(m.peakRiseDb).toBeLessThan(1);
  });

  it('the load capacitance rides on the cable capacitance', () => {
    const v = loadValues(LOADS['buffered-pedal'], { lengthM: 3, capPerMetre: 100e-12 });
    expect(v.cableCapPerMetre * v.cableLength).toBeCloseTo(320e-12, 20);
    expect(v.ampR).toBe(1e6);
  });
});
