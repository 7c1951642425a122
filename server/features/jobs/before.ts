// PUT /api/jobs/:id/before: the wiring the instrument had before the work (a saved design, or a
// design body kept with the job) and how the job's recording was made. The report's before/after
// clips (clips.ts) are rendered through it.
import { eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { harnesses, jobs } from '@server/db/schema';
import { notFound, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { getLayout, PRESET_AS_LAYOUT, resolveLayoutConfig } from '@shared/circuit/layouts';
import { IdParamsSchema } from '@shared/schemas/common';
import { JobBeforeInputSchema, type BeforeDesign, type JobBeforeInput } from '@shared/schemas/job-clips';
import { jobDetail } from './repository';

/** A design body as stored: always a layout (a preset becomes the one-pickup layout with its options), checked against the layout (422 naming the field). */
function beforeDesignOf(body: NonNullable<JobBeforeInput['design']>): BeforeDesign {
  if (body.layout !== undefined && body.preset !== undefined)
    throw unprocessable('Give a layout or a preset, not both.', { 'design.preset': 'Leave out the preset when giving a layout.' });
  if (body.layout === undefined && body.preset === undefined)
    throw unprocessable("Give the before wiring's layout (or preset).", { 'design.layout': 'Required.' });
  const layoutId = body.layout ?? 'one-pickup';
  const layout = getLayout(layoutId)!;
  const options = body.preset !== undefined ? { ...PRESET_AS_LAYOUT[body.preset], ...(body.options ?? {}) } : (body.options ?? {});
  const { problems } = resolveLayoutConfig(layout, {
    selector: body.selector,
    options,
    values: body.values,
    knobs: body.knobs ?? undefined,
  });
  if (problems.length > 0)
    throw unprocessable(problems[0]!.message, Object.fromEntries(problems.map((p) => [`design.${p.path}`, p.message])));
  return {
    name: body.name ?? null,
    layout: layoutId,
    selector: body.selector ?? 0,
    options,
    knobs: body.knobs ?? null,
    preset: body.preset ?? null,
    values: body.values,
  };
}

export function jobBeforeRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/jobs');
  api.put('/:id/before', {
    schemas: { params: IdParamsSchema, body: JobBeforeInputSchema },
    handle: ({ params, body, user }) => {
      const job = jobDetail(db, params.id);
      if (!job) throw notFound('That job');
      if (body.harnessId != null && body.design != null)
        throw unprocessable('Give the before wiring as a saved design or as a design, not both.', { design: 'Leave out with harnessId.' });
      if (body.harnessId != null && !db.select({ id: harnesses.id }).from(harnesses).where(eq(harnesses.id, body.harnessId)).get())
        throw unprocessable('That harness design does not exist.', { harnessId: 'Unknown design.' });
      const design = body.design != null ? beforeDesignOf(body.design) : null;
      const set: Partial<typeof jobs.$inferInsert> = { updatedAt: Date.now() };
      if (body.harnessId !== undefined || body.design !== undefined) {
        set.beforeHarnessId = body.harnessId ?? null;
        set.beforeDesign = design;
      }
      if (body.recordingChain !== undefined) set.recordingChain = body.recordingChain;
      db.transaction((tx) => {
        tx.update(jobs).set(set).where(eq(jobs.id, params.id)).run();
        audit(tx, {
          userId: user.id,
          action: 'job.before-wiring',
          entity: 'job',
          entityId: params.id,
          detail: {
            before: { beforeHarnessId: job.beforeHarnessId, beforeDesign: job.beforeDesign, recordingChain: job.recordingChain },
            after: { beforeHarnessId: set.beforeHarnessId, beforeDesign: set.beforeDesign, recordingChain: set.recordingChain },
          },
        });
      });
      return jobDetail(db, params.id);
    },
  });
  return api;
}
