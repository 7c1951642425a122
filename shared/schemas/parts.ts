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

/** Why a nominal does not fit a part of this kind (ranges.ts), or null. */
export function nominalProblem(kind: PartKind, nominal: number): string | null {
  const q = NOMINAL_QUANTITY[kind];
  return inRange(q, nominal) ? null : `Must be ${VALUE_RANGES[q].what} ${rangeWords(q)}.`;
}

/** Below nominal (−): 0–100 %. */
export const ToleranceMinusSchema = z.number().finite().min(0).max(100, 'At most 100 % below nominal.');
/** Above nominal (+): 0–1000 % (Z is +80 %; some electrolytics are +100 %). */
export const TolerancePlusSchema = z.number().finite().min(0).max(1000, 'At most 1000 % above nominal.');

/** Refines an object with tolerancePct (−) and tolerancePlusPct (+): the + side needs the − side, and both 0 admits nothing. */
export function checkTolerancePair(t: { tolerancePct?: number | null; tolerancePlusPct?: number | null }, ctx: z.RefinementCtx): void {
  if (t.tolerancePlusPct != null && t.tolerancePct == null)
    ctx.addIssue({ code: 'custom', path: ['tolerancePct'], message: 'Give the side below nominal too (−20 for −20 %/+80 %).' });
  if (t.tolerancePct === 0 && (t.tolerancePlusPct ?? 0) === 0)
    ctx.addIssue({ code: 'custom', path: ['tolerancePct'], message: 'A tolerance of 0 % admits no part; give a percentage above 0.' });
}

const PartFieldsSchema = z.object({
  kind: PartKindSchema,
  label: LabelSchema,
  nominal: SiPositive.optional().nullable(),
  /** Below nominal (−), percent; also above it unless tolerancePlusPct is given. */
  tolerancePct: ToleranceMinusSchema.optional().nullable(),
  /** Above nominal (+), percent (80 for a Z part); omitted: the same as tolerancePct. */
  tolerancePlusPct: TolerancePlusSchema.optional().nullable(),
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
  checkTolerancePair(p, ctx);
  if (p.nominal === undefined || p.nominal === null) return;
  const problem = nominalProblem(p.kind, p.nominal);
  if (problem) ctx.addIssue({ code: 'custom', path: ['nominal'], message: problem });
});
export type CreatePartInput = z.infer<typeof CreatePartInputSchema>;

/** A part's changes; the nominal's range for the part's kind is checked by the route, which knows the kind. */
export const UpdatePartInputSchema = PartFieldsSchema.omit({ kind: true })
  .partial()
  .extend({
    status: PartStatusSchema.optional(),
    statusReason: optionalText(300),
  })
  .superRefine(checkTolerancePair);
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
  tolerancePlusPct: z.number().nullable(),
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
