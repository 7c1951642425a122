// Form text → numbers for the Team forms. Engineering notation goes through the shared parser;
// percentages and plain numbers accept "±", "%" and a decimal comma.
import { tryParseValue } from '@shared/units/parse';
import type { Quantity } from '@shared/units/quantities';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';

export type Parsed = { ok: true; value: number | undefined } | { ok: false; error: string };

export function plainNumber(text: string): Parsed {
  const t = text.replace(/[±%\s]/g, '').replace(',', '.');
  if (t === '') return { ok: true, value: undefined };
  const n = Number(t);
  return Number.isFinite(n) ? { ok: true, value: n } : { ok: false, error: `"${text.trim()}" is not a number.` };
}

export function engineering(text: string, quantity: Quantity): Parsed {
  if (text.trim() === '') return { ok: true, value: undefined };
  const r = tryParseValue(text, quantity);
  return r.ok ? { ok: true, value: r.value } : { ok: false, error: r.error };
}

/** A stored SI value back as text that parses to the same number. */
export const asText = (value: number | null | undefined, quantity: Quantity) =>
  value == null ? '' : formatValue(value, QUANTITY_UNIT[quantity], { digits: 12 });

export const pctText = (fraction: number | null | undefined) => (fraction == null ? '' : String(Number((fraction * 100).toPrecision(10))));
