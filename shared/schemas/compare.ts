// Bodies of the compare routes and saved comparisons (docs/screens.md, Compare: taper study).
import { z } from 'zod';
import { DEFAULT_CABLE, LOADS } from '../circuit/loads';
import { SiPositive } from './common';
import { TaperClassSchema } from './parts';

const IsoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date as YYYY-MM-DD.');
const ids = (max: number) => z.array(z.number().int().positive()).max(max);

/**
 * Which pots to compare. Filters of different kinds must all hold; within a list any entry may
 * match. `partIds` adds pots one by one (also to a filtered selection). With no filter and no
 * part ids, the selection is every pot with a current taper fit. Dates are days in UTC, both ends
 * included, on the part's creation date.
 */
export const CompareSelectionSchema = z
  .object({
    lotIds: ids(200).optional(),
    suppliers: z.array(z.string().trim().min(1).max(80)).max(50).optional(),
    /** Nominal end-to-end resistance, Ω; matches within 0.5 %. */
    nominal: SiPositive.optional(),
    taperClasses: z.array(TaperClassSchema).max(4).optional(),
    createdFrom: IsoDate.optional(),
    createdTo: IsoDate.optional(),
    /** One word of the part's tags (case-insensitive). */
    tag: z.string().trim().min(1).max(60).optional(),
    partIds: ids(2000).optional(),
  })
  .refine((s) => !s.createdFrom || !s.createdTo || s.createdFrom <= s.createdTo, {
    message: 'The end date is before the start date.',
    path: ['createdTo'],
  });
export type CompareSelection = z.infer<typeof CompareSelectionSchema>;

export const GROUP_BY = ['lot', 'supplier', 'none'] as const;
export const GroupBySchema = z.enum(GROUP_BY);

export const CompareTapersRequestSchema = z.object({
  selection: CompareSelectionSchema,
  groupBy: GroupBySchema.default('lot'),
  gridPoints: z.number().int().min(11).max(501).default(101),
});
export type CompareTapersRequest = z.input<typeof CompareTapersRequestSchema>;

export const PickupChoiceSchema = z.discriminatedUnion('source', [
  z.object({ source: z.literal('preset'), id: z.enum(['single-coil-like', 'humbucker-like']) }),
  z.object({ source: z.literal('part'), partId: z.number().int().positive() }),
]);
export type PickupChoice = z.infer<typeof PickupChoiceSchema>;

/** What a study shows besides its selection: grouping, envelope, loaded-taper and matching choices. */
export const CompareSettingsSchema = z.object({
  groupBy: GroupBySchema,
  envelope: z.enum(['min-max', 'two-sd']),
  pickup: PickupChoiceSchema,
  /** Cable length, m (100 pF per metre). */
  cableLength: z.number().finite().min(0, 'The cable length cannot be negative.').max(100, 'Keep the cable under 100 m.'),
  /** Amplifier input resistance, Ω. */
  ampR: SiPositive,
  toleranceDb: z.number().finite().gt(0, 'The tolerance must be more than 0 dB.').max(20, 'Keep the tolerance to 20 dB or less.'),
  setSize: z.number().int().min(2, 'A set has at least two pots.').max(6, 'Sets of up to six pots.'),
  /** Levels below this are ignored by matching (clamped to it), dB. */
  floorDb: z.number().finite().min(-120).max(-6),
});
export type CompareSettings = z.infer<typeof CompareSettingsSchema>;

/**
 * Defaults: group by lot, min–max envelope, humbucker-like preset pickup, 3 m cable, 1 MΩ input
 * (the harness engine's defaults, docs/computation.md §6), pairs within 1 dB above −40 dB (common
 * practice, no published source).
 */
export const DEFAULT_COMPARE_SETTINGS: CompareSettings = {
  groupBy: 'lot',
  envelope: 'min-max',
  pickup: { source: 'preset', id: 'humbucker-like' },
  cableLength: DEFAULT_CABLE.lengthM,
  ampR: LOADS.amp.inputDefault,
  toleranceDb: 1,
  setSize: 2,
  floorDb: -40,
};

/** Cable capacitance per metre, F/m: the cable of loads.ts (Sound On Sound, "Guitar cables", Nov 2009: about 100 pF per metre). */
export const CABLE_CAPACITANCE_PER_METRE = DEFAULT_CABLE.capPerMetre;

export const ComparisonInputSchema = z.object({
  name: z.string().trim().min(1, 'Give the comparison a name.').max(120, 'Keep the name to 120 characters.'),
  selection: CompareSelectionSchema,
  settings: CompareSettingsSchema.partial().optional(),
  notes: z.string().trim().max(4000, 'Keep the notes to 4,000 characters.').optional().nullable(),
});
export type ComparisonInput = z.infer<typeof ComparisonInputSchema>;

export const ComparisonUpdateSchema = z.object({
  name: ComparisonInputSchema.shape.name.optional(),
  selection: CompareSelectionSchema.optional(),
  settings: CompareSettingsSchema.partial().optional(),
  notes: ComparisonInputSchema.shape.notes,
});
export type ComparisonUpdate = z.infer<typeof ComparisonUpdateSchema>;
