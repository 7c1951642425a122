// Which limits apply to a reading of a part, and the verdict: one function for the bench form's
// live preview (browser) and the server's stored verdict, so both always agree.
import type { ProfileRules } from '@shared/schemas/bench';
import type { PartKind } from '@shared/schemas/common';
import { QUANTITY_UNIT, type Quantity } from '@shared/units/quantities';
import { toleranceOf, toleranceWords } from './tolerance';
import { accuracyAt, instrumentUncertainty, judge, limitsFromTolerance, type Accuracy, type Verdict } from './verdict';

export interface PartSpec {
  kind: PartKind;
  nominal: number | null;
  /** Below nominal (−), percent; also above it unless tolerancePlusPct differs. */
  tolerancePct: number | null;
  /** Above nominal (+), percent; absent or null: the same as tolerancePct. */
  tolerancePlusPct?: number | null;
}

export interface ProfileSpec {
  name: string;
  tolerancePct: number;
  rules: ProfileRules;
}

export interface ReadingToJudge {
  quantity: Quantity;
  value: number;
}

/** The quantity a part's nominal value is of (pickups: DC resistance). */
export function nominalQuantity(kind: PartKind): Quantity {
  return kind === 'capacitor' ? 'capacitance' : 'resistance';
}

export interface ReadingJudgement extends Verdict {
  /** Which rule set the limits: the part's own tolerance or the named profile. */
  source: string;
}

/**
 * The verdict of one reading, or null when no limit applies to that quantity (it is then kept
 * as information only). The part's own tolerance wins over the profile's.
 */
export function judgeReading(
  part: PartSpec,
  reading: ReadingToJudge,
  opts: { profile?: ProfileSpec | null; accuracy?: Accuracy | null; displayCounts?: number | null } = {},
): ReadingJudgement | null {
  const unit = QUANTITY_UNIT[reading.quantity];
  const uncertainty = opts.accuracy
    ? instrumentUncertainty(reading.value, accuracyAt(reading.value, opts.accuracy, opts.displayCounts))
    : null;
  const rules = opts.profile?.rules ?? {};

  if (reading.quantity === nominalQuantity(part.kind) && part.nominal != null) {
    const tolerance = toleranceOf(part.tolerancePct, part.tolerancePlusPct) ?? toleranceOf(opts.profile?.tolerancePct);
    if (tolerance == null) return null;
    const { lower, upper } = limitsFromTolerance(part.nominal, tolerance);
    const source =
      part.tolerancePct != null
        ? `part tolerance ${toleranceWords(tolerance.minusPct, tolerance.plusPct)}`
        : `profile "${opts.profile!.name}"`;
    return {
      ...judge({ value: reading.value, nominal: part.nominal, lower, upper, uncertainty, unit, quantity: reading.quantity }),
      source,
    };
  }
  if (reading.quantity === 'dissipation' && rules.dissipationMax != null) {
    return {
      ...judge({ value: reading.value, lower: 0, upper: rules.dissipationMax, uncertainty, unit, quantity: reading.quantity }),
      source: `profile "${opts.profile!.name}"`,
    };
  }
  if (reading.quantity === 'esr' && rules.esrMax != null) {
    return {
      ...judge({ value: reading.value, lower: 0, upper: rules.esrMax, uncertainty, unit, quantity: reading.quantity }),
      source: `profile "${opts.profile!.name}"`,
    };
  }
  if (
    reading.quantity === 'inductance' &&
    part.kind === 'pickup' &&
    rules.inductanceNominal != null &&
    rules.inductanceTolerancePct != null
  ) {
    const { lower, upper } = limitsFromTolerance(rules.inductanceNominal, rules.inductanceTolerancePct);
    return {
      ...judge({ value: reading.value, nominal: rules.inductanceNominal, lower, upper, uncertainty, unit, quantity: reading.quantity }),
      source: `profile "${opts.profile!.name}"`,
    };
  }
  return null;
}

/** True when an instrument's calibration due date (YYYY-MM-DD) lies before the given day. */
export function calibrationOverdue(calibrationDue: string | null | undefined, today: Date): boolean {
  if (!calibrationDue) return false;
  return calibrationDue < today.toISOString().slice(0, 10);
}
