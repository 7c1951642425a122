import { z } from 'zod';

export const JOB_STATUSES = ['open', 'done', 'delivered'] as const;

export const CreateJobInputSchema = z.object({
  customer: z.string().trim().min(1, 'Name the customer.').max(120),
  customerEmail: z
    .string()
    .trim()
    .toLowerCase()
    .email('Enter an e-mail address.')
    .optional()
    .nullable()
    .or(z.literal('').transform(() => null)),
  instrument: z.string().trim().min(1, 'Describe the instrument.').max(200),
  harnessId: z.number().int().positive().optional().nullable(),
  notes: z.string().trim().max(4000).optional().nullable(),
});
export type CreateJobInput = z.infer<typeof CreateJobInputSchema>;

export const UpdateJobInputSchema = CreateJobInputSchema.partial().extend({ status: z.enum(JOB_STATUSES).optional() });
export type UpdateJobInput = z.infer<typeof UpdateJobInputSchema>;

export const InstallPartInputSchema = z.object({
  partId: z.number().int().positive(),
  /** Where it went, in the shop's words: "volume, neck", "tone cap". */
  position: z.string().trim().min(1, 'Say where the part went.').max(80),
  /** Required to install a flagged or never-judged (incoming) part: why it goes in anyway. */
  overrideReason: z
    .string()
    .trim()
    .min(3, 'Give a reason of at least 3 characters.')
    .max(300, 'Keep the reason under 300 characters.')
    .optional(),
});
export type InstallPartInput = z.infer<typeof InstallPartInputSchema>;

/** Puts an installed part in a slot of the job's design (shared/circuit/slots.ts), or takes it out (null). */
export const AssignSlotInputSchema = z.object({
  slot: z.string().trim().min(1, 'Choose a slot.').max(80).nullable(),
});
export type AssignSlotInput = z.infer<typeof AssignSlotInputSchema>;

export const JobReportInputSchema = z.object({
  /** Defaults to the job's customer e-mail. */
  to: z.string().trim().toLowerCase().email('Enter an e-mail address.').optional(),
  message: z.string().trim().max(4000).optional(),
});
