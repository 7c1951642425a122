import { desc, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import { mayChangeOwned } from '@server/auth/ownership';
import type { AppContext } from '@server/context';
import { harnesses } from '@server/db/schema';
import type { DbLike } from '@server/db/client';
import { forbidden, notFound, unprocessable } from '@server/http/errors';
import { acceptedEncoding, sendJsonBytes } from '@server/http/encoded';
import { ApiRouter } from '@server/http/router';
import {
  buildLayoutNetlist,
  getLayout,
  LAYOUTS,
  layoutKnobs,
  PRESET_AS_LAYOUT,
  resolveLayoutConfig,
  toneKnobs,
  volumeKnobs,
  type LayoutDef,
} from '@shared/circuit/layouts';
import { DEFAULT_FREQUENCIES } from '@shared/circuit/metrics';
import { validateNetlist, type Netlist } from '@shared/circuit/netlist';
import {
  DEFAULT_HARNESS_VALUES,
  getPreset,
  HARNESS_PRESETS,
  HARNESS_VALUE_FIELDS,
  PICKUP_PRESETS,
  type HarnessValues,
} from '@shared/circuit/presets';
import { HarnessUnsolvableError } from '@shared/circuit/solver';
import { toSpiceNetlist } from '@shared/circuit/spice';
import { checkPartRefs } from './part-refs';
import { INLINE_SIMULATION_WORK, simulationAnswer } from './simulate';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  BleedFinderRequestSchema,
  HarnessDesignInputSchema,
  HarnessValuesSchema,
  NetlistRequestSchema,
  SimulateRequestSchema,
  SweepRequestSchema,
  type HarnessDesign,
  type HarnessDesignInput,
} from '@shared/schemas/harness';

const DIAL = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

/**
 * Bounds on the work one request may ask for, set by what the screens need (a preset has under 12 parts;
 * the Harness screen sweeps 11 × 11 knob settings at 151 frequencies): beyond them the answer is 422.
 */
export const HARNESS_LIMITS = { parts: 60, sweepPoints: 11 * 11 * 400 } as const;

function assertWorkSize(netlist: Netlist, settings: number, frequencies: number) {
  if (netlist.parts.length > HARNESS_LIMITS.parts) {
    throw unprocessable(`A netlist may hold at most ${HARNESS_LIMITS.parts} parts; this one has ${netlist.parts.length}.`, {
      netlist: `At most ${HARNESS_LIMITS.parts} parts.`,
    });
  }
  const points = settings * frequencies;
  if (points > HARNESS_LIMITS.sweepPoints) {
    throw unprocessable(
      `One sweep may compute at most ${HARNESS_LIMITS.sweepPoints.toLocaleString('en')} points (knob settings × frequencies, e.g. 11 × 11 settings at 400 frequencies); this one asks for ${settings} × ${frequencies} = ${points.toLocaleString('en')}.`,
      { frequencies: `At most ${HARNESS_LIMITS.sweepPoints.toLocaleString('en')} knob settings × frequencies.` },
    );
  }
}

interface SourceBody {
  layout?: string;
  selector?: number;
  options?: Record<string, string>;
  preset?: string;
  netlist?: Netlist;
  values?: Record<string, unknown>;
  knobs?: Record<string, number>;
}

/** A 422 naming every field a layout request got wrong. */
function layoutProblems(problems: { path: string; message: string }[]): never {
  throw unprocessable(problems[0]!.message, Object.fromEntries(problems.map((p) => [p.path, p.message])));
}

/** Checks a layout request (selector, options, knobs, values) and fills in the defaults. */
function layoutConfig(layout: LayoutDef, body: SourceBody) {
  const { config, problems } = resolveLayoutConfig(layout, body);
  if (problems.length > 0) layoutProblems(problems);
  return config;
}

/**
 * The netlist a request names, with its knob ids: a layout filled with its defaults and the given
 * values, a preset (the older body), or a netlist as sent.
 */
export function sourceOf(body: SourceBody): { netlist: Netlist; layout: LayoutDef | null; label: string } {
  if (body.netlist) {
    assertWorkSize(body.netlist, 1, 1);
    const problems = validateNetlist(body.netlist);
    if (problems.length > 0) throw unprocessable(`The netlist cannot be solved: ${problems[0]}`, { netlist: problems.join('; ') });
    return { netlist: body.netlist, layout: null, label: 'netlist' };
  }
  if (body.preset) {
    const parsed = HarnessValuesSchema.strict().safeParse(body.values ?? {});
    if (!parsed.success) {
      const issue = parsed.error.issues[0]!;
      const path = ['values', ...(issue.code === 'unrecognized_keys' ? [issue.keys[0]!] : issue.path.map(String))].join('.');
      throw unprocessable(issue.code === 'unrecognized_keys' ? `This preset has no value "${issue.keys[0]}".` : issue.message, {
        [path]: issue.message,
      });
    }
    const preset = getPreset(body.preset)!;
    return { netlist: preset.build({ ...preset.defaults, ...parsed.data } as HarnessValues), layout: null, label: body.preset };
  }
  const layout = getLayout(body.layout!)!;
  return { netlist: buildLayoutNetlist(layout, layoutConfig(layout, body)), layout, label: layout.id };
}

