// The whole-instrument routes: layouts, simulate/netlist/sweep with a layout body, the bleed
// finder, saved designs in the layout shape (and the older preset shape).
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import { buildLayoutNetlist, getLayout, LAYOUT_IDS, layoutKnobs, resolveLayoutConfig } from '@shared/circuit/layouts';
import { simulate, simulateInstrument } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import { createTestApp, type TestApp } from '../support/app';
import { INLINE_SIMULATION_WORK } from '@server/features/harness/simulate';
import type { Netlist } from '@shared/circuit/netlist';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('layouts', () => {
  test('GET /api/harness/layouts lists the four layouts with pickups, selector, knobs, options and values', async () => {
    const res = await (await t.as('viewer')).get('/api/harness/layouts');
    expect(res.status).toBe(200);
    expect(res.body.layouts.map((l: { id: string }) => l.id)).toEqual([...LAYOUT_IDS]);
    const two = res.body.layouts.find((l: { id: string }) => l.id === 'two-pickups-3way');
    expect(two.pickups.map((p: { id: string }) => p.id)).toEqual(['neck', 'bridge']);
    expect(two.selector.positions).toEqual([
      { index: 0, name: 'Neck' },
      { index: 1, name: 'Both' },
      { index: 2, name: 'Bridge' },
    ]);
    expect(two.knobs.map((k: { id: string }) => k.id)).toEqual(['neck.volume', 'bridge.volume', 'neck.tone', 'bridge.tone']);
    expect(two.options.find((o: { id: string }) => o.id === 'volumeWiring').choices[0].id).toBe('standard');
    const keys = two.values.map((v: { key: string }) => v.key);
    expect(keys).toContain('neck.pickupR');
    expect(keys).toContain('ampC');
    const dual = res.body.layouts.find((l: { id: string }) => l.id === 'dual-coil');
    expect(dual.pickups[0].coils.map((c: { id: string }) => c.id)).toEqual(['north', 'south']);
    // neck and bridge pickups differ by default
    const neckR = two.values.find((v: { key: string }) => v.key === 'neck.pickupR').default;
    const bridgeR = two.values.find((v: { key: string }) => v.key === 'bridge.pickupR').default;
    expect(neckR).not.toBe(bridgeR);
  });

  test("simulate with a layout answers the engine, with each pickup's own transfer", async () => {
    const body = {
      layout: 'three-pickups-5way',
      selector: 3,
      knobs: { volume: 6, tone2: 3 },
      options: { phase: 'reversed', tone2Serves: 'middle-bridge' },
      values: { 'middle.pickupL': 2.7 },
    };
    const res = await (await t.as('viewer')).post('/api/harness/simulate').send(body);
    expect(res.status).toBe(200);
    const layout = getLayout('three-pickups-5way')!;
    const { config } = resolveLayoutConfig(layout, body);
    const engine = simulateInstrument(buildLayoutNetlist(layout, config), layoutKnobs(layout, body.knobs));
    expect(res.body.magnitudeDb).toEqual(Array.from(engine.magnitudeDb));
    expect(res.body.perPickup.map((p: { pickupId: string }) => p.pickupId)).toEqual(['middle', 'bridge']);
    expect(res.body.perPickup[0].magnitudeDb).toEqual(Array.from(engine.perPickup[0]!.magnitudeDb));
    expect(res.body.signal).toBe('present');
    expect(res.body.metrics.level1kDb).toBe(engine.metrics!.level1kDb);
  });

  test('a large design is solved in the pool and answers as the engine; an ordinary one on the request thread', async () => {
    const layout = getLayout('one-pickup')!;
    const base = buildLayoutNetlist(layout, resolveLayoutConfig(layout, {}).config);
    // The same design with a ladder of 50 resistors hanging from its output (60 parts, the limit's ten below).
    const ladder = Array.from({ length: 50 }, (_, i) => ({
      kind: 'resistor',
      id: `L${i}`,
      a: i === 0 ? 'out' : `l${i}`,
      b: `l${i + 1}`,
      R: 1e6,
    }));
    const netlist = { ...base, parts: [...base.parts, ...ladder, { kind: 'resistor', id: 'Lend', a: 'l50', b: '0', R: 1e6 }] };
    const frequencies = Array.from({ length: 2000 }, (_, i) => 20 * 1000 ** (i / 1999));
    expect(netlist.parts.length * frequencies.length).toBeGreaterThan(INLINE_SIMULATION_WORK);
    const knobs = { volume: 8, tone: 6 };
    const asked: string[] = [];
    const run = t.ctx.pool.run.bind(t.ctx.pool);
    const spy = vi.spyOn(t.ctx.pool, 'run').mockImplementation(((name, input, opts) => {
      asked.push(name);
      return run(name, input, opts);
    }) as typeof t.ctx.pool.run);
    const agent = await t.as('viewer');
    try {
      const large = await agent.post('/api/harness/simulate').send({ netlist, knobs, frequencies });
      expect(large.status).toBe(200);
      const engine = simulateInstrument(netlist as Netlist, knobs, frequencies);
      expect(large.body.magnitudeDb).toEqual(Array.from(engine.magnitudeDb));
      expect(large.body.metrics.level1kDb).toBe(engine.metrics!.level1kDb);
      expect(asked).toEqual(['harnessSimulate']);
      const ordinary = await agent.post('/api/harness/simulate').send({ netlist: base, knobs });
      expect(ordinary.status).toBe(200);
      expect(asked).toEqual(['harnessSimulate']);
    } finally {
      spy.mockRestore();
    }
  });

  test('a cancelled output answers "no signal (cancelled)" without figures', async () => {
    const res = await (
      await t.as('viewer')
    )
      .post('/api/harness/simulate')
      .send({ layout: 'dual-coil', options: { coils: 'series-reversed' } });
    expect(res.status).toBe(200);
    expect(res.body.signal).toBe('cancelled');
    expect(res.body.note).toBe('no signal (cancelled)');
    expect(res.body.metrics).toBeNull();
  });

  test("the older preset body keeps working and equals the one-pickup layout with the preset's options", async () => {
    const agent = await t.as('viewer');
    const a = await agent
      .post('/api/harness/simulate')
      .send({ preset: 'dual-cap-tone', values: { toneC: 33e-9 }, knobs: { volume: 4, tone: 2 } });
    const b = await agent.post('/api/harness/simulate').send({
      layout: 'one-pickup',
      options: { toneNetwork: 'floor-and-second-cap' },
      values: { toneC: 33e-9 },
      knobs: { volume: 4, tone: 2 },
    });
    expect(a.status).toBe(200);
    const preset = getPreset('dual-cap-tone')!;
    expect(a.body.magnitudeDb).toEqual(
      Array.from(simulate(preset.build({ ...preset.defaults, toneC: 33e-9 }), { volume: 4, tone: 2 }).magnitudeDb),
    );
    a.body.magnitudeDb.forEach((v: number, k: number) => expect(Math.abs(v - b.body.magnitudeDb[k])).toBeLessThan(1e-9));
  });

  test('unknown keys, options, choices, knobs and positions answer 422 naming the field', async () => {
    const agent = await t.as('viewer');
    const cases: [object, string][] = [
      [{ layout: 'two-pickups-3way', values: { pickupR: 8e3 } }, 'values.pickupR'],
      [{ layout: 'two-pickups-3way', values: { 'neck.pickupX': 1 } }, 'values.neck.pickupX'],
      [{ layout: 'one-pickup', options: { coils: 'series' } }, 'options.coils'],
      [{ layout: 'dual-coil', options: { coils: 'sideways' } }, 'options.coils'],
      [{ layout: 'one-pickup', knobs: { 'neck.volume': 3 } }, 'knobs.neck.volume'],
      [{ layout: 'two-pickups-3way', selector: 3 }, 'selector'],
      [{ layout: 'one-pickup', values: { ampC: -1e-12 } }, 'values.ampC'],
      [{ preset: 'bleed-cap', values: { 'neck.pickupR': 8e3 } }, 'values.neck.pickupR'],
    ];
    for (const [body, field] of cases) {
      const res = await agent.post('/api/harness/simulate').send(body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(body)).toContain(field);
    }
    const both = await agent.post('/api/harness/simulate').send({ layout: 'one-pickup', preset: 'bleed-cap' });
    expect(both.status).toBe(422);
  });

  test('netlist: one AC source per pickup or coil, phase 180 when reversed, node out', async () => {
    const res = await (
      await t.as('viewer')
    )
      .post('/api/harness/netlist')
      .send({ layout: 'dual-coil', options: { coils: 'series-reversed' }, knobs: { volume: 7 } });
    expect(res.status).toBe(200);
    const sources = res.text.split('\n').filter((l: string) => /^V/i.test(l));
    expect(sources).toHaveLength(2);
    expect(sources.filter((l: string) => / AC 1 180$/.test(l))).toHaveLength(1);
    expect(res.text).toMatch(/ out /);
    expect(res.text).toMatch(/\(volume 7, tone 10\)/);
  });

  test('sweep takes the two axes by knob id; other knobs from knobs', async () => {
    const agent = await t.as('viewer');
    const res = await agent
      .post('/api/harness/sweep')
      .send({ layout: 'two-pickups-3way', selector: 1, volume: [0, 10], tone: [10], knobs: { 'bridge.volume': 10 } });
    expect(res.status).toBe(200);
    expect(res.body.volumeKnob).toBe('neck.volume');
    expect(res.body.toneKnob).toBe('neck.tone');
    // standard wiring: the neck volume at 0 silences "both"
    expect(res.body.volumeTaperDb[0]).toBeLessThan(-100);
    const bad = await agent.post('/api/harness/sweep').send({ layout: 'two-pickups-3way', volumeKnob: 'volume' });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toContain('volumeKnob');
  });

  test('the bleed finder answers ten candidates, best first, and checks its weight', async () => {
    const agent = await t.as('viewer');
    const res = await agent.post('/api/harness/bleed-finder').send({ layout: 'one-pickup', weight: 1 });
    expect(res.status).toBe(200);
    expect(res.body.candidates).toHaveLength(10);
    const [best] = res.body.candidates;
    expect(['cap', 'cap-parallel-r', 'cap-series-r']).toContain(best.topology);
    expect(best.figures.score).toBe(best.figures.trebleSpreadDb);
    const bad = await agent.post('/api/harness/bleed-finder').send({ layout: 'one-pickup', weight: 1.5 });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toContain('weight');
  });
});

