import { desc, eq, sql } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { harnesses, jobParts, jobs, parts } from '@server/db/schema';

export type JobRow = typeof jobs.$inferSelect;
export interface JobDetail extends JobRow {
  parts: {
    partId: number;
    label: string;
    kind: (typeof parts.$inferSelect)['kind'];
    nominal: number | null;
    status: string;
    position: string;
    overrideReason: string | null;
    installedAt: number;
  }[];
  harnessName: string | null;
  /** The saved design of the wiring before the work, when there is one (null when it was deleted). */
  beforeHarnessName: string | null;
}

export function listJobs(db: DbLike) {
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
  const beforeHarnessName = job.beforeHarnessId
    ? (db.select({ name: harnesses.name }).from(harnesses).where(eq(harnesses.id, job.beforeHarnessId)).get()?.name ?? null)
    : null;
  return { ...job, parts: installed, harnessName, beforeHarnessName };
}

/** The jobs a part went into (the other direction of the trace). */
export function jobsOfPart(db: DbLike, partId: number) {
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