function checkKnobIds(ids: string[], layout: LayoutDef | null, field: string) {
  if (!layout) return;
  for (const id of ids)
    if (!layout.knobs.some((k) => k.id === id))
      throw unprocessable(`This layout has no knob "${id}".`, { [field]: `Choose one of ${layout.knobs.map((k) => k.id).join(', ')}.` });
}

/** Every knob of the source at its setting (missing ones at 10). */
export function knobsOf(layout: LayoutDef | null, knobs: Record<string, number> = {}): Record<string, number> {
  return layout ? layoutKnobs(layout, knobs) : { volume: 10, tone: 10, ...knobs };
}

/**
 * The stored shape of a design: the whole instrument. A body in the older shape (a preset instead
 * of a layout) becomes the one-pickup layout with the preset's options; values, options, selector
 * and knobs are checked against the layout (422 naming the field).
 */
function designRow(db: DbLike, body: HarnessDesignInput) {
  if (body.layout !== undefined && body.preset !== undefined)
    throw unprocessable('Give a layout or a preset, not both.', { preset: 'Leave out the preset when giving a layout.' });
  if (body.layout === undefined && body.preset === undefined) throw unprocessable("Give the design's layout.", { layout: 'Required.' });
  const layoutId = body.layout ?? 'one-pickup';
  const layout = getLayout(layoutId)!;
  const options = body.preset !== undefined ? { ...PRESET_AS_LAYOUT[body.preset], ...(body.options ?? {}) } : (body.options ?? {});
  const { problems } = resolveLayoutConfig(layout, {
    selector: body.selector,
    options,
    values: body.values,
    knobs: body.knobs ?? undefined,
  });
  if (problems.length > 0) layoutProblems(problems);
  checkPartRefs(db, layout, body.partRefs);
  return {
    name: body.name,
    layout: layoutId,
    selector: body.selector ?? 0,
    options,
    knobs: body.knobs ?? null,
    preset: body.preset ?? null,
    values: body.values,
    partRefs: body.partRefs ?? null,
    notes: body.notes ?? null,
  };
}

/** Runs the engine; a circuit without a unique solution is the request's fault (422), in words. */
function solved<T>(what: 'preset' | 'netlist', run: () => T): T {
  try {
    return run();
  } catch (err) {
    if (err instanceof HarnessUnsolvableError) throw unprocessable(err.message, { [what]: err.message });
    throw err;
  }
}

/** `solved` for a job run in the pool. */
async function solvedAsync<T>(what: 'preset' | 'netlist', run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    if (err instanceof HarnessUnsolvableError) throw unprocessable(err.message, { [what]: err.message });
    throw err;
  }
}

