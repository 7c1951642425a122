// Instruments, tolerance profiles and readings: the bench's records.
import { z } from 'zod';
import { PROFILE_LAWS } from '@shared/taper/law';
import { PartKindSchema } from './common';
import { rangeNumber, readingProblem } from './ranges';

export const READING_QUANTITIES = ['resistance', 'capacitance', 'inductance', 'dissipation', 'esr', 'q'] as const;
export const ReadingQuantitySchema = z.enum(READING_QUANTITIES);
export type ReadingQuantity = z.infer<typeof ReadingQuantitySchema>;

export const AccuracySchema = z.object({
  pctOfReading: z.number().finite().min(0).max(100),
  counts: z.number().finite().min(0).max(10_000),
  /** The value of one count at the range in use, SI units (used when the display counts are not recorded). */
  resolution: z.number().finite().min(0),
  /** Accuracy on particular ranges (counts × 10^k, SI units), when it differs from the line above. */
  ranges: z
    .array(
      z.object({
        range: z.number().finite().positive(),
        pctOfReading: z.number().finite().min(0).max(100),
        counts: z.number().finite().min(0).max(10_000),
      }),
    )
    .max(12)
    .optional(),
});

export const INSTRUMENT_KINDS = ['multimeter', 'lcr-meter', 'analyser', 'other'] as const;
export const InstrumentInputSchema = z.object({
  name: z.string().trim().min(1, 'Name the instrument.').max(80),
  kind: z.enum(INSTRUMENT_KINDS),
  serial: z.string().trim().max(60).optional().nullable(),
  accuracy: z.partialRecord(ReadingQuantitySchema, AccuracySchema).default({}),
  /** The display's counts (e.g. 6000): the count size then follows each reading's range. */
  displayCounts: z.number().int().min(2).max(10_000_000).optional().nullable(),
  calibrationDue: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-03-31.')
    .optional()
    .nullable(),
  notes: z.string().trim().max(1000).optional().nullable(),
});
export type InstrumentInput = z.infer<typeof InstrumentInputSchema>;

/** Kind-specific rules of a tolerance profile. Fractions for m; SI units elsewhere. */
export const ProfileRulesSchema = z.object({
  law: z.enum(PROFILE_LAWS).optional(),
  mMin: z.number().gt(0).lt(1).optional(),
  mMax: z.number().gt(0).lt(1).optional(),
  maxEndResistance: z.number().min(0).optional(),
  dissipationMax: z.number().positive().optional(),
  dissipationFrequency: z.number().positive().optional(),
  esrMax: z.number().positive().optional(),
  inductanceNominal: z.number().positive().optional(),
  inductanceTolerancePct: z.number().positive().max(100).optional(),
  minQ: z.number().positive().optional(),
});
export type ProfileRules = z.infer<typeof ProfileRulesSchema>;

export const ProfileInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Name the profile.').max(80),
    kind: PartKindSchema,
    nominalMin: z.number().positive().optional().nullable(),
    nominalMax: z.number().positive().optional().nullable(),
    tolerancePct: z.number().positive().max(100),
    rules: ProfileRulesSchema.default({}),
  })
  .refine((p) => p.nominalMin == null || p.nominalMax == null || p.nominalMin <= p.nominalMax, {
    message: 'The smallest nominal must not exceed the largest.',
    path: ['nominalMax'],
  })
  .refine((p) => p.rules.mMin == null || p.rules.mMax == null || p.rules.mMin <= p.rules.mMax, {
    message: 'The smallest m must not exceed the largest.',
    path: ['rules', 'mMax'],
  });
export type ProfileInput = z.infer<typeof ProfileInputSchema>;

/** A bench reading: its value must be one a meter can show for its quantity (ranges.ts, readingProblem). */
export const CreateReadingInputSchema = z
  .object({
    quantity: ReadingQuantitySchema,
    value: z.number().finite(),
    /** Test frequency, Hz (LCR readings). */
    frequency: rangeNumber('frequency').optional().nullable(),
    instrumentId: z.number().int().positive().optional().nullable(),
  })
  .superRefine((r, ctx) => {
    const problem = readingProblem(r.quantity, r.value);
    if (problem) ctx.addIssue({ code: 'custom', path: ['value'], message: problem });
  });
export type CreateReadingInput = z.infer<typeof CreateReadingInputSchema>;
