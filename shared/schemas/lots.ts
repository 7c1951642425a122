import { z } from 'zod';
import type { DeviationBin, LotStatistics, MatchedSet } from '@shared/analysis/lot-stats';
import { inRange, rangeWords, VALUE_RANGES } from './ranges';
import { checkTolerancePair, TolerancePlusSchema, ToleranceMinusSchema } from './parts';

export const LOT_KINDS = ['capacitor', 'pot', 'resistor'] as const;
export const LOT_STATUSES = ['open', 'accepted', 'rejected', 'sorted'] as const;
export const DISPOSITIONS = ['accepted', 'rejected', 'sorted'] as const;
export const SECOND_QUANTITIES = ['dissipation', 'esr', 'end-resistance'] as const;

/** Why a nominal does not fit a lot of this kind (capacitance for capacitors, resistance otherwise; ranges.ts), or null. */
export function lotNominalProblem(kind: (typeof LOT_KINDS)[number], nominal: number): string | null {
  const q = kind === 'capacitor' ? 'capacitance' : 'resistance';
  return inRange(q, nominal) ? null : `Must be ${VALUE_RANGES[q].what} ${rangeWords(q)}.`;
}

export const CreateLotInputSchema = z
  .object({
    code: z
      .string()
      .trim()
      .min(1)
      .max(40)
      .regex(/^[A-Za-z0-9][A-Za-z0-9._\-/]*$/, 'Use letters, digits and . _ - / only.')
      .optional(),
    kind: z.enum(LOT_KINDS),
    /** SI units (F for capacitors, Ω for pots and resistors); or give a marking instead. */
    nominal: z.number().finite().positive().optional(),
    marking: z.string().trim().min(1).max(40).optional(),
    /** Below nominal (−), percent; also above it unless tolerancePlusPct is given. */
    tolerancePct: ToleranceMinusSchema.optional(),
    /** Above nominal (+), percent (80 for a Z lot); omitted: the same as tolerancePct, or the marking's. */
    tolerancePlusPct: TolerancePlusSchema.optional(),
    supplier: z.string().trim().max(80).optional().nullable(),
    receivedOn: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-11-30.')
      .optional()
      .nullable(),
    expectedCount: z.number().int().positive().max(1_000_000).optional().nullable(),
    secondQuantity: z.enum(SECOND_QUANTITIES).optional().nullable(),
    secondLimit: z.number().finite().positive().optional().nullable(),
    instrumentId: z.number().int().positive().optional().nullable(),
    /** The LCR meter's test frequency in Hz (100 Hz, 1 kHz …). */
    testFrequency: z.number().finite().positive().max(10e6).optional().nullable(),
    watcherIds: z.array(z.string().min(1).max(64)).max(50).default([]),
    notes: z.string().trim().max(2000).optional().nullable(),
  })
  .refine((l) => l.nominal != null || l.marking != null, {
    message: 'Give the nominal value or a marking code such as 473J.',
    path: ['nominal'],
  })
  .refine((l) => (l.secondQuantity == null) === (l.secondLimit == null), {
    message: 'A second quantity needs its limit, and a limit its quantity.',
    path: ['secondLimit'],
  })
  .superRefine((l, ctx) => {
    checkTolerancePair(l, ctx);
    if (l.nominal != null) {
      const problem = lotNominalProblem(l.kind, l.nominal);
      if (problem) ctx.addIssue({ code: 'custom', path: ['nominal'], message: problem });
    }
  });
export type CreateLotInput = z.infer<typeof CreateLotInputSchema>;

export const LotStatsQuerySchema = z.object({
  matchPct: z.coerce.number().positive().max(50).optional(),
  setSize: z.coerce.number().int().min(2).max(12).optional(),
});

export const DispositionInputSchema = z.object({
  status: z.enum(DISPOSITIONS),
  reason: z.string().trim().min(3, 'Give the reason for the disposition.').max(2000),
});
export const ReopenInputSchema = z.object({ reason: z.string().trim().min(3, 'Say why the lot is reopened.').max(2000) });
export const WatchersInputSchema = z.object({ userIds: z.array(z.string().min(1).max(64)).max(50) });

export const PromoteInputSchema = z
  .object({
    /** Lot readings (ids) to turn into parts; or a whole deviation bin / matched set by its index. */
    readingIds: z.array(z.number().int().positive()).max(1000).optional(),
    bin: z.number().int().min(0).optional(),
    set: z.number().int().min(0).optional(),
    matchPct: z.number().positive().max(50).optional(),
    setSize: z.number().int().min(2).max(12).optional(),
  })
  .refine((p) => [p.readingIds, p.bin, p.set].filter((x) => x !== undefined).length === 1, {
    message: 'Choose readings, one bin or one set.',
    path: ['readingIds'],
  });
export type PromoteInput = z.infer<typeof PromoteInputSchema>;

// The answers of the lot routes (server/features/lots/router.ts), read by the client's api.get<T>.

export type LotKind = (typeof LOT_KINDS)[number];
export type LotStatus = (typeof LOT_STATUSES)[number];
export type Disposition = (typeof DISPOSITIONS)[number];
export type SecondQuantity = (typeof SECOND_QUANTITIES)[number];

/** A lot as stored, with the unit of its values. */
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

/** GET /api/lots: each lot with its number of readings. */
export type LotListRow = Lot & { count: number };

/** A deviation bin as JSON brings it: ±Infinity bounds arrive as null; the item indices stay out. */
export type LotBin = Omit<DeviationBin, 'fromPct' | 'toPct' | 'indices'> & { fromPct: number | null; toPct: number | null };

/**
 * The engine's LotStatistics as the detail route sends it: the per-item deviations are left out
 * (the items route carries them as a column); the first 200 matched sets are listed and all of
 * them counted in `matchedSetCount`.
 */
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

export type LotHistoryKind = 'created' | 'upload' | 'disposition' | 'reopen' | 'watchers' | 'promote';

/** One event of a lot's history, oldest first (server/features/lots/history.ts). */
export interface LotHistoryEvent {
  kind: LotHistoryKind;
  at: number;
  by: string | null;
  /** Upload: the file and its rows; disposition: the status; reopen: the status it had. */
  file?: string;
  rows?: number;
  replaced?: boolean;
  status?: string;
  was?: string;
  reason?: string;
  parts?: number;
}

/** GET /api/lots/:id */
export type LotDetail = LotListRow & {
  watchers: LotWatcher[];
  history: LotHistoryEvent[];
  stats: LotStats | null;
  disposedByName: string | null;
};

/** GET /api/lots/:id/items: every item of a lot as columns; -1 in bin/set means none. */
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
