// One entry point for a part's printed marking. The form decides the decoder:
// 1. colour names ("yellow violet red gold")            → resistor colour bands
// 2. two or three digits, optional tolerance letter     → capacitor code in pF (104, 223J, 47)
//    (upper-case letters are tolerance letters, so 470K reads as 47 pF ±10 %; a lower-case k
//    after digits is the RKM kilo, so 470k is 470 kΩ; 470R is 470 Ω.) Three-digit resistor codes
//    (as on surface-mount parts) are not read here: call a specific decoder for those.
// 3. RKM with p, n, u, µ → capacitor (2n2, 4u7J); with R, K, k, M, G, T → resistor (4K7, R47,
//    and a single digit with a multiplier: 1M, 1K). A lower-case m is refused (milli or mega?).

import { decodeCapacitorCode } from './capacitor-code';
import { decodeColourBands } from './colour-bands';
import { decodeResistorCode } from './resistor-code';
import { MarkingError, type Tolerance } from './tolerance-letters';

export interface DecodedMarking {
  nominal: number;
  unit: string;
  tolerancePct: number | null;
  kind: 'capacitor' | 'resistor';
  /** The full tolerance, including asymmetric (Z) and absolute (B/C/D below 10 pF) ones. */
  tolerance: Tolerance | null;
}

export function decodeMarking(code: string): DecodedMarking {
  const s = String(code ?? '').trim();
  if (s === '') throw new MarkingError(code, 'Empty marking: type a code such as 104K, 4K7, 2n2 or "yellow violet red gold".');

  if (/^[A-Za-z]{3,}([\s,;/-]+[A-Za-z]{3,})*$/.test(s)) {
    const r = decodeColourBands(s);
    return {
      nominal: r.nominal,
      unit: r.unit,
      tolerancePct: r.tolerancePct,
      kind: 'resistor',
      tolerance: r.tolerancePct === null ? null : { kind: 'percent', pct: r.tolerancePct },
    };
  }
  const compact = s.replace(/\s+/g, '');
  if (/^\d+m\d*[A-Z]?$|^m\d+[A-Z]?$/.test(compact)) {
    throw new MarkingError(code, `"${compact}": a lower-case m could be milli (capacitor, milliohm) or mega; write the value with its unit instead.`);
  }
  if (/^\d{2,3}k$/.test(compact) || /^\d*[RKkMGT]\d+[A-Z]?$/.test(compact) || /^\d+R[A-Z]?$/.test(compact) || /^\d[kKMGT][A-Z]?$/.test(compact)) {
    const r = decodeResistorCode(compact);
    return { nominal: r.nominal, unit: r.unit, tolerancePct: r.tolerancePct, kind: 'resistor', tolerance: r.tolerance };
  }
  if (/^\d{2,3}[A-Za-z]?$/.test(compact) || /^\d*[pnuµμ]\d*[A-Z]?$/.test(compact)) {
    const c = decodeCapacitorCode(compact);
    return { nominal: c.nominal, unit: c.unit, tolerancePct: c.tolerancePct, kind: 'capacitor', tolerance: c.tolerance };
  }
  throw new MarkingError(
    code,
    `"${s}" is not a marking this reads: expected a capacitor code (104K, 2n2), an RKM resistor code (4K7, 470R, R47) or colour names ("brown black orange gold").`,
  );
}
