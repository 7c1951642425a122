// Reading one number cell of a measurement file.
//
// Decision (documented in the samples README too): a number cell holds a plain decimal number,
// optionally with an exponent (`12.5`, `-3`, `4.7e-8`, `1,5E-03` in a decimal-comma file), and may be
// followed by the column's own unit exactly as the header writes it (`12.5 kΩ` under `R (kΩ)`,
// `45°` under `Angle (°)`, `50%` under `Position %`). Anything else after the number — an SI prefix
// (`12.5k`), an RKM code (`12k7`), another unit — is refused: under a `kΩ` header `12.5k` could be
// read as 12.5 kΩ or 12.5 MΩ, and a meter export never writes it, so it is most likely a typing slip.
//
// A file has one decimal separator: a cell with the other one is refused with a message that says
// which the file uses, rather than guessed (in a decimal-comma file `1.234` may be digit grouping).

// Compiled once: the lot reader calls this for every cell of up to 100,000 rows.
const PLAIN_NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

// Exact powers of ten as doubles (10^0 … 10^22 are all exactly representable).
const POW10: readonly number[] = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));

/**
 * Result: the number times 10^exp, or the reason (a sentence fragment about the cell, without the line
 * prefix). The power of ten is applied to the decimal value before rounding (`0.0079` with exp 6 is
 * 7900 exactly, where `0.0079 * 1e6` gives 7900.000000000001), so the result is the double nearest the
 * true value, rounded once — as in `@shared/units/parse`.
 *
 * Fast path, because a lot file has up to 100,000 rows: one scan without allocation reads up to 15
 * significant digits into an integer and, when the total power of ten is within ±22, returns
 * mantissa × 10^e or mantissa / 10^−e. Both operands are exact doubles, so the single IEEE operation
 * is correctly rounded and equals Number() of the decimal text (W. D. Clinger, "How to read floating
 * point numbers accurately", PLDI 1990, the fast path). Anything else — errors included — goes the
 * slow, regex-checked path.
 */
export function readNumberCell(raw: string, decimalComma: boolean, unitSuffix: string | null, exp = 0): number | string {
  let i = 0;
  let n = raw.length;
  while (i < n && raw.charCodeAt(i) <= 32) i++;
  while (n > i && raw.charCodeAt(n - 1) <= 32) n--;
  if (unitSuffix !== null && n - i > unitSuffix.length && raw.endsWith(unitSuffix, n)) {
    n -= unitSuffix.length;
    while (n > i && raw.charCodeAt(n - 1) <= 32) n--;
  }
  const sep = decimalComma ? 44 : 46; // ',' or '.'
  let c = raw.charCodeAt(i);
  const negative = c === 45;
  if (c === 45 || c === 43) i++;
  let mantissa = 0;
  let digits = 0;
  let fraction = 0;
  let seenSep = false;
  for (; i < n; i++) {
    c = raw.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (seenSep) fraction++;
    } else if (c === sep && !seenSep) {
      seenSep = true;
    } else {
      break;
    }
  }
  let e10 = 0;
  if (i < n && (c === 101 || c === 69) && digits > 0) {
    i++;
    let eNeg = false;
    c = raw.charCodeAt(i);
    if (c === 45 || c === 43) {
      eNeg = c === 45;
      i++;
    }
    let eDigits = 0;
    for (; i < n; i++) {
      c = raw.charCodeAt(i);
      if (c < 48 || c > 57) break;
      e10 = e10 * 10 + (c - 48);
      eDigits++;
    }
    if (eDigits === 0 || eDigits > 3) return readNumberCellSlow(raw, decimalComma, unitSuffix, exp);
    if (eNeg) e10 = -e10;
  }
  const total = e10 + exp - fraction;
  if (i !== n || digits === 0 || digits > 15 || total > 22 || total < -22) {
    return readNumberCellSlow(raw, decimalComma, unitSuffix, exp);
  }
  if (mantissa === 0) return 0; // no negative zero
  const v = total >= 0 ? mantissa * POW10[total]! : mantissa / POW10[-total]!;
  return negative ? -v : v;
}

/**
 * Result: the number times 10^exp, or the reason (a sentence fragment about the cell, without the line
 * prefix). The power of ten is applied to the decimal text (`0.0079` with exp 6 is read as `0.0079e6`),
 * so the result is the double nearest the true value, rounded once — as in `@shared/units/parse`;
 * `0.0079 * 1e6` would give 7900.000000000001.
 */
function readNumberCellSlow(raw: string, decimalComma: boolean, unitSuffix: string | null, exp: number): number | string {
  let s = raw.trim();
  if (s === '') return 'the cell is empty';
  if (unitSuffix !== null && s.endsWith(unitSuffix)) s = s.slice(0, s.length - unitSuffix.length).trimEnd();
  if (decimalComma) {
    const comma = s.indexOf(',');
    if (s.indexOf('.') >= 0) {
      return `"${raw.trim()}" is not a number: this file uses decimal commas, and digit grouping is not accepted`;
    }
    if (comma >= 0) s = s.slice(0, comma) + '.' + s.slice(comma + 1);
  } else if (s.indexOf(',') >= 0) {
    return `"${raw.trim()}" is not a number: this file uses decimal points, and digit grouping is not accepted`;
  }
  if (!PLAIN_NUMBER.test(s)) {
    const hint = unitSuffix ? ` (write a plain number in ${unitSuffix}, the column's unit)` : '';
    return `"${raw.trim()}" is not a number${hint}`;
  }
  let v: number;
  if (exp === 0) v = Number(s);
  else {
    // Fold the column's power of ten into the written exponent, so there is still one rounding.
    const k = Math.max(s.indexOf('e'), s.indexOf('E'));
    v = k < 0 ? Number(s + 'e' + exp) : Number(s.slice(0, k) + 'e' + (Number(s.slice(k + 1)) + exp));
  }
  if (!Number.isFinite(v)) return `"${raw.trim()}" is too large`;
  return v === 0 ? 0 : v; // no negative zero
}