describe('saved designs carry the whole instrument', () => {
  test('a layout design is stored with layout, position, options, knobs and values; a preset design becomes the one-pickup layout', async () => {
    const agent = await t.as('tech');
    const created = await agent.post('/api/harnesses').send({
      name: 'Three pickups into a fuzz',
      layout: 'three-pickups-5way',
      selector: 3,
      options: { load: 'low-impedance-pedal', tone2Serves: 'middle-bridge' },
      knobs: { volume: 7, tone1: 5 },
      values: { pedalR: 22e3 },
    });
    expect(created.status).toBe(201);
    const got = await agent.get(`/api/harnesses/${created.body.id}`);
    expect(got.body).toMatchObject({
      layout: 'three-pickups-5way',
      selector: 3,
      options: { load: 'low-impedance-pedal', tone2Serves: 'middle-bridge' },
      knobs: { volume: 7, tone1: 5 },
      values: { pedalR: 22e3 },
      preset: null,
    });
    const old = await agent.post('/api/harnesses').send({ name: 'Old shape', preset: 'bleed-cap', values: { bleedC: 680e-12 } });
    expect(old.status).toBe(201);
    expect(old.body).toMatchObject({ layout: 'one-pickup', options: { bleed: 'cap' }, preset: 'bleed-cap' });
    const bad = await agent.post('/api/harnesses').send({ name: 'Bad', layout: 'dual-coil', values: { 'neck.pickupR': 1 } });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.error.fields)).toContain('values.neck.pickupR');
  });

  test('measured capacitors in any capacitor slot: the design records the parts, and a wrong part is a 422 naming the slot', async () => {
    const tech = await t.as('tech');
    const cap = (
      await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-SLOT-1', nominal: 1e-9, tolerancePct: 10 }).expect(201)
    ).body;
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-SLOT-1', nominal: 500e3, tolerancePct: 20 }).expect(201))
      .body;
    // no capacitance reading yet: nothing to take the value from
    const early = await tech.post('/api/harnesses').send({
      name: 'Too early',
      layout: 'one-pickup',
      options: { bleed: 'cap' },
      values: { bleedC: 1e-9 },
      partRefs: { bleedC: cap.id },
    });
    expect(early.status).toBe(422);
    expect(Object.keys(early.body.error.fields)).toEqual(['partRefs.bleedC']);
    await tech.post(`/api/parts/${cap.id}/readings`).send({ quantity: 'capacitance', value: 1.03e-9 }).expect(201);
    // the same capacitor in a bleed slot and in a tone slot of another pickup, a pot beside them
    const saved = await tech.post('/api/harnesses').send({
      name: 'Measured caps',
      layout: 'two-pickups-3way',
      options: { bleed: 'cap', toneNetwork: 'second-cap' },
      values: { 'neck.bleedC': 1.03e-9, 'bridge.toneC': 1.03e-9, 'bridge.secondC': 1.03e-9, 'neck.volumeR': 500e3 },
      partRefs: { 'neck.bleedC': cap.id, 'bridge.toneC': cap.id, 'bridge.secondC': cap.id, 'neck.volumeR': pot.id },
    });
    expect(saved.status).toBe(201);
    const got = (await tech.get(`/api/harnesses/${saved.body.id}`).expect(200)).body;
    expect(got.partRefs).toEqual({ 'neck.bleedC': cap.id, 'bridge.toneC': cap.id, 'bridge.secondC': cap.id, 'neck.volumeR': pot.id });
    // a pot in a capacitor slot, a capacitor in a pot slot, a slot the layout lacks, a cable value, a missing part
    const wrong = async (partRefs: Record<string, number>, field: string) => {
      const res = await tech.post('/api/harnesses').send({ name: 'Wrong', layout: 'two-pickups-3way', values: {}, partRefs });
      expect(res.status).toBe(422);
      expect(Object.keys(res.body.error.fields)).toEqual([field]);
    };
    await wrong({ 'neck.toneC': pot.id }, 'partRefs.neck.toneC');
    await wrong({ 'neck.volumeR': cap.id }, 'partRefs.neck.volumeR');
    await wrong({ toneC: cap.id }, 'partRefs.toneC');
    await wrong({ cableCapPerMetre: cap.id }, 'partRefs.cableCapPerMetre');
    await wrong({ 'bridge.bleedC': 999999 }, 'partRefs.bridge.bleedC');
  });
});
