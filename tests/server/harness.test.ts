import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { simulate, sweepKnobs } from '@shared/circuit/metrics';
import { getPreset, type HarnessValues } from '@shared/circuit/presets';
import { HARNESS_PRESET_IDS } from '@shared/schemas/harness';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('harness engine routes', () => {
  test('the presets are listed under their ids with default values', async () => {
    const res = await (await t.as('viewer')).get('/api/harness/presets');
    expect(res.body.presets.map((p: { id: string }) => p.id)).toEqual([...HARNESS_PRESET_IDS]);
    expect(res.body.fields.length).toBeGreaterThan(10);
  });

  test('simulate answers what the shared engine computes for the same preset and values', async () => {
    const values = { toneC: 15e-9, cableLength: 6 };
    const res = await (
      await t.as('viewer')
    )
      .post('/api/harness/simulate')
      .send({ preset: 'interactive-tone', values, knobs: { volume: 6, tone: 4 } });
    expect(res.status).toBe(200);
    const preset = getPreset('interactive-tone')!;
    const engine = simulate(preset.build({ ...preset.defaults, ...values } as HarnessValues), { volume: 6, tone: 4 });
    expect(res.body.magnitudeDb).toEqual(Array.from(engine.magnitudeDb));
    expect(res.body.metrics.level1kDb).toBe(engine.metrics.level1kDb);
  });

  test('a knob grid has one curve per setting and the sweep figures', async () => {
    const res = await (await t.as('tech')).post('/api/harness/sweep').send({ preset: 'bleed-cap', volume: [2, 5, 10], tone: [0, 10] });
    expect(res.status).toBe(200);
    expect(res.body.magnitudeDb).toHaveLength(3 * 2 * res.body.frequencies.length);
    expect(res.body.volumeTaperDb[2]).toBeCloseTo(0, 12);
    const preset = getPreset('bleed-cap')!;
    const grid = sweepKnobs(preset.build(preset.defaults), { volume: [2, 5, 10], tone: [0, 10] });
    expect(res.body.interactionIndexDb).toBe(grid.interactionIndexDb);
    expect(res.body.interactionIndexDb).toBeGreaterThan(0);
  });

  test('the netlist export is SPICE text with an AC 1 source and the output node out', async () => {
    const res = await (await t.as('viewer')).post('/api/harness/netlist').send({ preset: 'dual-cap-tone', knobs: { volume: 10, tone: 0 } });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/plain/);
    expect(res.text).toMatch(/\bAC 1\b/);
    expect(res.text).toMatch(/\bout\b/);
    expect(res.text).toMatch(/^\.ac dec \d+ 20 20000$/m);
    expect(res.text.trim().split('\n').at(-1)).toBe('.end');
  });

  test('bad bodies name the field: knob out of range, both preset and netlist, unknown preset', async () => {
    const viewer = await t.as('viewer');
    const knob = await viewer.post('/api/harness/simulate').send({ preset: 'bleed-cap', knobs: { volume: 11, tone: 5 } });
    expect(knob.status).toBe(422);
    expect(knob.body.error.fields).toHaveProperty(['knobs.volume']);
    const both = await viewer.post('/api/harness/simulate').send({ knobs: { volume: 1, tone: 1 } });
    expect(both.status).toBe(422);
    expect((await viewer.post('/api/harness/simulate').send({ preset: 'famous-wiring', knobs: { volume: 1, tone: 1 } })).status).toBe(422);
    const negative = await viewer
      .post('/api/harness/simulate')
      .send({ preset: 'bleed-cap', values: { toneC: -1 }, knobs: { volume: 1, tone: 1 } });
    expect(negative.body.error.fields).toHaveProperty(['values.toneC']);
  });
});

describe('saved harness designs', () => {
  test('a tech saves and edits a design; a viewer reads but cannot save; another tech cannot change it', async () => {
    const tech = await t.as('tech');
    const design = {
      name: 'Neck pickup, keeps treble',
      preset: 'bleed-cap-parallel-r',
      values: { bleedC: 1.2e-9, bleedR: 150e3 },
      notes: 'customer wants treble at 5',
    };
    const created = await tech.post('/api/harnesses').send(design);
    expect(created.status).toBe(201);
    expect((await tech.put(`/api/harnesses/${created.body.id}`).send({ ...design, name: 'Renamed' })).body.name).toBe('Renamed');
    const viewer = await t.as('viewer');
    expect((await viewer.get('/api/harnesses')).body.harnesses).toHaveLength(1);
    expect((await viewer.post('/api/harnesses').send(design)).status).toBe(403);
    // qa may edit any design; the owner check only applies between techs.
    expect((await (await t.as('qa')).put(`/api/harnesses/${created.body.id}`).send(design)).status).toBe(200);
    expect((await tech.delete(`/api/harnesses/${created.body.id}`)).status).toBe(200);
  });
});

