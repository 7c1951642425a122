import { and, eq, sql } from 'drizzle-orm';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { harnesses, jobParts, jobs, users } from '@server/db/schema';
import { findPart, setPartStatus } from '@server/features/parts/repository';
import { installCheck } from '@server/features/parts/evidence';
import { conflict, HttpError, notFound, unprocessable } from '@server/http/errors';
import { ApiRouter, takeWriteTurn } from '@server/http/router';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  AssignSlotInputSchema,
  CreateJobInputSchema,
  InstallPartInputSchema,
  JobReportInputSchema,
  UpdateJobInputSchema,
  type JobDetail,
  type JobListRow,
  type JobReport,
} from '@shared/schemas/jobs';
import { slotRefusal } from '@shared/circuit/slots';
import { jobDetail, jobsOfPart, listJobs } from './repository';
import { composeReport, type ReportMessage } from './report';
import { designOf } from './slots';

export function jobRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/jobs');
  const mustFind = (id: number): JobDetail => {
    const job = jobDetail(db, id);
    if (!job) throw notFound('That job');
    return job;
  };
  const checkHarness = (id: number | null | undefined) => {
    if (id != null && !db.select().from(harnesses).where(eq(harnesses.id, id)).get())
      throw unprocessable('That harness design does not exist.', { harnessId: 'Unknown design.' });
  };

  api.get('/', { handle: (): { jobs: JobListRow[] } => ({ jobs: listJobs(db) }) });
  api.get('/:id', { schemas: { params: IdParamsSchema }, handle: ({ params }) => mustFind(params.id) });

  api.post('/', {
    status: 201,
    schemas: { body: CreateJobInputSchema },
    handle: ({ body, user }) => {
      checkHarness(body.harnessId);
      const n =
        (db
          .select({ n: sql<number>`count(*)` })
          .from(jobs)
          .get()?.n ?? 0) + 1;
      const code = `JOB-${String(n).padStart(4, '0')}`;
      return db.transaction((tx) => {
        const job = tx
          .insert(jobs)
          .values({ ...body, code, createdBy: user.id })
          .returning()
          .get();
        audit(tx, { userId: user.id, action: 'job.create', entity: 'job', entityId: job.id, detail: body });
        return job;
      });
    },
  });

  api.patch('/:id', {
    schemas: { params: IdParamsSchema, body: UpdateJobInputSchema },
    handle: ({ params, body, user }) => {
      const before = mustFind(params.id);
      checkHarness(body.harnessId);
      // A new design keeps only the slot assignments it has slots for (the parts stay installed).
      const cleared =
        body.harnessId !== undefined && body.harnessId !== before.harnessId
          ? before.parts.filter((p) => p.slot && !(designOf(db, body.harnessId ?? null)?.slots ?? []).some((s) => s.key === p.slot))
          : [];
      db.transaction((tx) => {
        tx.update(jobs)
          .set({ ...body, updatedAt: Date.now() })
          .where(eq(jobs.id, params.id))
          .run();
        for (const p of cleared)
          tx.update(jobParts)
            .set({ slot: null })
            .where(and(eq(jobParts.jobId, params.id), eq(jobParts.partId, p.partId)))
            .run();
        audit(tx, {
          userId: user.id,
          action: 'job.update',
          entity: 'job',
          entityId: params.id,
          detail: {
            before: { status: before.status, harnessId: before.harnessId },
            after: body,
            ...(cleared.length ? { slotsCleared: cleared.map((p) => ({ partId: p.partId, slot: p.slot })) } : {}),
          },
        });
      });
      return mustFind(params.id);
    },
  });

  api.post('/:id/parts', {
    status: 201,
    schemas: { params: IdParamsSchema, body: InstallPartInputSchema },
    handle: ({ params, body, user }) => {
      const job = mustFind(params.id);
      const part = findPart(db, body.partId);
      if (!part) throw unprocessable('That part does not exist.', { partId: 'Unknown part.' });
      if (part.status === 'installed') {
        const where = jobsOfPart(db, part.id)
          .map((j) => j.code)
          .join(', ');
        throw conflict(`${part.label} is installed already (${where}).`);
      }
      if (part.status === 'rejected' || part.status === 'retired')
        throw conflict(`${part.label} is ${part.status}; it cannot be installed.`);
      const check = installCheck(db, part);
      if (check.needsOverride && !body.overrideReason) {
        throw new HttpError(
          409,
          'needs_override',
          `${part.label} is ${check.status}: ${check.reasons.join('; ')}. Give an override reason to install it anyway.`,
          undefined,
          {
            details: { status: check.status, reasons: check.reasons },
          },
        );
      }
      const overrideReason = check.needsOverride ? body.overrideReason! : null;
      db.transaction((tx) => {
        tx.insert(jobParts).values({ jobId: job.id, partId: part.id, position: body.position, overrideReason, installedBy: user.id }).run();
        setPartStatus(
          tx,
          part,
          'installed',
          `installed in ${job.code} (${body.position})${overrideReason ? ` over ${check.status} status: ${overrideReason}` : ''}`,
          user.id,
        );
        audit(tx, {
          userId: user.id,
          action: overrideReason ? 'job.install-override' : 'job.install',
          entity: 'job',
          entityId: job.id,
          detail: {
            partId: part.id,
            label: part.label,
            position: body.position,
            previousStatus: part.status,
            ...(overrideReason ? { overrideReason, overridden: check.reasons } : {}),
          },
        });
      });
      return mustFind(job.id);
    },
  });

  api.delete('/:id/parts/:partId', {
    schemas: { params: IdParamsSchema.extend({ partId: z.coerce.number().int().positive() }) },
    handle: ({ params, user }) => {
      const job = mustFind(params.id);
      const part = findPart(db, params.partId);
      if (!part || !job.parts.some((p) => p.partId === part.id)) throw notFound('That part in this job');
      db.transaction((tx) => {
        tx.delete(jobParts)
          .where(and(eq(jobParts.jobId, job.id), eq(jobParts.partId, part.id)))
          .run();
        // A removed part goes back to the bench as incoming: it must be checked again before reuse.
        setPartStatus(tx, part, 'incoming', `removed from ${job.code}`, user.id);
        audit(tx, {
          userId: user.id,
          action: 'job.remove-part',
          entity: 'job',
          entityId: job.id,
          detail: { partId: part.id, label: part.label },
        });
      });
      return mustFind(job.id);
    },
  });

  api.put('/:id/parts/:partId/slot', {
    schemas: { params: IdParamsSchema.extend({ partId: z.coerce.number().int().positive() }), body: AssignSlotInputSchema },
    handle: ({ params, body, user }) => {
      const job = mustFind(params.id);
      const line = job.parts.find((p) => p.partId === params.partId);
      if (!line) throw notFound('That part in this job');
      if (body.slot !== null) {
        const design = designOf(db, job.harnessId);
        if (!design)
          throw unprocessable('This job has no wiring design: choose one before assigning parts to its slots.', {
            slot: 'The job has no wiring design.',
          });
        const slot = design.slots.find((s) => s.key === body.slot);
        if (!slot)
          throw unprocessable(`The design ${design.design.name} has no slot "${body.slot}".`, {
            slot: `No slot "${body.slot}"; choose one of ${design.slots.map((s) => s.key).join(', ')}.`,
          });
        const refusal = slotRefusal(slot, line.kind);
        if (refusal) throw unprocessable(`${line.label}: ${refusal}`, { slot: refusal });
        const holder = job.parts.find((p) => p.slot === slot.key && p.partId !== line.partId);
        if (holder)
          throw unprocessable(`${slot.name} (${slot.key}) holds ${holder.label} already: clear it first.`, {
            slot: `${slot.name} (${slot.key}) holds ${holder.label} already.`,
          });
      }
      db.transaction((tx) => {
        tx.update(jobParts)
          .set({ slot: body.slot })
          .where(and(eq(jobParts.jobId, job.id), eq(jobParts.partId, line.partId)))
          .run();
        audit(tx, {
          userId: user.id,
          action: body.slot === null ? 'job.clear-slot' : 'job.assign-slot',
          entity: 'job',
          entityId: job.id,
          detail: { partId: line.partId, label: line.label, slot: body.slot, previous: line.slot },
        });
      });
      return mustFind(job.id);
    },
  });

  /** The message as the e-mail would carry it; attachments by name, type and size, the curves' CSV in full. */
  const previewOf = (m: ReportMessage): JobReport => ({
    to: m.to,
    subject: m.subject,
    text: m.text,
    attachments: m.attachments.map((a) => ({
      filename: a.filename,
      contentType: a.contentType,
      size: typeof a.content === 'string' ? Buffer.byteLength(a.content) : a.content.length,
    })),
    csv: (m.attachments.find((a) => a.contentType === 'text/csv')?.content as string | undefined) ?? null,
  });

  api.get('/:id/report', {
    schemas: { params: IdParamsSchema, query: JobReportInputSchema },
    handle: async ({ params, query }) =>
      previewOf(await composeReport(db, mustFind(params.id), { ...query, uploadsDir: ctx.config.uploadsDir, pool: ctx.pool })),
  });

  api.post('/:id/report', {
    schemas: { params: IdParamsSchema, body: JobReportInputSchema },
    handle: async ({ params, body, req, user }) => {
      const job = mustFind(params.id);
      const report = await composeReport(db, job, { ...body, uploadsDir: ctx.config.uploadsDir, pool: ctx.pool });
      const to = report.to;
      if (!to) throw unprocessable('The job has no customer e-mail; give one.', { to: 'Required: the job has no customer e-mail.' });
      // Only to the job's customer or a member: the server is not a relay for arbitrary addresses.
      const member = db.select({ id: users.id }).from(users).where(eq(users.email, to.toLowerCase())).get();
      if (to.toLowerCase() !== job.customerEmail?.toLowerCase() && !member) {
        throw unprocessable("A report goes to the job's customer address or to a member's address.", {
          to: "Not the customer's address nor a member's.",
        });
      }
      await ctx.mailer.send({
        to,
        topic: 'customer-report',
        subject: report.subject,
        text: report.text,
        attachments: report.attachments.length ? report.attachments : undefined,
      });
      await takeWriteTurn(req);
      audit(db, { userId: user.id, action: 'job.report-sent', entity: 'job', entityId: job.id, detail: { to } });
      return { ok: true, to };
    },
  });

  return api;
}
