import { z } from 'zod';

export const ROLES = ['admin', 'qa', 'tech', 'viewer'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

export const PART_KINDS = ['pot', 'capacitor', 'resistor', 'pickup', 'other'] as const;
export const PartKindSchema = z.enum(PART_KINDS);
export type PartKind = z.infer<typeof PartKindSchema>;

export const PART_STATUSES = ['incoming', 'passed', 'flagged', 'installed', 'rejected', 'retired'] as const;
export const PartStatusSchema = z.enum(PART_STATUSES);
export type PartStatus = z.infer<typeof PartStatusSchema>;

export const VERDICTS = ['pass', 'fail', 'marginal'] as const;
export const VerdictSchema = z.enum(VERDICTS);
export type Verdict = z.infer<typeof VerdictSchema>;

/** Route parameter `:id` of an integer-keyed row. */
export const IdParamsSchema = z.object({ id: z.coerce.number().int().positive() });

/** The one error envelope every API error leaves as. */
export const ApiErrorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
    /** Problems found in an uploaded file, each with its line and column. */
    issues: z.array(z.object({ line: z.number().nullable(), column: z.string().nullable(), message: z.string() })).optional(),
    /** Extra, error-specific data (e.g. the detected columns when a file needs a mapping). */
    details: z.record(z.string(), z.unknown()).optional(),
  }),
});
export type ApiErrorBody = z.infer<typeof ApiErrorSchema>;

/** A positive finite number in SI units (ohm, farad, henry, hertz). */
export const SiPositive = z.number().finite().positive();
