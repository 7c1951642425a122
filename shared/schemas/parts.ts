import { z } from 'zod';
import { TAPER_LAWS } from '@shared/taper/law';
import { PartKindSchema, PartStatusSchema, SiPositive, type PartKind } from './common';

export const TaperClassSchema = z.enum(TAPER_LAWS);

/** The quantity a part's nominal value is of (pickups: their DC resistance). */
export const NOMINAL_QUANTITY: Record<PartKind, 'resistance' | 'capacitance'> = {
  pot: 'resistance',
  capacitor: 'capacitance',
  resistor: 'resistance',
  pickup: 'resistance',
  other: 'resistance',
};

const LabelSchema = z
  .string()
  .trim()
  .min(1, 'Give the part a label.')
  .max(60, 'Keep the label to 60 characters.')
  .regex(/^[A-Za-z0-9][A-Za-z0-9._\-/ ]*$/, 'Use letters, digits, spaces and . _ - / only.');

const optionalText = (max: number) => z.string().trim().max(max).optional().nullable();

export const CreatePartInputSchema = z.object({
  kind: PartKindSchema,
  label: LabelSchema,
  nominal: SiPositive.optional().nullable(),
  tolerancePct: z.number().finite().positive().max(100).optional().nullable(),
  marking: optionalText(40),
  taperClass: TaperClassSchema.optional().nullable(),
  taperM: z.number().gt(0).lt(1).optional().nullable(),
  supplier: optionalText(80),
  profileId: z.number().int().positive().optional().nullable(),
  tags: optionalText(200),
  notes: optionalText(2000),
});
export type CreatePartInput = z.infer<typeof CreatePartInputSchema>;

export const UpdatePartInputSchema = CreatePartInputSchema.omit({ kind: true })
  .partial()
  .extend({
    status: PartStatusSchema.optional(),
    statusReason: optionalText(300),
  });
export type UpdatePartInput = z.infer<typeof UpdatePartInputSchema>;

export const PartListQuerySchema = z.object({
  kind: PartKindSchema.optional(),
  status: PartStatusSchema.optional(),
  q: z.string().trim().max(100).optional(),
  lotId: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(1000).default(500),
});
export type PartListQuery = z.infer<typeof PartListQuerySchema>;

export const PartSchema = z.object({
  id: z.number(),
  kind: PartKindSchema,
  label: z.string(),
  nominal: z.number().nullable(),
  tolerancePct: z.number().nullable(),
  marking: z.string().nullable(),
  taperClass: TaperClassSchema.nullable(),
  taperM: z.number().nullable(),
  supplier: z.string().nullable(),
  lotId: z.number().nullable(),
  lotItem: z.string().nullable(),
  profileId: z.number().nullable(),
  status: PartStatusSchema,
  statusReason: z.string().nullable(),
  tags: z.string().nullable(),
  notes: z.string().nullable(),
  createdAt: z.number(),
  updatedAt: z.number().nullable(),
});
export type Part = z.infer<typeof PartSchema>;
