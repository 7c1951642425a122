// What backs a part's status: the latest verdict of each quantity it was measured in and the flags
// of its current fits (the newest fit of each kind that no refit replaced). The install check and
// the customer report read the same evidence, so neither can call a part "pass" when its taper fit
// flagged it.
import { and, desc, eq, isNull } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { fits, readings } from '@server/db/schema';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT, type Quantity } from '@shared/units/quantities';
import type { PartRow } from './repository';

export interface QuantityVerdict {
  quantity: string;
  value: number;
  verdict: 'pass' | 'fail' | 'marginal' | null;
  reason: string | null;
  takenAt: number;
}

export interface FitEvidence {
  kind: 'taper' | 'coil';
  fitId: number;
  flags: { code: string; message: string }[];
  /** The fitted law (taper) and its mid-rotation value, when the fit has them. */
  law: string | null;
  m: number | null;
}

export interface PartEvidence {
  /** The stored status of the part. */
  status: PartRow['status'];
  /**
   * What the evidence says: 'flagged' when any latest verdict failed or was marginal or any current
   * fit carries flags; 'passed' when at least one judged verdict or fit exists and nothing flags it;
   * 'not checked' when nothing was judged.
   */
  judged: 'passed' | 'flagged' | 'not checked';
  verdicts: QuantityVerdict[];
  fits: FitEvidence[];
  /** Every reason against the part, in words ("taper fit: law outside profile …"). */
  reasons: string[];
}

export function partEvidence(db: DbLike, part: PartRow): PartEvidence {
  const latest = new Map<string, QuantityVerdict>();
  for (const r of db.select().from(readings).where(eq(readings.partId, part.id)).orderBy(desc(readings.id)).all()) {
    if (!latest.has(r.quantity))
      latest.set(r.quantity, { quantity: r.quantity, value: r.value, verdict: r.verdict, reason: r.verdictReason, takenAt: r.takenAt });
  }
  const current = new Map<string, FitEvidence>();
  for (const f of db
    .select()
    .from(fits)
    .where(and(eq(fits.partId, part.id), isNull(fits.supersededAt)))
    .orderBy(desc(fits.id))
    .all()) {
    if (current.has(f.kind)) continue;
    const result = f.result as {
      flags?: { code: string; message: string }[];
      law?: string;
      m?: number;
      best?: { law?: string; m?: number };
    };
    current.set(f.kind, {
      kind: f.kind,
      fitId: f.id,
      flags: Array.isArray(result.flags) ? result.flags : [],
      law: result.best?.law ?? result.law ?? null,
      m: result.best?.m ?? result.m ?? null,
    });
  }
  const verdicts = [...latest.values()];
  const fitList = [...current.values()];
  const reasons: string[] = [];
  for (const v of verdicts) {
    if (v.verdict === 'fail' || v.verdict === 'marginal') reasons.push(`${v.quantity} ${v.verdict}: ${v.reason ?? 'no reason stored'}`);
  }
  for (const f of fitList) for (const flag of f.flags) reasons.push(`${f.kind} fit: ${flag.message}`);
  const anyJudged = verdicts.some((v) => v.verdict != null) || fitList.length > 0;
  const judged = reasons.length > 0 ? 'flagged' : anyJudged ? 'passed' : 'not checked';
  return { status: part.status, judged, verdicts, fits: fitList, reasons };
}

/** "resistance 487 kΩ (pass)", "capacitance 22 nF (not judged)". */
export function describeVerdict(v: QuantityVerdict): string {
  const unit = QUANTITY_UNIT[v.quantity as Quantity] ?? '';
  return `${v.quantity} ${formatValue(v.value, unit)} (${v.verdict ?? 'not judged: no limit applies'})`;
}

/** Statuses that may only be installed with a stated reason. */
export const NEEDS_OVERRIDE = new Set<PartRow['status']>(['flagged', 'incoming']);

/**
 * Whether installing this part needs an override, and why. A part needs one when its status is
 * flagged or incoming (never judged), and also when its status says passed but its current
 * evidence flags it (a later passing reading does not clear a flagged taper fit).
 */
export function installCheck(
  db: DbLike,
  part: PartRow,
): { needsOverride: boolean; status: string; reasons: string[]; evidence: PartEvidence } {
  const evidence = partEvidence(db, part);
  if (part.status === 'incoming') {
    return {
      needsOverride: true,
      status: 'incoming',
      reasons: [part.statusReason ?? 'never judged: no reading with limits and no fit'],
      evidence,
    };
  }
  if (part.status === 'flagged' || (part.status === 'passed' && evidence.judged === 'flagged')) {
    const reasons = evidence.reasons.length ? evidence.reasons : [part.statusReason ?? 'flagged'];
    return { needsOverride: true, status: 'flagged', reasons, evidence };
  }
  return { needsOverride: false, status: part.status, reasons: [], evidence };
}
