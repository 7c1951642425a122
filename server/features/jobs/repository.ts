import { desc, eq, sql } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { harnesses, jobParts, jobs, parts } from '@server/db/schema';

import type { JobDetail, JobListRow } from '@shared/schemas/jobs';
import type { PartInstallation } from '@shared/schemas/parts';

export type JobRow = typeof jobs.$inferSelect;
/** GET /api/jobs/:id (declared in shared/schemas/jobs.ts). */
export type { JobDetail } from '@shared/schemas/jobs';

export function listJobs(db: DbLike): JobListRow[] {
  return db
    .select({ job: jobs, partCount: sql<number>`(select count(*) from job_parts jp where jp.job_id = "jobs"."id")` })
    .from(jobs)
    .orderBy(desc(jobs.id))
    .all()
    .map(({ job, partCount }) => ({ ...job, partCount }));
}

export function jobDetail(db: DbLike, id: number): JobDetail | undefined {
  const job = db.select().from(jobs).where(eq(jobs.id, id)).get();
  if (!job) return undefined;
  const installed = db
    .select({
      partId: parts.id,
      label: parts.label,
      kind: parts.kind,
      nominal: parts.nominal,
      status: parts.status,
      position: jobParts.position,
      overrideReason: jobParts.overrideReason,
      installedAt: jobParts.installedAt,
    })
    .from(jobParts)
    .innerJoin(parts, eq(jobParts.partId, parts.id))
    .where(eq(jobParts.jobId, id))
    .orderBy(jobParts.installedAt)
    .all();
  const harnessName = job.harnessId
    ? (db.select({ name: harnesses.name }).from(harnesses).where(eq(harnesses.id, job.harnessId)).get()?.name ?? null)
    : null;
  return { ...job, parts: installed, harnessName };
}

/** The jobs a part went into (the other direction of the trace). */
export function jobsOfPart(db: DbLike, partId: number): PartInstallation[] {
  return db
    .select({
      jobId: jobs.id,
      code: jobs.code,
      customer: jobs.customer,
      instrument: jobs.instrument,
      position: jobParts.position,
      installedAt: jobParts.installedAt,
    })
    .from(jobParts)
    .innerJoin(jobs, eq(jobParts.jobId, jobs.id))
    .where(eq(jobParts.partId, partId))
    .all();
}
