import { z } from 'zod';

export const SWEEP_KINDS = ['taper', 'impedance'] as const;
export const SweepKindSchema = z.enum(SWEEP_KINDS);
export type SweepKind = z.infer<typeof SweepKindSchema>;

/** A column chosen by the user when the file's headers were not recognised: index or header text, and its unit. */
export const ColumnChoiceSchema = z.object({ column: z.union([z.number().int().min(0), z.string().min(1)]), unit: z.string().max(12).optional() });
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

export const SweepUploadFieldsSchema = z.object({
  kind: SweepKindSchema,
  mapping: MappingFieldSchema.optional(),
  /** Full mechanical rotation of the pot when the file gives degrees; default 300°. */
  fullRotationDeg: z.coerce.number().min(1, 'At least 1°.').max(3600).optional(),
});
