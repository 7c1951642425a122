import { z } from 'zod';
import { TAPER_LAWS } from '@shared/taper/law';
import { PartKindSchema, PartStatusSchema, SiPositive, type PartKind, type PartStatus } from './common';
import { inRange, rangeWords, VALUE_RANGES } from './ranges';

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

const PartFieldsSchema = z.object({
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
/** A new part; its nominal must lie in the physical range of its kind's quantity (ranges.ts). */
export const CreatePartInputSchema = PartFieldsSchema.superRefine((p, ctx) => {
  if (p.nominal === undefined || p.nominal === null) return;
  const q = NOMINAL_QUANTITY[p.kind];
  if (!inRange(q, p.nominal)) {
    ctx.addIssue({ code: 'custom', path: ['nominal'], message: `Must be ${VALUE_RANGES[q].what} ${rangeWords(q)}.` });
  }
});
export type CreatePartInput = z.infer<typeof CreatePartInputSchema>;

export const UpdatePartInputSchema = PartFieldsSchema.omit({ kind: true })
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

/** One change of a part's status (GET /api/parts/:id `statusHistory`, oldest first). */
export type PartStatusEvent = {
  id: number;
  partId: number;
  fromStatus: PartStatus | null;
  toStatus: PartStatus;
  reason: string | null;
  userId: string | null;
  /** Who made the change (null when the member has left). */
  userName: string | null;
  at: number;
};

/** A job the part went into (the other direction of the job's parts list). */
export type PartInstallation = { jobId: number; code: string; customer: string; instrument: string; position: string; installedAt: number };

/** GET /api/parts/:id: the part with its lot's code, its status history and the jobs it went into. */
export type PartDetail = Part & { lotCode: string | null; statusHistory: PartStatusEvent[]; installedIn: PartInstallation[] };
