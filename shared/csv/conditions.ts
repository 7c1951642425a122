// The conditions an export was made under, written the same way everywhere: as `# key: value`
// lines at the top of a CSV file (which the CSV reader skips as a preamble and readConditions reads
// back) and as the conditions line under the title of a PNG export. A value that is not known is
// written as "not set" or "not measured", never left out or guessed.

import { toleranceWords } from '@shared/analysis/tolerance';

export type ConditionValue = string | number | boolean | null | undefined;

export interface Condition {
  key: string;
  value: ConditionValue;
  /** What to write when the value is missing; default "not set". */
  unknown?: 'not set' | 'not measured';
}

/** One line of text with no line breaks, no double quotes and no leading/trailing space. */
function clean(text: string): string {
  return text
    .replace(/[\r\n\u2028\u2029]+/g, ' ')
    .replace(/"/g, "'")
    .replace(/\s+/g, ' ')
    .trim();
}

/** The value as written: numbers as they are, empty / null / NaN as "not set" (or "not measured"). */
export function conditionText(c: Condition): string {
  const v = c.value;
  if (v === null || v === undefined || (typeof v === 'number' && !Number.isFinite(v))) return c.unknown ?? 'not set';
  const s = clean(typeof v === 'boolean' ? (v ? 'yes' : 'no') : String(v));
  return s === '' ? (c.unknown ?? 'not set') : s;
}

/** Keys are written in lower case with no colon (the colon separates key from value). */
function cleanKey(key: string): string {
  const k = clean(key).replace(/:/g, ' ').replace(/\s+/g, ' ').trim();
  if (k === '') throw new Error('A condition needs a key.');
  return k;
}

/** The `# key: value` preamble lines, each ending with a line break. */
export function conditionsHeader(conditions: readonly Condition[]): string {
  return conditions.map((c) => `# ${cleanKey(c.key)}: ${conditionText(c)}\n`).join('');
}

/** A CSV body (header row first) with the conditions written above it. */
export function withConditions(conditions: readonly Condition[], csvBody: string): string {
  return conditionsHeader(conditions) + csvBody;
}

/** The conditions on one line for a PNG: "key: value · key: value". */
export function conditionsLine(conditions: readonly Condition[]): string {
  return conditions.map((c) => `${cleanKey(c.key)}: ${conditionText(c)}`).join(' · ');
}

/**
 * Reads the `# key: value` lines at the top of a file (after an optional byte-order mark and blank
 * lines), stopping at the first line that is not one. Other comment lines end the preamble too.
 */
export function readConditions(text: string): { key: string; value: string }[] {
  const out: { key: string; value: string }[] = [];
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  for (const raw of body.split(/\r\n|\r|\n/)) {
    if (raw.trim() === '') continue;
    const m = /^#\s+([^:]+?):\s?(.*)$/.exec(raw);
    if (!m) break;
    out.push({ key: m[1]!.trim(), value: m[2]!.trim() });
  }
  return out;
}

const LOT_UNIT: Record<string, string> = { capacitance: 'F', resistance: 'Ω', inductance: 'H' };

function engineering(value: number, unit: string): string {
  if (!Number.isFinite(value)) return String(value);
  const prefixes: [number, string][] = [
    [1e9, 'G'],
    [1e6, 'M'],
    [1e3, 'k'],
    [1, ''],
    [1e-3, 'm'],
    [1e-6, 'µ'],
    [1e-9, 'n'],
    [1e-12, 'p'],
  ];
  const abs = Math.abs(value);
  const [f, p] = prefixes.find(([f]) => abs >= f * 0.9995) ?? prefixes[prefixes.length - 1]!;
  return `${Number((value / f).toPrecision(4))} ${p}${unit}`;
}

/** A lot export's conditions: the lot, its limits, the matching options the statistics used, when. */
export function lotConditions(
  lot: {
    code: string;
    quantity: string;
    nominal: number;
    tolerancePct: number;
    tolerancePlusPct?: number | null;
    status: string;
    testFrequency?: number | null;
  },
  opts: { readings: number; matchPct: number; setSize: number; madeAt?: Date },
): Condition[] {
  const unit = LOT_UNIT[lot.quantity] ?? '';
  return [
    { key: 'lot', value: lot.code },
    { key: 'lot status', value: lot.status },
    { key: 'quantity', value: lot.quantity },
    { key: 'nominal', value: engineering(lot.nominal, unit) },
    { key: 'tolerance', value: toleranceWords(lot.tolerancePct, lot.tolerancePlusPct) },
    { key: 'test frequency', value: lot.testFrequency == null ? null : engineering(lot.testFrequency, 'Hz') },
    { key: 'readings', value: opts.readings },
    { key: 'matched sets', value: `within ±${opts.matchPct} % of each other, ${opts.setSize} parts a set` },
    // The time of the export; left to the caller that stamps it at the moment of saving.
    ...(opts.madeAt ? [{ key: 'exported', value: opts.madeAt.toISOString().replace(/\.\d{3}Z$/, 'Z') }] : []),
  ];
}
