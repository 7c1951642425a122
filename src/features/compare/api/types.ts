// Shapes of the compare routes' answers (server/features/compare/router.ts), as JSON brings them:
// NaN and missing values arrive as null.
import type { ComparePot, CompareGroup, GroupBy } from '@shared/analysis/compare';
import type { CompareSelection, CompareSettings } from '@shared/schemas/compare';

export interface CandidatePot {
  id: number;
  label: string;
  lotId: number | null;
  lotCode: string | null;
  supplier: string | null;
  nominal: number | null;
  taperClass: string | null;
  tags: string | null;
  createdAt: number;
  law: string;
  m: number;
}

export interface CandidatePickup {
  id: number;
  label: string;
  R: number;
  L: number;
  C: number;
  Rp: number | null;
}

export interface CompareCandidates {
  pots: CandidatePot[];
  lots: { id: number; code: string; supplier: string | null; count: number }[];
  suppliers: string[];
  nominals: number[];
  tags: string[];
  pickups: CandidatePickup[];
}

export type TaperPot = ComparePot & { group: string; gridCurve: (number | null)[] };

export interface CompareTapersResponse {
  groupBy: GroupBy;
  grid: number[];
  pots: TaperPot[];
  groups: CompareGroup[];
  missing: number[];
}

export interface SavedComparison {
  id: number;
  name: string;
  selection: CompareSelection;
  settings: Partial<CompareSettings> | null;
  ownerId: string | null;
  ownerName: string | null;
  /** What the study is for and what it showed. */
  notes: string | null;
  createdAt: number;
  updatedAt: number | null;
}
