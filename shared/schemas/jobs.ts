import { z } from 'zod';
import type { PartKind, PartStatus } from './common';

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

export const JobReportInputSchema = z.object({
  /** Defaults to the job's customer e-mail. */
  to: z.string().trim().toLowerCase().email('Enter an e-mail address.').optional(),
  message: z.string().trim().max(4000).optional(),
});

// The answers of the job routes (server/features/jobs/router.ts), read by the client's api.get<T>.

export type JobStatus = (typeof JOB_STATUSES)[number];

/** A job as stored (POST /api/jobs answers it). */
export interface Job {
  id: number;
  code: string;
  customer: string;
  customerEmail: string | null;
  instrument: string;
  status: JobStatus;
  harnessId: number | null;
  notes: string | null;
  createdBy: string | null;
  createdAt: number;
  updatedAt: number | null;
}

/** GET /api/jobs: each job with the number of parts installed. */
export type JobListRow = Job & { partCount: number };

/** A part installed in a job. */
export interface InstalledPart {
  partId: number;
  label: string;
  kind: PartKind;
  nominal: number | null;
  status: PartStatus;
  position: string;
  /** Why a flagged or never-judged part went in anyway. */
  overrideReason: string | null;
  installedAt: number;
}

/** GET /api/jobs/:id (and the answer of every change to a job). */
export type JobDetail = Job & { parts: InstalledPart[]; harnessName: string | null };

/** GET /api/jobs/:id/report: the customer report's text and, with a harness design, its predicted curves as CSV. */
export interface JobReport {
  text: string;
  csv: string | null;
}