test('a harness without cable (0 m) is solved, and differs from one with cable only by the cable capacitance', async () => {
  const viewer = await t.as('viewer');
  const none = await viewer
    .post('/api/harness/simulate')
    .send({ preset: 'independent-tone', values: { cableLength: 0 }, knobs: { volume: 10, tone: 10 } });
  expect(none.status).toBe(200);
  const some = await viewer
    .post('/api/harness/simulate')
    .send({ preset: 'independent-tone', values: { cableLength: 6 }, knobs: { volume: 10, tone: 10 } });
  // More capacitance across the pickup lowers its resonance (standard circuit theory).
  expect(some.body.metrics.peak.frequency).toBeLessThan(none.body.metrics.peak.frequency);
});

describe('harness inputs outside their physical range (the range table in shared/schemas/ranges.ts)', () => {
  // The ranges are common practice (no published source); each bad input is a 422 naming its field.
  const cases: [string, Record<string, unknown>, string][] = [
    ['knob above 10', { preset: 'bleed-cap', knobs: { volume: 10.5, tone: 5 } }, 'knobs.volume'],
    ['knob below 0', { preset: 'bleed-cap', knobs: { volume: 5, tone: -0.1 } }, 'knobs.tone'],
    ['knob not a number (NaN arrives as null in JSON)', { preset: 'bleed-cap', knobs: { volume: null, tone: 5 } }, 'knobs.volume'],
    ['negative cable length', { preset: 'bleed-cap', values: { cableLength: -1 }, knobs: { volume: 5, tone: 5 } }, 'values.cableLength'],
    ['empty frequency list', { preset: 'bleed-cap', frequencies: [], knobs: { volume: 5, tone: 5 } }, 'frequencies'],
    ['frequency below 1 Hz', { preset: 'bleed-cap', frequencies: [0.5, 100], knobs: { volume: 5, tone: 5 } }, 'frequencies.0'],
    ['frequency above 1 MHz', { preset: 'bleed-cap', frequencies: [100, 2e6], knobs: { volume: 5, tone: 5 } }, 'frequencies.1'],
    ['tone capacitor of 1 F', { preset: 'bleed-cap', values: { toneC: 1 }, knobs: { volume: 5, tone: 5 } }, 'values.toneC'],
    ['volume pot of 1 GΩ', { preset: 'bleed-cap', values: { volumeR: 1e9 }, knobs: { volume: 5, tone: 5 } }, 'values.volumeR'],
    ['pickup of 1000 H', { preset: 'bleed-cap', values: { pickupL: 1000 }, knobs: { volume: 5, tone: 5 } }, 'values.pickupL'],
  ];
  for (const [name, body, field] of cases) {
    test(name, async () => {
      const res = await (await t.as('viewer')).post('/api/harness/simulate').send(body);
      expect(res.status).toBe(422);
      expect(Object.keys(res.body.error.fields ?? {})).toContain(field);
    });
  }

  test('a circuit with a floating island answers 422 in words, never "matrix is singular"', async () => {
    const netlist = {
      parts: [
        { kind: 'pickup', id: 'PU', hot: 'hot', cold: '0', R: 6000, L: 2.5, C: 100e-12 },
        { kind: 'resistor', id: 'R1', a: 'hot', b: 'out', R: 1000 },
        { kind: 'resistor', id: 'R2', a: 'out', b: '0', R: 1e6 },
        { kind: 'capacitor', id: 'C3', a: 'x', b: 'y', C: 1e-9 },
      ],
    };
    const res = await (await t.as('viewer')).post('/api/harness/simulate').send({ netlist, knobs: { volume: 5, tone: 5 } });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body)).not.toMatch(/singular/i);
    expect(res.body.error.fields).toHaveProperty(['netlist']);
  });

  test('at volume 0 the figures say "no signal" (no peak at −170 dB)', async () => {
    const res = await (
      await t.as('viewer')
    )
      .post('/api/harness/simulate')
      .send({ preset: 'independent-tone', knobs: { volume: 0, tone: 10 } });
    expect(res.status).toBe(200);
    expect(res.body.metrics.noSignal).toBe(true);
    const up = await (
      await t.as('viewer')
    )
      .post('/api/harness/simulate')
      .send({ preset: 'independent-tone', knobs: { volume: 10, tone: 10 } });
    expect(up.body.metrics.noSignal).toBe(false);
  });
});
