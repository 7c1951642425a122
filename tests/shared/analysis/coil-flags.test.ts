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

// The rules at their exact edges and the messages with their figures. The edges use values whose
// deviation (L − nominal)/nominal·100 is exact in binary floating point (−20, ±25), so "more than"
// and "at least" give different answers. Units and significant digits follow the SI Brochure's
// conventions (value, space, prefixed unit) as the project writes them.
describe('coilFlags: edges and messages', () => {
  const fit = (over: Partial<{ R: number; L: number; Q: number }> = {}) => ({ R: 6000, L: 4, Q: 40, flags: [], ...over });
  const codes = (flags: { code: string }[]) => flags.map((f) => f.code).sort();

  it('an open winding found by R alone reads its resistance in the message', () => {
    expect(coilFlags(fit({ R: 2.5e6 }))).toEqual([{ code: 'open-coil', message: 'DC resistance 2.5 MΩ: the winding looks open.' }]);
  });

  it('a fit already flagged open is not flagged twice, and the fit’s own list is left as it was', () => {
    const own = [{ code: 'open-coil' as const, message: 'from the fit' }];
    const flags = coilFlags({ R: 2e6, L: 4, Q: 40, flags: own }, { minQ: 50 });
    expect(codes(flags)).toEqual(['low-q', 'open-coil']);
    expect(flags[0]).toEqual(own[0]);
    // coilFlags returns a new list: the fit's flags keep their one entry.
    expect(own).toEqual([{ code: 'open-coil', message: 'from the fit' }]);
  });

  it('DCR out of tolerance: both resistances to four digits and the deviation to one decimal', () => {
    // (6543 − 6123)/6123 = +6.859 % (computed by hand), beyond ±5 %.
    expect(coilFlags(fit({ R: 6543 }), { dcr: { nominal: 6123, tolerancePct: 5 } })).toEqual([
      { code: 'dcr-out-of-tolerance', message: 'DCR 6.543 kΩ is +6.9 % from nominal 6.123 kΩ (±5 %).' },
    ]);
  });

  it('L out of tolerance: both inductances to four digits and the deviation', () => {
    // (3.456 − 4.321)/4.321 = −20.02 % (computed by hand): out of ±5 % and beyond max(3 × 5 %, 20 %).
    const flags = coilFlags(fit({ L: 3.456 }), { inductance: { nominal: 4.321, tolerancePct: 5 } });
    expect(flags).toEqual([
      { code: 'inductance-out-of-tolerance', message: 'L 3.456 H is -20.0 % from nominal 4.321 H (±5 %).' },
      { code: 'shorted-turns', message: 'Inductance or Q is far below the spec: shorted turns are likely.' },
    ]);
  });

  it('L exactly at its tolerance (+25 % of ±25 %) passes; a little beyond is flagged', () => {
    const spec = { inductance: { nominal: 4, tolerancePct: 25 } };
    expect(coilFlags(fit({ L: 5 }), spec)).toEqual([]);
    expect(coilFlags(fit({ L: 3 }), spec)).toEqual([]);
    expect(codes(coilFlags(fit({ L: 5.001 }), spec))).toEqual(['inductance-out-of-tolerance']);
  });

  it('shorted turns from L: exactly 20 % low is not "more than 20 %"; the 3 × tolerance arm counts when larger', () => {
    // Nominal 5 H, reading 4 H: −20 % exactly, with ±5 % → the limit is max(15 %, 20 %) = 20 %.
    expect(codes(coilFlags(fit({ L: 4 }), { inductance: { nominal: 5, tolerancePct: 5 } }))).toEqual(['inductance-out-of-tolerance']);
    // With ±10 % the limit is max(30 %, 20 %) = 30 %: 25 % low is out of tolerance, not shorted.
    expect(codes(coilFlags(fit({ L: 3 }), { inductance: { nominal: 4, tolerancePct: 10 } }))).toEqual(['inductance-out-of-tolerance']);
    // 31 % low with ±10 %: shorted.
    expect(codes(coilFlags(fit({ L: 2.76 }), { inductance: { nominal: 4, tolerancePct: 10 } }))).toEqual([
      'inductance-out-of-tolerance',
      'shorted-turns',
    ]);
  });

  it('Q exactly at the spec minimum passes; exactly half of it is low but not shorted; messages with Q to three digits', () => {
    expect(coilFlags(fit({ Q: 10 }), { minQ: 10 })).toEqual([]);
    expect(coilFlags(fit({ Q: 5 }), { minQ: 10 })).toEqual([{ code: 'low-q', message: "Q 5.00 is below the spec's minimum 10." }]);
    expect(coilFlags(fit({ Q: 4.99 }), { minQ: 10 })).toEqual([
      { code: 'low-q', message: "Q 4.99 is below the spec's minimum 10." },
      { code: 'shorted-turns', message: 'Inductance or Q is far below the spec: shorted turns are likely.' },
    ]);
  });
});
