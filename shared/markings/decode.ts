// One entry point for a part's printed marking. The form decides the decoder:
// 1. colour names ("yellow violet red gold")            → resistor colour bands
// 2. two or three digits, optional tolerance letter     → capacitor code in pF (104, 223J, 47)
//    (upper-case letters are tolerance letters, so 470K reads as 47 pF ±10 %; a lower-case k
//    after digits is the RKM kilo, so 470k is 470 kΩ; 470R is 470 Ω.) Three-digit resistor codes
//    (as on surface-mount parts) are not read here: call a specific decoder for those.
// 3. RKM with p, n, u, µ → capacitor (2n2, 4u7J); with R, K, k, M, G, T → resistor (4K7, R47,
//    and a single digit with a multiplier: 1M, 1K). A lower-case m is refused (milli or mega?).

// 4. A rated voltage after the code (`473J 100V`, `104K 63V`, `2n2J/400V`) is read off first and
//    returned as ratedVoltage (IEC 60062 §5 lists the voltage beside the value and tolerance codes).
// Every decoded marking carries its limits (the asymmetric Z, −20 %/+80 %, included), and a code
// the trade writes both ways (`10K`: 10 pF ±10 % as a capacitor code, 10 kΩ as an RKM resistor
// value; `47M`) lists every reading in `readings`, the first being the one returned.

import { limitsFromTolerance } from '@shared/analysis/verdict';
import { decodeCapacitorCode } from './capacitor-code';
import { decodeColourBands } from './colour-bands';
import { decodeResistorCode } from './resistor-code';
import { MarkingError, tolerancePctOf, type Tolerance } from './tolerance-letters';

export interface DecodedMarking {
  nominal: number;
  unit: string;
  tolerancePct: number | null;
  kind: 'capacitor' | 'resistor';
  /** The full tolerance, including asymmetric (Z) and absolute (B/C/D below 10 pF) ones. */
  tolerance: Tolerance | null;
  /** The limits the tolerance gives (asymmetric for Z), or null without a tolerance. */
  limits: { lower: number; upper: number } | null;
  /** Rated voltage written after the code (`100V`), volts; null when none. */
  ratedVoltage: number | null;
  /** Every reading of the code, the first being this one; more than one when the code is ambiguous. */
  readings: Reading[];
}

export type Reading = Omit<DecodedMarking, 'readings' | 'ratedVoltage'> & { words: string };

function limitsOf(nominal: number, t: Tolerance | null): { lower: number; upper: number } | null {
  if (t === null) return null;
  if (t.kind === 'percent') return limitsFromTolerance(nominal, t.pct);
  if (t.kind === 'asymmetric') return limitsFromTolerance(nominal, { minusPct: t.minusPct, plusPct: t.plusPct });
  return { lower: nominal - t.plusMinus, upper: nominal + t.plusMinus };
}

function reading(kind: 'capacitor' | 'resistor', nominal: number, unit: string, tolerance: Tolerance | null, words: string): Reading {
  return { nominal, unit, kind, tolerance, tolerancePct: tolerancePctOf(tolerance), limits: limitsOf(nominal, tolerance), words };
}

/** `473J 100V` → code `473J`, 100 V. */
function splitVoltage(s: string): { code: string; volts: number | null } {
  const m = /^(.*?)[\s/,-]*(\d+(?:[.,]\d+)?)\s*(k?)V(?:DC|AC|dc|ac)?$/.exec(s);
  if (!m || m[1]!.trim() === '') return { code: s, volts: null };
  return { code: m[1]!.trim(), volts: Number(m[2]!.replace(',', '.')) * (m[3] === 'k' ? 1000 : 1) };
}

export function decodeMarking(code: string): DecodedMarking {
  const { code: valueCode, volts } = splitVoltage(String(code ?? '').trim());
  const first = decodeValueCode(valueCode, code);
  const readings = [first];
  // A two- or three-digit code ending in K or M: also an RKM resistor value (10K = 10 kΩ).
  const amb = /^(\d{1,3})([KM])$/.exec(valueCode.replace(/\s+/g, ''));
  if (amb && first.kind === 'capacitor') {
    const nominal = Number(`${amb[1]}e${amb[2] === 'K' ? 3 : 6}`);
    readings.push(
      reading('resistor', nominal, 'Ω', null, `resistor ${amb[1]} ${amb[2] === 'K' ? 'kΩ' : 'MΩ'} (RKM multiplier, no tolerance marked)`),
    );
  }
  const { words: _w, ...chosen } = first;
  return { ...chosen, ratedVoltage: volts, readings };
}

function decodeValueCode(s: string, code: string): Reading {
  if (s === '') throw new MarkingError(code, 'Empty marking: type a code such as 104K, 4K7, 2n2 or "yellow violet red gold".');

  if (/^[A-Za-z]{3,}([\s,;/-]+[A-Za-z]{3,})*$/.test(s)) {
    const r = decodeColourBands(s);
    return reading(
      'resistor',
      r.nominal,
      r.unit,
      r.tolerancePct === null ? null : { kind: 'percent', pct: r.tolerancePct },
      'resistor colour bands',
    );
  }
  const compact = s.replace(/\s+/g, '');
  if (/^\d+m\d*[A-Z]?$|^m\d+[A-Z]?$/.test(compact)) {
    throw new MarkingError(
      code,
      `"${compact}": a lower-case m could be milli (capacitor, milliohm) or mega; write the value with its unit instead.`,
    );
  }
  if (
    /^\d{2,3}k$/.test(compact) ||
    /^\d*[RKkMGT]\d+[A-Z]?$/.test(compact) ||
    /^\d+R[A-Z]?$/.test(compact) ||
    /^\d[kKMGT][A-Z]?$/.test(compact)
  ) {
    const r = decodeResistorCode(compact);
    return reading('resistor', r.nominal, r.unit, r.tolerance, 'resistor RKM code');
  }
  if (/^\d{2,3}[A-Za-z]?$/.test(compact) || /^\d*[pnuµμ]\d*[A-Z]?$/.test(compact)) {
    const c = decodeCapacitorCode(compact);
    return reading(
      'capacitor',
      c.nominal,
      c.unit,
      c.tolerance,
      c.letter ? `capacitor code in pF with tolerance letter ${c.letter}` : 'capacitor code in pF',
    );
  }
  throw new MarkingError(
    code,
    `"${s}" is not a marking this reads: expected a capacitor code (104K, 2n2), an RKM resistor code (4K7, 470R, R47) or colour names ("brown black orange gold").`,
  );
}
