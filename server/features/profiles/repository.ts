import { eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { toleranceProfiles } from '@server/db/schema';
import { chooseProfile } from '@shared/analysis/profile-match';
import type { ProfileSpec } from '@shared/analysis/reading-verdict';
import type { ProfileRules } from '@shared/schemas/bench';
import type { PartRow } from '@server/features/parts/repository';

export type ProfileRow = typeof toleranceProfiles.$inferSelect;

export function listProfiles(db: DbLike): ProfileRow[] {
  return db.select().from(toleranceProfiles).orderBy(toleranceProfiles.kind, toleranceProfiles.name).all();
}

/** The profile a part follows (shared/analysis/profile-match.ts: the same choice the browser makes). */
export function profileForPart(db: DbLike, part: Pick<PartRow, 'kind' | 'nominal' | 'profileId' | 'taperClass'>): ProfileRow | null {
  const candidates =
    part.profileId != null
      ? db.select().from(toleranceProfiles).where(eq(toleranceProfiles.id, part.profileId)).all()
      : db.select().from(toleranceProfiles).where(eq(toleranceProfiles.kind, part.kind)).all();
  return chooseProfile(
    candidates.map((p) => ({ ...p, rules: p.rules as ProfileRules })),
    part,
  );
}

export function toProfileSpec(p: ProfileRow | null): ProfileSpec | null {
  return p ? { name: p.name, tolerancePct: p.tolerancePct, rules: p.rules as ProfileRules } : null;
}
