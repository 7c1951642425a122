// Which tolerance profile a part follows. One function for the server (stored verdicts and fits)
// and the browser (the live verdict while typing), so both always choose the same profile.
import type { ProfileRules } from '@shared/schemas/bench';
import type { PartKind } from '@shared/schemas/common';

export interface MatchableProfile {
  id: number;
  name: string;
  kind: PartKind;
  nominalMin: number | null;
  nominalMax: number | null;
  tolerancePct: number;
  rules: ProfileRules;
}

export interface ProfiledPart {
  kind: PartKind;
  nominal: number | null;
  profileId: number | null;
  taperClass: string | null;
}

/** An 'audio-any' profile takes both audio laws; a part without a taper class fits any law. */
function lawFits(rules: ProfileRules, taperClass: string | null): boolean {
  if (!rules.law || !taperClass) return true;
  if (rules.law === 'audio-any') return taperClass === 'audio' || taperClass === 'two-segment';
  return rules.law === taperClass;
}

/**
 * The profile the part names, else the most specific profile of its kind whose nominal range
 * holds the part's nominal and, for pots, whose law fits the taper class (ties: the oldest).
 */
export function chooseProfile<P extends MatchableProfile>(profiles: readonly P[], part: ProfiledPart): P | null {
  if (part.profileId != null) return profiles.find((p) => p.id === part.profileId) ?? null;
  const n = part.nominal;
  const candidates = profiles.filter((p) => {
    if (p.kind !== part.kind) return false;
    if (p.nominalMin != null && (n == null || n < p.nominalMin)) return false;
    if (p.nominalMax != null && (n == null || n > p.nominalMax)) return false;
    return lawFits(p.rules, part.taperClass);
  });
  const specificity = (p: P) => (p.nominalMin != null ? 1 : 0) + (p.nominalMax != null ? 1 : 0) + (p.rules.law ? 1 : 0);
  candidates.sort((a, b) => specificity(b) - specificity(a) || a.id - b.id);
  return candidates[0] ?? null;
}
