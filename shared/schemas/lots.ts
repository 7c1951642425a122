import { z } from 'zod';
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
