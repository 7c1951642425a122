// Number formats of the lot screens: values in engineering notation with the lot's unit, and a
// fixed display prefix for axes and columns (one prefix for the whole lot reads better than a
// prefix that changes from row to row).
import { formatValue } from '@shared/units/format';

const PREFIX: Record<number, string> = { [-12]: 'p', [-9]: 'n', [-6]: 'µ', [-3]: 'm', 0: '', 3: 'k', 6: 'M', 9: 'G' };

/** The SI prefix that puts the nominal between 1 and 1000: 47e-9 F → { factor: 1e9, unit: 'nF' }. */
export function displayScale(nominal: number, unit: string): { factor: number; unit: string } {
  let exp3 = Math.floor(Math.log10(Math.abs(nominal)) / 3) * 3;
  if (!Number.isFinite(exp3) || PREFIX[exp3] === undefined) exp3 = 0;
  return { factor: exp3 >= 0 ? 1 / 10 ** exp3 : 10 ** -exp3, unit: `${PREFIX[exp3]}${unit}` };
}

/** A lot value with four significant digits: spreads of a few tenths of a percent stay visible. */
export const fmtLotValue = (v: number | null | undefined, unit: string, digits = 4) =>
  v == null || !Number.isFinite(v) ? '—' : formatValue(v, unit, { digits });

/** Signed percent with a proper minus: +1.25 %, −0.40 %. */
export function fmtPct(v: number | null | undefined, decimals = 2): string {
  if (v == null || !Number.isFinite(v)) return '—';
  const s = Math.abs(v).toFixed(decimals);
  return `${v > 0 ? '+' : v < 0 && Number(s) !== 0 ? '−' : ''}${s} %`;
}

/** D is a fraction shown as such (0.0012); ESR and end resistance in Ω. */
export const fmtSecond = (v: number | null | undefined, unit: string) =>
  v == null ? '—' : unit === '' ? formatValue(v, '', { digits: 3 }) : formatValue(v, unit, { digits: 3 });
