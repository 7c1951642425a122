// The shapes the lot routes answer with (server/features/lots/router.ts). Statistics are the
// engine's LotStatistics as JSON: ±Infinity bin bounds arrive as null, and the per-item
// deviations are left out (the items route carries them as a column).
import type { DeviationBin, LotStatistics, MatchedSet } from '@shared/analysis/lot-stats';
import type { DISPOSITIONS, LOT_KINDS, LOT_STATUSES, SECOND_QUANTITIES } from '@shared/schemas/lots';

export type LotKind = (typeof LOT_KINDS)[number];
export type LotStatus = (typeof LOT_STATUSES)[number];
export type Disposition = (typeof DISPOSITIONS)[number];
export type SecondQuantity = (typeof SECOND_QUANTITIES)[number];

export interface Lot {
  id: number;
  code: string;
  kind: LotKind;
  quantity: string;
  nominal: number;
  /** Below nominal (−), percent; tolerancePlusPct is the side above (null on rows from before it existed: symmetric). */
  tolerancePct: number;
  tolerancePlusPct: number | null;
  marking: string | null;
  supplier: string | null;
  receivedOn: string | null;
  expectedCount: number | null;
  secondQuantity: SecondQuantity | null;
  secondLimit: number | null;
  /** The meter and test frequency (Hz) of the lot's readings, carried to promoted parts. */
  instrumentId: number | null;
  testFrequency: number | null;
  status: LotStatus;
  dispositionReason: string | null;
  disposedBy: string | null;
  disposedAt: number | null;
  notes: string | null;
  createdBy: string | null;
  createdAt: number;
  /** F for capacitors, Ω for pots and resistors. */
  unit: string;
}

export type LotListRow = Lot & { count: number };

export type LotBin = Omit<DeviationBin, 'fromPct' | 'toPct' | 'indices'> & { fromPct: number | null; toPct: number | null };

/** The server lists the first 200 matched sets and counts them all in `matchedSetCount`. */
export type LotStats = Omit<LotStatistics, 'deviationsPct' | 'bins' | 'matchedSets'> & {
  bins: LotBin[];
  matchedSets: MatchedSet[];
  matchedSetCount: number;
};

export interface LotWatcher {
  id: string;
  email: string;
  name: string;
}

/** One event of a lot's history, oldest first (server/features/lots/history.ts). */
export interface LotHistoryEvent {
  kind: 'created' | 'upload' | 'disposition' | 'reopen' | 'watchers' | 'promote';
  at: number;
  by: string | null;
  file?: string;
  rows?: number;
  replaced?: boolean;
  status?: string;
  was?: string;
  reason?: string;
  parts?: number;
}

export type LotDetail = LotListRow & {
  watchers: LotWatcher[];
  history: LotHistoryEvent[];
  stats: LotStats | null;
  disposedByName: string | null;
};

/** Every item of a lot as columns (GET /api/lots/:id/items); -1 in bin/set means none. */
export interface LotItems {
  ids: number[];
  items: string[];
  values: number[];
  second: (number | null)[];
  deviationsPct: number[];
  bin: number[];
  set: number[];
  outlier: (0 | 1)[];
  secondFail: (0 | 1)[];
  /** The part each item was promoted to, or null. */
  partIds: (number | null)[];
}

/** The matched-set chooser: parts agreeing within matchPct %, in sets of setSize. */
export interface MatchOptions {
  matchPct: number;
  setSize: number;
}

export const DEFAULT_MATCH: MatchOptions = { matchPct: 1, setSize: 2 };
