// Shapes of the job routes (server/features/jobs/router.ts and repository.ts).
import type { PartKind, PartStatus } from '@shared/schemas/common';
import type { JOB_STATUSES } from '@shared/schemas/jobs';
import type { BeforeDesign, RecordingChain } from '@shared/schemas/job-clips';

export type JobStatus = (typeof JOB_STATUSES)[number];

export interface Job {
  id: number;
  code: string;
  customer: string;
  customerEmail: string | null;
  instrument: string;
  status: JobStatus;
  harnessId: number | null;
  /** The wiring before the work: a saved design, or a design body kept with the job (the report's clips). */
  beforeHarnessId: number | null;
  beforeDesign: BeforeDesign | null;
  /** How the job's recording was made; null: 1 MΩ and 3 m. */
  recordingChain: RecordingChain | null;
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
  installedAt: number;
}

export type JobDetail = Job & { parts: InstalledPart[]; harnessName: string | null; beforeHarnessName: string | null };

export interface JobReport {
  text: string;
  csv: string | null;
}