export function harnessRoutes(ctx: AppContext) {
  const { db, pool } = ctx;
  const engine = new ApiRouter('/api/harness');

  engine.get('/presets', {
    handle: () => ({
      presets: HARNESS_PRESETS.map((p) => ({
        id: p.id,
        name: p.name,
        description: p.description,
        defaults: p.defaults,
        layout: 'one-pickup',
        options: PRESET_AS_LAYOUT[p.id],
      })),
      fields: HARNESS_VALUE_FIELDS,
      pickups: PICKUP_PRESETS,
      defaults: DEFAULT_HARNESS_VALUES,
    }),
  });

  engine.get('/layouts', {
    handle: () => ({
      layouts: LAYOUTS.map((l) => ({
        id: l.id,
        name: l.name,
        description: l.description,
        pickups: l.pickups,
        selector: l.selector,
        knobs: l.knobs,
        options: l.options,
        values: l.values.map((v) => ({ key: v.key, name: v.name, quantity: v.quantity, unit: v.unit, default: v.default })),
      })),
    }),
  });

  engine.post('/simulate', {
    schemas: { body: SimulateRequestSchema },
    handle: async ({ body }) => {
      const { netlist, layout } = sourceOf(body);
      const frequencies = body.frequencies ?? Array.from(DEFAULT_FREQUENCIES);
      assertWorkSize(netlist, 1, frequencies.length);
      const input = { netlist, knobs: knobsOf(layout, body.knobs), frequencies };
      const what = body.netlist ? 'netlist' : 'preset';
      // An ordinary design answers at once; a large one is solved in the pool.
      if (netlist.parts.length * frequencies.length <= INLINE_SIMULATION_WORK) return solved(what, () => simulationAnswer(input));
      return solvedAsync(what, () => pool.run('harnessSimulate', input));
    },
  });

  engine.post('/sweep', {
    schemas: { body: SweepRequestSchema },
    handle: async ({ body, req, res }) => {
      const { netlist, layout } = sourceOf(body);
      const volumeKnob = body.volumeKnob ?? (layout ? volumeKnobs(layout)[0]! : 'volume');
      const toneKnob = body.toneKnob ?? (layout ? toneKnobs(layout)[0]! : 'tone');
      checkKnobIds([volumeKnob], layout, 'volumeKnob');
      checkKnobIds([toneKnob], layout, 'toneKnob');
      assertWorkSize(
        netlist,
        (body.volume ?? DIAL).length * (body.tone ?? DIAL).length,
        body.frequencies?.length ?? DEFAULT_FREQUENCIES.length,
      );
      // In a worker (server/pool): a grid at the limit takes seconds on a busy machine. The worker also
      // serialises and compresses the answer (server/http/encoded.ts), so this thread only sends it.
      const encoding = acceptedEncoding(req);
      const bytes = await solvedAsync(body.netlist ? 'netlist' : 'preset', () =>
        pool.run('harnessSweepJson', {
          encoding,
          netlist,
          volume: body.volume ?? DIAL,
          tone: body.tone ?? DIAL,
          frequencies: body.frequencies ?? Array.from(DEFAULT_FREQUENCIES),
          volumeKnob,
          toneKnob,
          knobs: knobsOf(layout, body.knobs),
        }),
      );
      await sendJsonBytes(res, bytes, encoding);
    },
  });

  engine.post('/netlist', {
    schemas: { body: NetlistRequestSchema },
    handle: ({ body, res }) => {
      const { netlist, layout, label } = sourceOf(body);
      const knobs = knobsOf(layout, body.knobs);
      const text = toSpiceNetlist(
        { ...netlist, title: netlist.title ? `Lugbook harness ${netlist.title}` : `Lugbook harness ${label}` },
        knobs,
      );
      const suffix = Object.values(knobs)
        .map((v) => String(v))
        .join('-');
      res
        .attachment(`harness-${label}-${body.layout ? `p${body.selector ?? 0}-` : ''}${suffix}.cir`)
        .type('text/plain')
        .send(text);
      return undefined;
    },
  });

  engine.post('/bleed-finder', {
    schemas: { body: BleedFinderRequestSchema },
    handle: async ({ body }) => {
      const layout = getLayout(body.layout)!;
      const config = layoutConfig(layout, body);
      // Hundreds of candidate networks, each swept: in a worker (server/pool).
      const { candidates, evaluated } = await pool.run('bleedFinder', {
        layoutId: layout.id,
        config,
        knobs: layoutKnobs(layout, body.knobs),
        series: body.series ?? 'E12',
        weight: body.weight ?? 0.7,
      });
      return { candidates, evaluated, series: body.series ?? 'E12', weight: body.weight ?? 0.7 };
    },
  });

  const designs = new ApiRouter('/api/harnesses');
  const mustFind = (id: number): HarnessDesign => {
    const row = db.select().from(harnesses).where(eq(harnesses.id, id)).get();
    if (!row) throw notFound('That harness design');
    return row;
  };

  designs.get('/', {
    handle: (): { harnesses: HarnessDesign[] } => ({ harnesses: db.select().from(harnesses).orderBy(desc(harnesses.id)).all() }),
  });
  designs.get('/:id', { schemas: { params: IdParamsSchema }, handle: ({ params }) => mustFind(params.id) });

  designs.post('/', {
    status: 201,
    schemas: { body: HarnessDesignInputSchema },
    handle: ({ body, user }) => {
      const design = designRow(db, body);
      return db.transaction((tx) => {
        const row = tx
          .insert(harnesses)
          .values({ ...design, ownerId: user.id })
          .returning()
          .get();
        audit(tx, {
          userId: user.id,
          action: 'harness.create',
          entity: 'harness',
          entityId: row.id,
          detail: { name: body.name, layout: design.layout, preset: design.preset },
        });
        return row;
      });
    },
  });

  designs.put('/:id', {
    schemas: { params: IdParamsSchema, body: HarnessDesignInputSchema },
    handle: ({ params, body, user }): HarnessDesign => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden("Only the design's owner (or qa/admin) may change it.");
      const design = designRow(db, body);
      return db.transaction((tx) => {
        const row = tx
          .update(harnesses)
          .set({ ...design, updatedAt: Date.now() })
          .where(eq(harnesses.id, params.id))
          .returning()
          .get();
        audit(tx, {
          userId: user.id,
          action: 'harness.update',
          entity: 'harness',
          entityId: row.id,
          detail: { before: { name: before.name, layout: before.layout, options: before.options, values: before.values }, after: design },
        });
        return row;
      });
    },
  });

  designs.delete('/:id', {
    schemas: { params: IdParamsSchema },
    handle: ({ params, user }) => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden("Only the design's owner (or qa/admin) may delete it.");
      db.transaction((tx) => {
        tx.delete(harnesses).where(eq(harnesses.id, params.id)).run();
        audit(tx, { userId: user.id, action: 'harness.delete', entity: 'harness', entityId: params.id, detail: { name: before.name } });
      });
      return { ok: true };
    },
  });

  return [engine, designs];
}
