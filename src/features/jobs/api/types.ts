// The job routes' answers are declared once in shared/schemas/jobs.ts (the server's handlers return them).
export type { InstalledPart, Job, JobDetail, JobListRow, JobReport, JobStatus } from '@shared/schemas/jobs';
