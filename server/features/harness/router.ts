import { desc, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import { mayChangeOwned } from '@server/auth/ownership';
import type { AppContext } from '@server/context';
import { harnesses } from '@server/db/schema';
import { forbidden, notFound, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { DEFAULT_FREQUENCIES, simulate, sweepKnobs } from '@shared/circuit/metrics';
import { validateNetlist, type Netlist } from '@shared/circuit/netlist';
import { DEFAULT_HARNESS_VALUES, getPreset, HARNESS_PRESETS, HARNESS_VALUE_FIELDS, PICKUP_PRESETS, type HarnessValues } from '@shared/circuit/presets';
import { toSpiceNetlist } from '@shared/circuit/spice';
import { solveOrRefuse } from './solvable';
import { IdParamsSchema } from '@shared/schemas/common';
import { HarnessDesignInputSchema, NetlistRequestSchema, SimulateRequestSchema, SweepRequestSchema, type HarnessValuesInput } from '@shared/schemas/harness';

const DIAL = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

/**
 * Bounds on the work one request may ask for, set by what the screens need (a preset has under 12 parts;
 * the Harness screen sweeps 11 × 11 knob settings at 151 frequencies): beyond them the answer is 422.
 */
export const HARNESS_LIMITS = { parts: 60, sweepPoints: 11 * 11 * 400 } as const;

function assertWorkSize(netlist: Netlist, settings: number, frequencies: number) {
  if (netlist.parts.length > HARNESS_LIMITS.parts) {
    throw unprocessable(`A netlist may hold at most ${HARNESS_LIMITS.parts} parts; this one has ${netlist.parts.length}.`, { netlist: `At most ${HARNESS_LIMITS.parts} parts.` });
  }
  const points = settings * frequencies;
  if (points > HARNESS_LIMITS.sweepPoints) {
    throw unprocessable(
      `One sweep may compute at most ${HARNESS_LIMITS.sweepPoints.toLocaleString('en')} points (knob settings × frequencies, e.g. 11 × 11 settings at 400 frequencies); this one asks for ${settings} × ${frequencies} = ${points.toLocaleString('en')}.`,
      { frequencies: `At most ${HARNESS_LIMITS.sweepPoints.toLocaleString('en')} knob settings × frequencies.` },
    );
  }
}

/** The netlist a request names: a preset filled with its defaults and the given values, or a netlist as sent. */
function netlistOf(body: { preset?: string; netlist?: Netlist; values?: HarnessValuesInput }): Netlist {
  if (body.netlist) {
    assertWorkSize(body.netlist, 1, 1);
    const problems = validateNetlist(body.netlist);
    if (problems.length > 0) throw unprocessable(`The netlist cannot be solved: ${problems[0]}`, { netlist: problems.join('; ') });
    return body.netlist;
  }
  const preset = getPreset(body.preset!)!;
  return preset.build({ ...preset.defaults, ...(body.values ?? {}) } as HarnessValues);
}

export function harnessRoutes(ctx: AppContext) {
  const { db } = ctx;
  const engine = new ApiRouter('/api/harness');

  engine.get('/presets', {
    handle: () => ({
      presets: HARNESS_PRESETS.map((p) => ({ id: p.id, name: p.name, description: p.description, defaults: p.defaults })),
      fields: HARNESS_VALUE_FIELDS,
      pickups: PICKUP_PRESETS,
      defaults: DEFAULT_HARNESS_VALUES,
    }),
  });

  engine.post('/simulate', {
    schemas: { body: SimulateRequestSchema },
    handle: ({ body }) => {
      const netlist = netlistOf(body);
      assertWorkSize(netlist, 1, body.frequencies?.length ?? DEFAULT_FREQUENCIES.length);
      const r = solveOrRefuse(() => simulate(netlist, body.knobs, body.frequencies ?? DEFAULT_FREQUENCIES), (x) => [x.magnitudeDb, x.phaseDeg]);
      return { frequencies: Array.from(r.frequencies), magnitudeDb: Array.from(r.magnitudeDb), phaseDeg: Array.from(r.phaseDeg), metrics: r.metrics };
    },
  });

  engine.post('/sweep', {
    schemas: { body: SweepRequestSchema },
    handle: ({ body }) => {
      const netlist = netlistOf(body);
      assertWorkSize(netlist, (body.volume ?? DIAL).length * (body.tone ?? DIAL).length, body.frequencies?.length ?? DEFAULT_FREQUENCIES.length);
      const grid = solveOrRefuse(() => sweepKnobs(netlist, { volume: body.volume ?? DIAL, tone: body.tone ?? DIAL }, body.frequencies ?? DEFAULT_FREQUENCIES), (g) => [g.magnitudeDb, g.level1kDb]);
      return {
        frequencies: Array.from(grid.frequencies),
        volume: grid.volume,
        tone: grid.tone,
        magnitudeDb: Array.from(grid.magnitudeDb),
        level1kDb: Array.from(grid.level1kDb),
        volumeTaperDb: Array.from(grid.volumeTaperDb),
        trebleRetentionDb: Array.from(grid.trebleRetentionDb),
        interactionIndexDb: grid.interactionIndexDb,
      };
    },
  });

  engine.post('/netlist', {
    schemas: { body: NetlistRequestSchema },
    handle: ({ body, res }) => {
      const netlist = netlistOf(body);
      const text = toSpiceNetlist({ ...netlist, title: netlist.title ?? `Lugbook harness ${body.preset ?? 'netlist'}` }, body.knobs);
      res.attachment(`harness-${body.preset ?? 'netlist'}-v${body.knobs.volume}-t${body.knobs.tone}.cir`).type('text/plain').send(text);
      return undefined;
    },
  });

  const designs = new ApiRouter('/api/harnesses');
  const mustFind = (id: number) => {
    const row = db.select().from(harnesses).where(eq(harnesses.id, id)).get();
    if (!row) throw notFound('That harness design');
    return row;
  };

  designs.get('/', { handle: () => ({ harnesses: db.select().from(harnesses).orderBy(desc(harnesses.id)).all() }) });
  designs.get('/:id', { schemas: { params: IdParamsSchema }, handle: ({ params }) => mustFind(params.id) });

  designs.post('/', {
    status: 201,
    schemas: { body: HarnessDesignInputSchema },
    handle: ({ body, user }) =>
      db.transaction((tx) => {
        const row = tx.insert(harnesses).values({ ...body, ownerId: user.id }).returning().get();
        audit(tx, { userId: user.id, action: 'harness.create', entity: 'harness', entityId: row.id, detail: { name: body.name, preset: body.preset } });
        return row;
      }),
  });

  designs.put('/:id', {
    schemas: { params: IdParamsSchema, body: HarnessDesignInputSchema },
    handle: ({ params, body, user }) => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden('Only the design\'s owner (or qa/admin) may change it.');
      return db.transaction((tx) => {
        const row = tx.update(harnesses).set({ ...body, updatedAt: Date.now() }).where(eq(harnesses.id, params.id)).returning().get();
        audit(tx, { userId: user.id, action: 'harness.update', entity: 'harness', entityId: row.id, detail: { before: { name: before.name, preset: before.preset, values: before.values }, after: body } });
        return row;
      });
    },
  });

  designs.delete('/:id', {
    schemas: { params: IdParamsSchema },
    handle: ({ params, user }) => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden('Only the design\'s owner (or qa/admin) may delete it.');
      db.transaction((tx) => {
        tx.delete(harnesses).where(eq(harnesses.id, params.id)).run();
        audit(tx, { userId: user.id, action: 'harness.delete', entity: 'harness', entityId: params.id, detail: { name: before.name } });
      });
      return { ok: true };
    },
  });

  return [engine, designs];
}
