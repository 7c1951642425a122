// Installed parts in the slots of a job's wiring design, and the report's predictions from their
// measured values. The expected curves are computed here with the engine's preset netlist
// (getPreset(...).build, a different construction path from the report's layout netlist; the two
// agree to 1e-9 dB, tests/shared/circuit) on the values the API says were measured.
import { coilImpedance } from '@shared/analysis/coil';
import { readConditions } from '@shared/csv/conditions';
import { readTable } from '@shared/csv/read-table';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig } from '@shared/circuit/layouts';
import { simulateInstrument } from '@shared/circuit/metrics';
import { DEFAULT_HARNESS_VALUES, getPreset, type HarnessValues } from '@shared/circuit/presets';
import { taperLaw, taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

type Agent = Awaited<ReturnType<TestApp['as']>>;
let seq = 0;
const uid = () => `${Date.now().toString(36)}${(seq++).toString(36)}`.toUpperCase();

/** A linear pot of `total` Ω swept over 300° (end resistance 300 Ω). */
function linearPotCsv(total: number): string {
  const lines = ['Rotation (deg),R (kOhm)'];
  for (let deg = 0; deg <= 300; deg += 10)
    lines.push(`${deg},${((total * taperLawValue('linear', 0.5, deg / 300) + 300) / 1e3).toFixed(4)}`);
  return lines.join('\n') + '\n';
}

/** A coil's impedance from the model's closed form (the fit recovers R, L, C; tests/shared/analysis check how well). */
function coilCsv(R: number, L: number, C: number): string {
  const lines = ['Freq (Hz),Re (ohm),Im (ohm)'];
  for (let i = 0; i < 120; i++) {
    const f = 20 * Math.pow(1000, i / 119);
    const z = coilImpedance({ R, L, C }, f);
    lines.push(`${f.toPrecision(8)},${z.re.toPrecision(10)},${z.im.toPrecision(10)}`);
  }
  return lines.join('\n');
}

async function part(tech: Agent, body: Record<string, unknown>) {
  return (await tech.post('/api/parts').send(body).expect(201)).body as { id: number; label: string };
}

async function install(tech: Agent, jobId: number, partId: number, position: string) {
  return tech
    .post(`/api/jobs/${jobId}/parts`)
    .send({ partId, position, overrideReason: 'Checked for this test on the bench.' })
    .expect(201);
}

const assign = (tech: Agent, jobId: number, partId: number, slot: string | null) =>
  tech.put(`/api/jobs/${jobId}/parts/${partId}/slot`).send({ slot });

/** The CSV's columns by header. */
function columns(csv: string): Record<string, number[]> {
  const table = readTable(csv);
  if (!table.ok) throw new Error(JSON.stringify(table.issues));
  return Object.fromEntries(table.header.map((h, i) => [h, table.rows.map((r) => Number(r.cells[i]))]));
}

/** A job on a bleed design (cap with a parallel resistor) with its tone at 5, so the tone capacitor counts. */
async function bleedJob(tech: Agent) {
  const harness = (
    await tech
      .post('/api/harnesses')
      .send({ name: `Bleed ${uid()}`, preset: 'bleed-cap-parallel-r', values: {}, knobs: { volume: 10, tone: 5 } })
      .expect(201)
  ).body;
  const job = (
    await tech
      .post('/api/jobs')
      .send({ customer: 'Q. Example', customerEmail: 'q.example@lugbook.test', instrument: 'Offset six-string', harnessId: harness.id })
      .expect(201)
  ).body;
  return { harness, job };
}

describe('parts in the slots of the job design', () => {
  test('the job lists its design’s slots; a part of the right kind is assigned, moved and cleared', async () => {
    const tech = await t.as('tech');
    const { job } = await bleedJob(tech);
    const detail = (await tech.get(`/api/jobs/${job.id}`).expect(200)).body;
    expect(detail.slots.map((s: { key: string; accepts: string }) => `${s.key}:${s.accepts}`)).toEqual([
      'pickup:pickup',
      'volumeR:pot',
      'bleedC:capacitor',
      'bleedR:resistor',
      'toneR:pot',
      'toneC:capacitor',
    ]);
    const pot = await part(tech, { kind: 'pot', label: `POT-S-${uid()}`, nominal: 250e3, tolerancePct: 20 });
    await install(tech, job.id, pot.id, 'volume');
    const put = await assign(tech, job.id, pot.id, 'volumeR');
    expect(put.status).toBe(200);
    expect(put.body.parts[0].slot).toBe('volumeR');
    expect(put.body.slots.find((s: { key: string }) => s.key === 'volumeR').partId).toBe(pot.id);
    // Moved to the tone pot's slot: the volume slot is free again.
    const moved = (await assign(tech, job.id, pot.id, 'toneR').expect(200)).body;
    expect(moved.slots.find((s: { key: string }) => s.key === 'volumeR').partId).toBeNull();
    expect(moved.slots.find((s: { key: string }) => s.key === 'toneR').partId).toBe(pot.id);
    const cleared = (await assign(tech, job.id, pot.id, null).expect(200)).body;
    expect(cleared.parts[0].slot).toBeNull();
    const audit = t.ctx.sqlite
      .prepare("select action from audit_log where entity = 'job' and entity_id = ? and action like 'job.%slot' order by id")
      .all(String(job.id)) as { action: string }[];
    expect(audit.map((a) => a.action)).toEqual(['job.assign-slot', 'job.assign-slot', 'job.clear-slot']);
    expect((await (await t.as('viewer')).put(`/api/jobs/${job.id}/parts/${pot.id}/slot`).send({ slot: 'volumeR' })).status).toBe(403);
  });

  test('a part of the wrong kind, an unknown slot, a taken slot and a job without a design are 422 naming the slot', async () => {
    const tech = await t.as('tech');
    const { job } = await bleedJob(tech);
    const cap = await part(tech, { kind: 'capacitor', label: `CAP-S-${uid()}`, nominal: 22e-9, tolerancePct: 10 });
    const cap2 = await part(tech, { kind: 'capacitor', label: `CAP-S-${uid()}`, nominal: 47e-9, tolerancePct: 10 });
    const res = await part(tech, { kind: 'resistor', label: `R-S-${uid()}`, nominal: 150e3, tolerancePct: 5 });
    await install(tech, job.id, cap.id, 'tone cap');
    await install(tech, job.id, cap2.id, 'spare');
    await install(tech, job.id, res.id, 'bleed');

    const wrong = await assign(tech, job.id, cap.id, 'volumeR');
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.fields.slot).toMatch(/Volume pot \(volumeR\) takes a pot, not a capacitor/);
    const wrongR = await assign(tech, job.id, res.id, 'toneC');
    expect(wrongR.status).toBe(422);
    expect(wrongR.body.error.fields.slot).toMatch(/Tone capacitor \(toneC\) takes a capacitor, not a resistor/);

    const unknown = await assign(tech, job.id, cap.id, 'secondC'); // this design's tone network has no second capacitor
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields.slot).toMatch(/No slot "secondC"/);

    await assign(tech, job.id, cap.id, 'toneC').expect(200);
    const taken = await assign(tech, job.id, cap2.id, 'toneC');
    expect(taken.status).toBe(422);
    expect(taken.body.error.fields.slot).toMatch(/Tone capacitor \(toneC\) holds CAP-S-/);
    expect((await tech.get(`/api/jobs/${job.id}`)).body.parts.filter((p: { slot: string | null }) => p.slot === 'toneC')).toHaveLength(1);

    const elsewhere = await part(tech, { kind: 'capacitor', label: `CAP-S-${uid()}`, nominal: 1e-9, tolerancePct: 10 });
    expect((await assign(tech, job.id, elsewhere.id, 'bleedC')).status).toBe(404);
    expect((await tech.put(`/api/jobs/${job.id}/parts/${cap.id}/slot`).send({ slot: '' })).body.error.fields).toHaveProperty('slot');

    const bare = (await tech.post('/api/jobs').send({ customer: 'No Design', instrument: 'Bass' }).expect(201)).body;
    const cap3 = await part(tech, { kind: 'capacitor', label: `CAP-S-${uid()}`, nominal: 1e-9, tolerancePct: 10 });
    await install(tech, bare.id, cap3.id, 'bleed');
    const noDesign = await assign(tech, bare.id, cap3.id, 'bleedC');
    expect(noDesign.status).toBe(422);
    expect(noDesign.body.error.fields.slot).toMatch(/no wiring design/);
  });

  test('predictions use the assigned parts’ measured values and fitted law; the text names them and the typical ones', async () => {
    const tech = await t.as('tech');
    const { harness, job } = await bleedJob(tech);
    // A linear 100 kΩ pot (the design's volume pot is a 500 kΩ audio one), a 47 nF tone capacitor (22 nF in
    // the design), a pickup with a coil fit, and a bleed resistor that was never measured.
    const pot = await part(tech, { kind: 'pot', label: `POT-M-${uid()}`, nominal: 100e3, tolerancePct: 20, taperClass: 'linear' });
    const taper = await tech
      .post(`/api/parts/${pot.id}/sweeps`)
      .field('kind', 'taper')
      .attach('file', Buffer.from(linearPotCsv(100e3)), 'p.csv');
    expect(taper.status).toBe(201);
    const fitted = taper.body.fit.result as { law: TaperLawKind; m: number; total: number };
    const cap = await part(tech, { kind: 'capacitor', label: `CAP-M-${uid()}`, nominal: 47e-9, tolerancePct: 10 });
    await tech.post(`/api/parts/${cap.id}/readings`).send({ quantity: 'capacitance', value: 46.1e-9 }).expect(201);
    const pickup = await part(tech, { kind: 'pickup', label: `PU-M-${uid()}`, nominal: 6e3, tolerancePct: 10 });
    const coil = await tech
      .post(`/api/parts/${pickup.id}/sweeps`)
      .field('kind', 'impedance')
      .attach('file', Buffer.from(coilCsv(6000, 2.6, 95e-12)), 'c.csv');
    expect(coil.status).toBe(201);
    const coilFit = coil.body.fit.result as { R: number; L: number; C: number; Rp: number | null };
    const res = await part(tech, { kind: 'resistor', label: `R-M-${uid()}`, nominal: 150e3, tolerancePct: 5 });
    for (const [p, pos] of [
      [pot, 'volume'],
      [cap, 'tone cap'],
      [pickup, 'neck'],
      [res, 'bleed'],
    ] as const)
      await install(tech, job.id, p.id, pos);

    const before = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body;
    expect(before.text).toMatch(
      /Volume pot: no part assigned, typical values used: resistance 500 kΩ, law audio, 15\.0 % at mid-rotation\./,
    );
    expect(before.text).toMatch(/with typical part values, not measured ones/);

    await assign(tech, job.id, pot.id, 'volumeR').expect(200);
    await assign(tech, job.id, cap.id, 'toneC').expect(200);
    await assign(tech, job.id, pickup.id, 'pickup').expect(200);
    await assign(tech, job.id, res.id, 'bleedR').expect(200);
    const after = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body;

    // The engine on the same values: the design's values with the measured ones put in.
    const values: HarnessValues = {
      ...DEFAULT_HARNESS_VALUES,
      volumeR: fitted.total,
      volumeLaw: taperLaw(fitted.law, fitted.m),
      toneC: 46.1e-9,
      pickupR: coilFit.R,
      pickupL: coilFit.L,
      pickupC: coilFit.C,
      ...(coilFit.Rp != null ? { pickupRp: coilFit.Rp } : {}),
    };
    const netlist = getPreset('bleed-cap-parallel-r')!.build(values);
    const typical = getPreset('bleed-cap-parallel-r')!.build(DEFAULT_HARNESS_VALUES);
    const colsAfter = columns(after.csv);
    const colsBefore = columns(before.csv);
    const f = colsAfter.frequency_hz!;
    let biggestChange = 0;
    for (const v of [10, 8, 6, 4, 2]) {
      const expected = simulateInstrument(netlist, { volume: v, tone: 5 }, f).magnitudeDb;
      const wasExpected = simulateInstrument(typical, { volume: v, tone: 5 }, f).magnitudeDb;
      const got = colsAfter[`volume_${v}_db`]!;
      const was = colsBefore[`volume_${v}_db`]!;
      for (let k = 0; k < f.length; k++) {
        // The CSV has 3 decimals and 6 significant digits of frequency.
        expect(Math.abs(got[k]! - expected[k]!)).toBeLessThan(2e-3);
        expect(Math.abs(was[k]! - wasExpected[k]!)).toBeLessThan(2e-3);
        biggestChange = Math.max(biggestChange, Math.abs(got[k]! - was[k]!));
      }
    }
    // A 100 kΩ linear pot in place of a 500 kΩ audio one moves the curves by decibels, not rounding.
    expect(biggestChange).toBeGreaterThan(3);

    const text = after.text as string;
    expect(text).toMatch(
      new RegExp(`Volume pot: ${pot.label}: measured resistance 100(\\.\\d)? kΩ, law linear \\(taper fit of \\d{4}-\\d\\d-\\d\\d\\)\\.`),
    );
    expect(text).toMatch(
      new RegExp(`Tone capacitor: ${cap.label}: measured capacitance 46\\.1 nF \\(capacitance reading of \\d{4}-\\d\\d-\\d\\d\\)\\.`),
    );
    expect(text).toMatch(
      new RegExp(`Pickup: ${pickup.label}: measured DC resistance 6(\\.00)? kΩ, inductance 2\\.6(0)? H, self-capacitance 95(\\.0)? pF`),
    );
    expect(text).toMatch(new RegExp(`Treble-bleed resistor: ${res.label}: resistance not measured, typical value used: 150 kΩ\\.`));
    expect(text).toMatch(/Tone pot: no part assigned, typical values used: resistance 500 kΩ/);
    expect(text).toMatch(
      new RegExp(
        `with the measured values of ${pickup.label}, ${pot.label}, ${cap.label} \\(as listed above\\) and typical values for the rest`,
      ),
    );
    expect(text).not.toMatch(new RegExp(`measured values of [^\\n]*${res.label}`));
    const conditions = Object.fromEntries(readConditions(after.csv).map((c) => [c.key, c.value]));
    expect(conditions['measured values']).toContain(`volumeR 100`);
    expect(conditions['measured values']).toContain(`(${cap.label})`);
    expect(conditions.computed).toMatch(/measured values of the parts assigned/);

    // Another design without a tone-capacitor slot of that name keeps the part installed and clears its slot.
    const plain = (
      await tech
        .post('/api/harnesses')
        .send({ name: `Plain ${uid()}`, layout: 'two-pickups-3way', values: {} })
        .expect(201)
    ).body;
    const moved = (await tech.patch(`/api/jobs/${job.id}`).send({ harnessId: plain.id }).expect(200)).body;
    expect(moved.parts.map((p: { slot: string | null }) => p.slot)).toEqual([null, null, null, null]);
    expect(moved.slots.map((s: { key: string }) => s.key)).toContain('neck.toneC');
    expect(harness.id).not.toBe(plain.id);
  });

  test('a whole-instrument design: a measured capacitor in the neck tone slot moves the neck curves as the engine says', async () => {
    const tech = await t.as('tech');
    const design = {
      layout: 'two-pickups-3way',
      selector: 0,
      options: { toneNetwork: 'plain' },
      knobs: { 'neck.tone': 3 },
      values: {},
    };
    const harness = (
      await tech
        .post('/api/harnesses')
        .send({ name: `Two ${uid()}`, ...design })
        .expect(201)
    ).body;
    const job = (await tech.post('/api/jobs').send({ customer: 'L. Example', instrument: 'Two-pickup', harnessId: harness.id }).expect(201))
      .body;
    const cap = await part(tech, { kind: 'capacitor', label: `CAP-L-${uid()}`, nominal: 100e-9, tolerancePct: 10 });
    await tech.post(`/api/parts/${cap.id}/readings`).send({ quantity: 'capacitance', value: 98.2e-9 }).expect(201);
    await install(tech, job.id, cap.id, 'neck tone cap');
    const wrongSlot = await assign(tech, job.id, cap.id, 'neck.toneR');
    expect(wrongSlot.status).toBe(422);
    expect(wrongSlot.body.error.fields.slot).toMatch(/Neck: tone pot \(neck\.toneR\) takes a pot, not a capacitor/);
    await assign(tech, job.id, cap.id, 'neck.toneC').expect(200);
    const report = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body;
    expect(report.text).toMatch(new RegExp(`Neck: tone capacitor: ${cap.label}: measured capacitance 98\\.2 nF`));
    expect(report.text).toMatch(/Bridge: tone capacitor: no part assigned, typical values used/);
    // The engine on the same layout with the measured value (the layout's own netlist builder here:
    // this layout has no preset form).
    const layout = getLayout('two-pickups-3way')!;
    const { config } = resolveLayoutConfig(layout, { ...design, values: { 'neck.toneC': 98.2e-9 } });
    const cols = columns(report.csv);
    const f = cols.frequency_hz!;
    for (const v of [10, 6, 2]) {
      const expected = simulateInstrument(
        buildLayoutNetlist(layout, config),
        { ...layoutKnobs(layout, design.knobs), 'neck.volume': v },
        f,
      ).magnitudeDb;
      cols[`volume_${v}_db`]!.forEach((got, k) => expect(Math.abs(got - expected[k]!)).toBeLessThan(2e-3));
    }
  });

  test('the preview is exactly the message sent: subject, text and attachments', async () => {
    const tech = await t.as('tech');
    const { job } = await bleedJob(tech);
    const cap = await part(tech, { kind: 'capacitor', label: `CAP-P-${uid()}`, nominal: 22e-9, tolerancePct: 10 });
    await tech.post(`/api/parts/${cap.id}/readings`).send({ quantity: 'capacitance', value: 21.7e-9 }).expect(201);
    await install(tech, job.id, cap.id, 'tone cap');
    await assign(tech, job.id, cap.id, 'toneC').expect(200);
    const message = 'Thanks for waiting.\nThe bleed keeps the treble as the volume comes down.';
    const preview = (await tech.get(`/api/jobs/${job.id}/report`).query({ message }).expect(200)).body;
    expect(preview.to).toBe('q.example@lugbook.test');
    expect(preview.text).toContain(message);
    expect(preview.attachments).toEqual([
      { filename: `${job.code}-predicted-curves.csv`, contentType: 'text/csv', size: Buffer.byteLength(preview.csv) },
    ]);
    await tech.post(`/api/jobs/${job.id}/report`).send({ message }).expect(200);
    const sent = t.ctx.sqlite
      .prepare('select id, subject, text, "to" from outbox where topic = \'customer-report\' order by id desc')
      .get() as {
      id: number;
      subject: string;
      text: string;
      to: string;
    };
    expect(sent.text).toBe(preview.text);
    expect(sent.subject).toBe(preview.subject);
    expect(sent.to).toBe(preview.to);
    const files = t.ctx.sqlite
      .prepare('select filename, content_type as contentType, size, content from outbox_attachments where message_id = ?')
      .all(sent.id) as { filename: string; contentType: string; size: number; content: Buffer }[];
    expect(files.map(({ content: _, ...f }) => f)).toEqual(preview.attachments);
    expect(files[0]!.content.toString('utf8')).toBe(preview.csv);
  });
});
