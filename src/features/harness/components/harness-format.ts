import { formatValue } from '@shared/units/format';

/** A level or a change in dB with its sign: "+4.80 dB", "−3.52 dB" (true minus sign). */
export function formatDb(x: number | null | undefined, digits = 2): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  const text = Math.abs(x).toFixed(digits);
  if (Number(text) === 0) return `${(0).toFixed(digits)} dB`;
  return `${x < 0 ? '−' : '+'}${text} dB`;
}

/** A frequency in engineering notation: "3.44 kHz". */
export function formatHz(f: number | null | undefined): string {
  if (f === null || f === undefined || !Number.isFinite(f)) return '—';
  return formatValue(f, 'Hz', { digits: 3 });
}

/** A knob setting as on the dial: "6.5". */
export const formatKnob = (x: number) => (Math.round(x * 10) / 10).toFixed(1);

/** The interaction index (an RMS, never negative): "0.25 dB". */
export const formatIndex = (x: number) => (Number.isFinite(x) ? `${x.toFixed(2)} dB` : '—');
