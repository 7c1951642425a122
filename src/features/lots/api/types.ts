// The lot routes' answers are declared once in shared/schemas/lots.ts (the server's handlers return them).
import type { LotMatch } from '@/data/query-keys';

export type {
  Disposition,
  Lot,
  LotBin,
  LotDetail,
  LotHistoryEvent,
  LotItems,
  LotKind,
  LotListRow,
  LotStats,
  LotStatus,
  LotWatcher,
  SecondQuantity,
} from '@shared/schemas/lots';

/** The matched-set chooser: parts agreeing within matchPct %, in sets of setSize. */
export type MatchOptions = LotMatch;

export const DEFAULT_MATCH: MatchOptions = { matchPct: 1, setSize: 2 };
