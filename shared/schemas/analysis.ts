// Bodies of the stateless analysis routes. Field names carry SI units: ohm, henry, farad, hertz.
import { z } from 'zod';
import { PROFILE_LAWS } from '@shared/taper/law';
import { QUANTITIES } from '@shared/units/quantities';
import { rangeNumber } from './ranges';
import { MAX_SWEEP_POINTS } from './sweeps';

const finite = z.number().finite();
const nonNegative = finite.min(0, 'Must be zero or more.');
const positive = finite.positive('Must be more than zero.');

export const ValueRequestSchema = z.object({
  text: z.string().min(1, 'Type a value.').max(60),
  quantity: z.enum(QUANTITIES as [string, ...string[]]).optional(),
});

export const MarkingRequestSchema = z.object({ code: z.string().trim().min(1, 'Type a marking.').max(80) });

export const TaperProfileSchema = z.object({
  law: z.enum(PROFILE_LAWS).optional(),
  mMin: z.number().gt(0).lt(1).optional(),
  mMax: z.number().gt(0).lt(1).optional(),
  maxEndResistance: nonNegative.optional(),
});

export const TaperRequestSchema = z.object({
  points: z
    .array(z.object({ rotation: nonNegative, resistance: nonNegative, resistanceW3: nonNegative.optional() }))
    .min(3, 'A taper fit needs at least three readings.')
    .max(
      MAX_SWEEP_POINTS.taper,
      `A taper fit takes at most ${MAX_SWEEP_POINTS.taper.toLocaleString('en')} readings, as many as a sweep upload.`,
    ),
  rotationUnit: z.enum(['deg', 'percent']),
  fullRotationDeg: rangeNumber('fullRotation').optional(),
  total: rangeNumber('resistance').optional(),
  nominal: positive.optional(),
  tolerancePct: positive.max(100).optional(),
  profile: TaperProfileSchema.optional(),
});
export type TaperRequest = z.infer<typeof TaperRequestSchema>;

const MagPhasePoint = z.object({ frequency: rangeNumber('frequency'), magnitude: nonNegative, phaseDeg: finite.min(-180).max(180) });
const ReImPoint = z.object({ frequency: rangeNumber('frequency'), re: finite, im: finite });

/**
 * A list of points of one kind, with zod's type checks of that kind done first as a plain loop (every
 * point an object, every field a finite number). A list that fails them would fail that union branch as
 * a type error anyway, so the union answers as a plain one would, with the same messages; but it no
 * longer reads 5,000 re/im points as magnitude/phase first, building two issues per point (tens of
 * milliseconds on the request thread). Every field of a point kind must be a required number.
 */
const pointsOfKind = <P extends z.ZodObject>(point: P) => {
  const fields = Object.keys(point.shape);
  return z
    .custom<unknown[]>((points) =>
      (points as unknown[]).every(
        (p) =>
          typeof p === 'object' &&
          p !== null &&
          !Array.isArray(p) &&
          fields.every((f) => Number.isFinite((p as Record<string, unknown>)[f])),
      ),
    )
    .pipe(z.array(point));
};

export const CoilRequestSchema = z.object({
  // The count is checked before any point is read (a 5 MB body holds some 100,000 of them).
  points: z
    .array(z.unknown())
    .max(MAX_SWEEP_POINTS.impedance, {
      error: (issue) =>
        `A coil fit takes at most ${MAX_SWEEP_POINTS.impedance.toLocaleString('en')} points, as many as an impedance sweep upload; this one has ${(issue.input as unknown[]).length.toLocaleString('en')}.`,
    })
    .pipe(
      z
        .union([pointsOfKind(MagPhasePoint), pointsOfKind(ReImPoint)])
        .refine((p) => p.length >= 5, 'A coil fit needs at least five points.'),
    ),
  withRp: z.union([z.boolean(), z.literal('auto')]).optional(),
});
export type CoilRequest = z.infer<typeof CoilRequestSchema>;

export const LotRequestSchema = z.object({
  values: z.array(finite).min(1, 'Give at least one value.').max(200_000),
  nominal: positive,
  tolerancePct: positive.max(100),
  second: z.object({ values: z.array(finite), max: positive }).optional(),
  matchPct: positive.max(50).optional(),
  setSize: z.number().int().min(2).max(12).optional(),
  binEdgesPct: z.array(finite).max(50).optional(),
});
export type LotRequest = z.infer<typeof LotRequestSchema>;
