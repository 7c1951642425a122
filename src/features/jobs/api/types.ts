// Shapes of the job routes (server/features/jobs/router.ts and repository.ts).
import type { DesignSlot } from '@shared/circuit/slots';
import type { PartKind, PartStatus } from '@shared/schemas/common';
import type { JOB_STATUSES } from '@shared/schemas/jobs';

export type JobStatus = (typeof JOB_STATUSES)[number];

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

export type JobListRow = Job & { partCount: number };

export interface InstalledPart {
  partId: number;
  label: string;
  kind: PartKind;
  nominal: number | null;
  status: PartStatus;
  position: string;
  /** Why a flagged or never-judged part went in anyway. */
  overrideReason: string | null;
  /** The slot of the job's design it fills ('volumeR', 'neck.toneC', 'north.pickup'), or null. */
  slot: string | null;
  installedAt: number;
}

/** A slot of the job's design (shared/circuit/slots.ts) and the installed part filling it. */
export type JobSlot = DesignSlot & { partId: number | null };

export type JobDetail = Job & { parts: InstalledPart[]; harnessName: string | null; slots: JobSlot[] };

/** The customer e-mail exactly as it would be sent now (GET /api/jobs/:id/report). */
export interface JobReport {
  to: string | null;
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
  /** The predicted curves' CSV as attached, or null. */
  csv: string | null;
}
