import { z } from 'zod';
import type { CoilFit, CoilPoint } from '@shared/analysis/coil';
import type { TaperFit, TaperPoint } from '@shared/analysis/taper';
import { TAPER_LAWS } from '@shared/taper/law';
import type { Part } from './parts';
import { VALUE_RANGES, rangeWords } from './ranges';

export const SWEEP_KINDS = ['taper', 'impedance'] as const;
export const SweepKindSchema = z.enum(SWEEP_KINDS);
export type SweepKind = z.infer<typeof SweepKindSchema>;

/** What a stored fit is of: a taper sweep gives a taper fit, an impedance sweep a coil fit. */
export const FIT_KINDS = ['taper', 'coil'] as const;

/** A stored fit as the API sends it (GET /api/parts/:id/fits, a sweep's `fit`, a refit's answer). */
export type Fit = {
  id: number;
  partId: number;
  sweepId: number | null;
  engineVersion: string;
  flagged: boolean;
  supersededAt: number | null;
  createdAt: number;
} & ({ kind: 'taper'; result: TaperFit } | { kind: 'coil'; result: CoilFit });

/** An impedance point as the API sends it: frequency (Hz) with the real and imaginary parts (Ω). */
export type ImpedancePoint = Extract<CoilPoint, { re: number }>;

/**
 * A stored sweep as the API sends it (GET /api/parts/:id/sweeps). Points come back in the engines'
 * input shape: taper rotation in percent of the full rotation, impedance as re/im.
 */
export type Sweep = {
  id: number;
  partId: number;
  attachmentId: number | null;
  /** How the file's columns were understood ({ rotation: 'Angle (°)', … }). */
  columns: Record<string, string> | null;
  pointCount: number;
  createdBy: string | null;
  createdAt: number;
  /** The sweep's current fit (null when none is stored). */
  fit: Fit | null;
} & ({ kind: 'taper'; points: TaperPoint[] } | { kind: 'impedance'; points: ImpedancePoint[] });

/** POST /api/parts/:id/sweeps: the stored sweep, its fit, what the file's reading left aside, and the part with its new status. */
export type SweepUploadResult = Sweep & { fit: Fit; ignoredColumns: string[]; notes: string[]; part: Part };

/** POST /api/parts/:id/sweeps/:sweepId/refit: the new fit and the part with its new status. */
export type RefitResult = { fit: Fit; part: Part };

/** A column chosen by the user when the file's headers were not recognised: index or header text, and its unit. */
export const ColumnChoiceSchema = z.object({
  column: z.union([z.number().int().min(0), z.string().min(1)]),
  unit: z.string().max(12).optional(),
});
export const ExplicitMappingSchema = z.record(z.string(), ColumnChoiceSchema);

/** Multipart fields arrive as text: the mapping is JSON. */
const jsonField = <T extends z.ZodType>(schema: T) =>
  z
    .string()
    .transform((text, ctx) => {
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'Must be JSON.' });
        return z.NEVER;
      }
    })
    .pipe(schema);

/** The column mapping as a multipart field (JSON text), for sweep and lot uploads alike. */
export const MappingFieldSchema = jsonField(ExplicitMappingSchema);

/** "Fit again" choices: the coil's loss resistance on, off or auto; a taper law forced instead of the profile's. */
export const RefitInputSchema = z
  .object({
    withRp: z.union([z.boolean(), z.literal('auto')]).optional(),
    law: z.enum(TAPER_LAWS).optional(),
  })
  .default({});
export type RefitInput = z.infer<typeof RefitInputSchema>;

export const SweepUploadFieldsSchema = z.object({
  kind: SweepKindSchema,
  mapping: MappingFieldSchema.optional(),
  /** Full mechanical rotation of the pot when the file gives degrees; default 300°. */
  fullRotationDeg: z.coerce
    .number()
    .min(VALUE_RANGES.fullRotation.min, `Must be a full rotation ${rangeWords('fullRotation')}.`)
    .max(VALUE_RANGES.fullRotation.max, `Must be a full rotation ${rangeWords('fullRotation')}.`)
    .optional(),
});
