// Cases that separate the two shorted-turns rules of coilFlags (L far below nominal, or Q below
// half the spec's minimum; project thresholds, common practice, no published source). The fit is
// given directly, so this file needs no simulator (it also runs in the mutation runs).
import { describe, expect, it } from 'vitest';
import { coilFlags } from '@shared/analysis/coil';

describe('coilFlags: each shorted-turns rule on its own', () => {
  const fitOf = (L: number, Q: number) => ({ R: 6000, L, Q, flags: [] });
  const spec = { inductance: { nominal: 4, tolerancePct: 5 }, minQ: 10 };
  const codes = (L: number, Q: number) =>
    coilFlags(fitOf(L, Q), spec)
      .map((f) => f.code)
      .sort();

  it('low L with a high Q: shorted turns from the L rule alone (L 25 % low, beyond max(3 × 5 %, 20 %))', () => {
    expect(codes(3.0, 40)).toEqual(['inductance-out-of-tolerance', 'shorted-turns']);
  });
  it('L out of tolerance but not far below (15 % low) with a high Q: no shorted turns', () => {
    expect(codes(3.4, 40)).toEqual(['inductance-out-of-tolerance']);
  });
  it('L far ABOVE nominal (+25 %) with a high Q: out of tolerance, never shorted turns', () => {
    expect(codes(5.0, 40)).toEqual(['inductance-out-of-tolerance']);
  });
  it('the reverse: L on nominal with Q below half the minimum fires shorted turns from the Q rule alone', () => {
    expect(codes(4.0, 4.9)).toEqual(['low-q', 'shorted-turns']);
  });
  it('Q low but not below half the minimum, L on nominal: low Q only', () => {
    expect(codes(4.0, 5.1)).toEqual(['low-q']);
  });

  it('an open winding: R above 1 MΩ is flagged, 1 MΩ itself is not', () => {
    expect(coilFlags({ R: 1.0001e6, L: 4, Q: 40, flags: [] }).map((f) => f.code)).toEqual(['open-coil']);
    expect(coilFlags({ R: 1e6, L: 4, Q: 40, flags: [] })).toEqual([]);
  });

  it('DCR against its tolerance: 10 % off a ±10 % spec passes, a little more is flagged with the deviation', () => {
    const dcr = { dcr: { nominal: 6000, tolerancePct: 10 } };
    expect(coilFlags({ R: 6600, L: 4, Q: 40, flags: [] }, dcr)).toEqual([]);
    const flags = coilFlags({ R: 6601, L: 4, Q: 40, flags: [] }, dcr);
    expect(flags.map((f) => f.code)).toEqual(['dcr-out-of-tolerance']);
    expect(flags[0]!.message).toMatch(/\+10\.0(2)? %/);
  });
});
