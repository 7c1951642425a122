// A tolerance has two sides: how far below nominal a part may be and how far above it. Most are
// symmetric (±5 %); IEC 60062 letter Z is −20 %/+80 %. Parts and lots store the lower side as
// `tolerancePct` and the upper side as `tolerancePlusPct` (equal to it when symmetric; a row
// written before the two sides existed has no upper side and is symmetric).

export interface TwoSidedTolerance {
  /** Percent below nominal, ≥ 0. */
  minusPct: number;
  /** Percent above nominal, ≥ 0. */
  plusPct: number;
}

/** The two sides of a stored tolerance, or null when there is none. */
export function toleranceOf(tolerancePct: number | null | undefined, tolerancePlusPct?: number | null): TwoSidedTolerance | null {
  if (tolerancePct == null) return null;
  return { minusPct: tolerancePct, plusPct: tolerancePlusPct ?? tolerancePct };
}

export function isSymmetric(t: TwoSidedTolerance): boolean {
  return t.minusPct === t.plusPct;
}

function pctText(x: number): string {
  return String(Number(x.toPrecision(3)));
}

/** "±5 %", "−20 %/+80 %"; "not set" without a tolerance. */
export function toleranceWords(tolerancePct: number | null | undefined, tolerancePlusPct?: number | null): string {
  const t = toleranceOf(tolerancePct, tolerancePlusPct);
  if (!t) return 'not set';
  return isSymmetric(t) ? `±${pctText(t.minusPct)} %` : `−${pctText(t.minusPct)} %/+${pctText(t.plusPct)} %`;
}

/**
 * Reads what a person types for a tolerance: "5", "±5 %", "2,5", or two sides "−20/+80",
 * "-20 % +80 %", "+80/-20" (the signs say which side is which). Blank → null.
 */
export function parseToleranceText(text: string): { ok: true; value: TwoSidedTolerance | null } | { ok: false; error: string } {
  const t = text
    .trim()
    .replace(/\u2212/g, '-')
    .replace(/(\d),(\d)/g, '$1.$2');
  if (t === '') return { ok: true, value: null };
  const bad = {
    ok: false as const,
    error: 'Type a percentage such as 5 or ±2.5, or two sides such as −20/+80.',
  };
  const one = /^±?\s*(\d+(?:\.\d+)?)\s*%?$/.exec(t);
  if (one) {
    const v = Number(one[1]);
    return v > 0 && v <= 100
      ? { ok: true, value: { minusPct: v, plusPct: v } }
      : { ok: false, error: 'Must be more than 0 % and at most 100 %.' };
  }
  const two = /^([+-])\s*(\d+(?:\.\d+)?)\s*%?\s*[/,;\s]\s*([+-])\s*(\d+(?:\.\d+)?)\s*%?$/.exec(t);
  if (!two || two[1] === two[3]) return bad;
  const a = Number(two[2]);
  const b = Number(two[4]);
  const minusPct = two[1] === '-' ? a : b;
  const plusPct = two[1] === '-' ? b : a;
  if (!(minusPct >= 0 && minusPct <= 100)) return { ok: false, error: 'The side below nominal must be 0 % to 100 %.' };
  if (!(plusPct >= 0 && plusPct <= 1000)) return { ok: false, error: 'The side above nominal must be 0 % to 1000 %.' };
  if (minusPct === 0 && plusPct === 0) return { ok: false, error: 'A tolerance of 0 % on both sides admits no part.' };
  return { ok: true, value: { minusPct, plusPct } };
}
