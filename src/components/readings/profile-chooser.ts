// Which tolerance profile a part follows, chosen in the browser the way the server chooses it
// (server/features/profiles/repository.ts profileForPart), so the live verdict and the stored one agree.
import type { ReadingJudgement } from '@shared/analysis/reading-verdict';
import { judgeReading, type ProfileSpec } from '@shared/analysis/reading-verdict';
import type { ReadingQuantity } from '@shared/schemas/bench';
import type { PartKind } from '@shared/schemas/common';
import type { Instrument, Profile } from './api';

export type JudgedPart = { kind: PartKind; nominal: number | null; tolerancePct: number | null; profileId: number | null; taperClass: string | null };

/** An 'audio-any' profile takes both audio laws; a part without a taper class fits any law. */
function lawFits(profile: Profile, taperClass: string | null): boolean {
  const law = profile.rules.law;
  if (!law || !taperClass) return true;
  if (law === 'audio-any') return taperClass === 'audio' || taperClass === 'two-segment';
  return law === taperClass;
}

/** The profile the part names, else the most specific one of its kind that holds its nominal and law. */
export function chooseProfile(profiles: readonly Profile[], part: JudgedPart): Profile | null {
  if (part.profileId != null) return profiles.find((p) => p.id === part.profileId) ?? null;
  const n = part.nominal;
  const candidates = profiles.filter((p) => {
    if (p.kind !== part.kind) return false;
    if (p.nominalMin != null && (n == null || n < p.nominalMin)) return false;
    if (p.nominalMax != null && (n == null || n > p.nominalMax)) return false;
    return lawFits(p, part.taperClass);
  });
  const specificity = (p: Profile) => (p.nominalMin != null ? 1 : 0) + (p.nominalMax != null ? 1 : 0) + (p.rules.law ? 1 : 0);
  candidates.sort((a, b) => specificity(b) - specificity(a) || a.id - b.id);
  return candidates[0] ?? null;
}

export const toProfileSpec = (p: Profile | null): ProfileSpec | null => (p ? { name: p.name, tolerancePct: p.tolerancePct, rules: p.rules } : null);

/** The verdict the server will give this reading (null: no limit applies to the quantity). */
export function previewVerdict(
  part: JudgedPart,
  reading: { quantity: ReadingQuantity; value: number },
  profiles: readonly Profile[],
  instrument: Instrument | null,
): ReadingJudgement | null {
  return judgeReading(part, reading, {
    profile: toProfileSpec(chooseProfile(profiles, part)),
    accuracy: instrument?.accuracy[reading.quantity] ?? null,
  });
}
