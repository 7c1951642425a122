import { eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { toleranceProfiles } from '@server/db/schema';
import type { ProfileSpec } from '@shared/analysis/reading-verdict';
import type { ProfileRules } from '@shared/schemas/bench';
import type { PartRow } from '@server/features/parts/repository';

export type ProfileRow = typeof toleranceProfiles.$inferSelect;

export function listProfiles(db: DbLike): ProfileRow[] {
  return db.select().from(toleranceProfiles).orderBy(toleranceProfiles.kind, toleranceProfiles.name).all();
}

/** Whether a pot's taper class fits a profile's law (an 'audio-any' profile takes both audio laws). */
function lawFits(rules: ProfileRules, taperClass: string | null): boolean {
  if (!rules.law || !taperClass) return true;
  if (rules.law === 'audio-any') return taperClass === 'audio' || taperClass === 'two-segment';
  return rules.law === taperClass;
}

/**
 * The profile a part follows: the one it names, else the most specific profile of its kind whose
 * nominal range holds the part's nominal (and, for pots, whose law matches the taper class).
 */
export function profileForPart(db: DbLike, part: Pick<PartRow, 'kind' | 'nominal' | 'profileId' | 'taperClass'>): ProfileRow | null {
  if (part.profileId != null) return db.select().from(toleranceProfiles).where(eq(toleranceProfiles.id, part.profileId)).get() ?? null;
  const candidates = db
    .select()
    .from(toleranceProfiles)
    .where(eq(toleranceProfiles.kind, part.kind))
    .all()
    .filter((p) => {
      const n = part.nominal;
      if (p.nominalMin != null && (n == null || n < p.nominalMin)) return false;
      if (p.nominalMax != null && (n == null || n > p.nominalMax)) return false;
      return lawFits(p.rules as ProfileRules, part.taperClass);
    });
  const specificity = (p: ProfileRow) => (p.nominalMin != null ? 1 : 0) + (p.nominalMax != null ? 1 : 0) + ((p.rules as ProfileRules).law ? 1 : 0);
  candidates.sort((a, b) => specificity(b) - specificity(a) || a.id - b.id);
  return candidates[0] ?? null;
}

export function toProfileSpec(p: ProfileRow | null): ProfileSpec | null {
  return p ? { name: p.name, tolerancePct: p.tolerancePct, rules: p.rules as ProfileRules } : null;
}
