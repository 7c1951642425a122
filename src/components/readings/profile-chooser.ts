// The live verdict in the browser: the profile is chosen by the same shared function the server
// uses (shared/analysis/profile-match.ts), so the live verdict and the stored one agree.
import type { ReadingJudgement } from '@shared/analysis/reading-verdict';
import { judgeReading, type ProfileSpec } from '@shared/analysis/reading-verdict';
import type { ReadingQuantity } from '@shared/schemas/bench';
import { chooseProfile, type ProfiledPart } from '@shared/analysis/profile-match';
import type { Instrument } from '@/data/instruments';
import type { Profile } from '@/data/profiles';

export type JudgedPart = ProfiledPart & { tolerancePct: number | null };

export const toProfileSpec = (p: Profile | null): ProfileSpec | null =>
  p ? { name: p.name, tolerancePct: p.tolerancePct, rules: p.rules } : null;

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
    displayCounts: instrument?.displayCounts ?? null,
  });
}
