import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { coilImpedance, fitCoil } from '@shared/analysis/coil';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { fitTaper } from '@shared/analysis/taper';
import { taperLawValue } from '@shared/taper/law';
import { createTestApp, type TestApp } from '../support/app';
import { withPoolRefusing } from '../support/pool-refusing';

let t: TestApp;
let potId: number;
let pickupId: number;
beforeAll(async () => {
  t = await createTestApp();
  const tech = await t.as('tech');
  potId = (
    await tech
      .post('/api/parts')
      .send({ kind: 'pot', label: 'POT-SW-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
      .expect(201)
  ).body.id;
  pickupId = (await tech.post('/api/parts').send({ kind: 'pickup', label: 'PU-SW-1', nominal: 7.8e3, tolerancePct: 8 }).expect(201)).body
    .id;
});
afterAll(() => t.close());

function potCsv(endOhms = 300): string {
  const lines = ['Rotation (deg),R (kOhm)'];
  for (let deg = 0; deg <= 300; deg += 10)
    lines.push(`${deg},${((490e3 * taperLawValue('audio', 0.15, deg / 300) + endOhms) / 1e3).toFixed(4)}`);
  return lines.join('\n') + '\n';
}

function coilCsv(): string {
  const lines = ['Freq (Hz),Re (ohm),Im (ohm)'];
  for (let i = 0; i < 120; i++) {
    const f = 20 * Math.pow(1000, i / 119);
    const z = coilImpedance({ R: 7800, L: 4.3, C: 130e-12 }, f);
    lines.push(`${f.toPrecision(8)},${z.re.toPrecision(10)},${z.im.toPrecision(10)}`);
  }
  return lines.join('\n');
}

function snapshot() {
  const count = (table: string) => (t.ctx.sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
  const files = fs.existsSync(t.ctx.config.uploadsDir) ? fs.readdirSync(t.ctx.config.uploadsDir, { recursive: true }).length : 0;
  return {
    sweeps: count('sweeps'),
    points: count('sweep_points'),
    fits: count('fits'),
    attachments: count('attachments'),
    audit: count('audit_log'),
    files,
  };
}

async function upload(partId: number, kind: string, content: string | Buffer, name = 'sweep.csv') {
  const tech = await t.as('tech');
  return tech
    .post(`/api/parts/${partId}/sweeps`)
    .field('kind', kind)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), name);
}

describe('sweep uploads', () => {
  test('a pot rotation sweep is stored with its taper fit, equal to the engine on the same points', async () => {
    const stored = () =>
      fs.existsSync(t.ctx.config.uploadsDir)
        ? fs
            .readdirSync(t.ctx.config.uploadsDir, { recursive: true, encoding: 'utf8' })
            .filter((f) => /^[0-9a-f]{2}\/[0-9a-f]{64}$/.test(f))
        : [];
    const content = potCsv();
    const res = await upload(potId, 'taper', content);
    expect(res.status).toBe(201);
    expect(res.body.pointCount).toBe(31);
    expect(res.body.fit.kind).toBe('taper');
    expect(res.body.fit.engineVersion).toMatch(/^analysis-/);
    const engine = fitTaper({
      points: res.body.points,
      rotationUnit: 'percent',
      nominal: 500e3,
      tolerancePct: 20,
      profile: { law: 'audio-any', mMin: 0.08, mMax: 0.2, maxEndResistance: 500 },
    });
    expect(res.body.fit.result).toEqual(JSON.parse(JSON.stringify(engine)));
    expect(res.body.fit.result.law).toBe('audio');
    expect(res.body.part.status).toBe('passed');
    // the upload is stored under its content hash (another test may have stored the same bytes first)
    const sha = crypto.createHash('sha256').update(content).digest('hex');
    expect(stored()).toContain(`${sha.slice(0, 2)}/${sha}`);
  });

  test('a coil impedance sweep gets the coil fit; a refit keeps the old fit as history', async () => {
    const res = await upload(pickupId, 'impedance', coilCsv());
    expect(res.status).toBe(201);
    expect(res.body.fit.result.L / 4.3).toBeCloseTo(1, 3);
    expect(res.body.fit.result.C / 130e-12).toBeCloseTo(1, 3);
    expect(res.body.fit.result.L).toBeCloseTo(fitCoil({ points: res.body.points, withRp: 'auto' }).L, 9);
    const tech = await t.as('tech');
    await tech.post(`/api/parts/${pickupId}/sweeps/${res.body.id}/refit`).expect(200);
    const fits = (await tech.get(`/api/parts/${pickupId}/fits`)).body.fits;
    expect(fits).toHaveLength(2);
    expect(fits.filter((f: { supersededAt: number | null }) => f.supersededAt !== null)).toHaveLength(1);
  });

  test('a viewer can read sweeps and fits but not upload', async () => {
    // this test's own pot and sweep, so it passes alone and in any order
    const tech = await t.as('tech');
    const ownPot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-SW-VIEW', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body.id;
    expect((await upload(ownPot, 'taper', potCsv(310))).status).toBe(201);
    const viewer = await t.as('viewer');
    expect((await viewer.get(`/api/parts/${ownPot}/sweeps`)).body.sweeps[0].fit.kind).toBe('taper');
    expect((await viewer.get(`/api/parts/${ownPot}/fits`)).status).toBe(200);
    const res = await viewer.post(`/api/parts/${potId}/sweeps`).field('kind', 'taper').attach('file', Buffer.from(potCsv()), 'sweep.csv');
    expect(res.status).toBe(403);
  });

  const header = 'Rotation (deg),R (kOhm)';
  const good = (n: number) => Array.from({ length: n }, (_, i) => `${i * 30},${(i * 50 + 0.3).toFixed(1)}`);
  const malformed: { name: string; kind?: string; content: string | Buffer; file?: string; status: number; mentions: RegExp }[] = [
    {
      name: 'text in a number column',
      content: [header, ...good(5), '180,12k7x', ...good(3).slice(1)].join('\n'),
      status: 422,
      mentions: /line 7.*R \(kOhm\)|R \(kOhm\).*line 7/i,
    },
    {
      name: 'negative resistance',
      content: [header, '0,0.3', '30,5', '60,-12', '90,20'].join('\n'),
      status: 422,
      mentions: /Line 4, column \\"R \(kOhm\)\\": -12 is negative/,
    },
    {
      name: 'duplicate rotation points',
      content: [header, '0,0.3', '30,5', '30,6', '90,20'].join('\n'),
      status: 422,
      mentions: /Line 4, column \\"Rotation \(deg\)\\": the rotation 30° appears twice/,
    },
    {
      name: 'missing column',
      content: ['Rotation (deg)', '0', '30', '60', '90'].join('\n'),
      status: 422,
      mentions: /No header line found: expected a line of column names/,
    },
    {
      name: 'wrong delimiter mix',
      content: [header, '0;0,3', '30;5', '60;12', '90;20'].join('\n'),
      status: 422,
      mentions: /rows of numbers \(from line 2\).*at least two columns/,
    },
    {
      name: 'a binary file named .csv',
      content: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 8, 0, 0, 1, 2, 3, 0, 0, 0]),
      status: 415,
      mentions: /named \.csv but its content is not a CSV file/,
    },
    { name: 'an empty file', content: '', status: 422, mentions: /"file":"The file is empty/ },
    { name: 'a header only', content: header + '\n', status: 422, mentions: /header \(line 1\) but no data rows; at least 3/ },
    { name: 'one data row', content: [header, '0,0.3'].join('\n'), status: 422, mentions: /only 1 data row; at least 3/ },
    {
      name: 'ragged rows',
      content: [header, '0,0.3', '30,5,7', '60,12', '90,20'].join('\n'),
      status: 422,
      mentions: /Line 3: the row has 3 cells, but the header \(line 1\) has 2/,
    },
    {
      name: 'rotation beyond a full turn',
      content: [header, '0,0.3', '100,5', '200,12', '900,20'].join('\n'),
      status: 422,
      mentions: /Line 5, column \\"Rotation \(deg\)\\": 900° is outside/,
    },
    { name: 'a spreadsheet file', content: 'PK', file: 'sweep.xlsx', status: 415, mentions: /\.xlsx.*not accepted/ },
    { name: 'no file extension', content: potCsv(), file: 'sweep', status: 415, mentions: /not accepted here; use \.csv/ },
    { name: 'an unknown sweep kind', kind: 'spectrum', content: potCsv(), status: 422, mentions: /"fields":\{"kind":"Invalid option/ },
    {
      name: 'unrecognised headers (needs a column mapping)',
      content: ['alpha,beta', ...good(5)].join('\n'),
      status: 422,
      mentions: /columns of this file were not recognised.*Line 1: no column found for the rotation/,
    },
    { name: 'a taper sweep for a pickup', content: potCsv(), status: 422, mentions: /"kind":"This part is a pickup/ },
    {
      name: 'an impedance sweep with a zero frequency',
      kind: 'impedance',
      content: ['Freq (Hz),|Z| (ohm),Phase (deg)', '0,100,1', '10,200,2', '20,300,3', '40,400,4', '80,500,5'].join('\n'),
      status: 422,
      mentions: /Line 2, column \\"Freq \(Hz\)\\": 0 is not a frequency/,
    },
  ];

  test.each(malformed)('refused whole, leaving no rows and no files: $name', async ({ kind, content, file, status, mentions, name }) => {
    const before = snapshot();
    const target = name === 'a taper sweep for a pickup' ? pickupId : kind === 'impedance' ? pickupId : potId;
    const res = await upload(target, kind ?? 'taper', content, file);
    expect(res.status).toBe(status);
    expect(res.body.error.message.length).toBeGreaterThan(10);
    expect(JSON.stringify(res.body.error)).toMatch(mentions);
    expect(snapshot()).toEqual(before);
  });

  test('an oversized file is a 413 and leaves nothing behind', async () => {
    const before = snapshot();
    const big = header + '\n' + '1,1\n'.repeat(600_000);
    const res = await upload(potId, 'taper', big);
    expect(res.status).toBe(413);
    expect(snapshot()).toEqual(before);
  });

  test('a photo must really be an image; a real PNG is kept and served back', async () => {
    const tech = await t.as('tech');
    const fake = await tech
      .post(`/api/parts/${potId}/attachments`)
      .field('purpose', 'photo')
      .attach('file', Buffer.from('not an image'), 'meter.png');
    expect(fake.status).toBe(415);
    const png = Buffer.from(
      '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082',
      'hex',
    );
    const ok = await tech.post(`/api/parts/${potId}/attachments`).field('purpose', 'photo').attach('file', png, '../../etc/meter.png');
    expect(ok.status).toBe(201);
    // The client's path is never used: only the base name is kept, as a label.
    expect(ok.body.originalName).toBe('meter.png');
    expect(fs.existsSync(path.join(t.ctx.config.uploadsDir, ok.body.contentHash.slice(0, 2), ok.body.contentHash))).toBe(true);
    const back = await (await t.as('viewer')).get(`/api/attachments/${ok.body.id}/file`);
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
  });
});

describe("one taper sweep in every file style gives the clean file's fit", () => {
  // The same invented 500 kΩ audio pot (m = 0.15, 300° travel, 300 Ω at each end), written as a
  // bench exports it in several common styles (common practice).
  const degs = Array.from({ length: 31 }, (_, i) => i * 10);
  const r1w = (deg: number) => 300 + 499_400 * taperLawValue('audio', 0.15, deg / 300);
  const rw3 = (deg: number) => 500_000 - r1w(deg);
  const k = (ohms: number) => (ohms / 1e3).toFixed(4);
  const table = (rows: string[][], d: string, decimalComma = false) =>
    rows.map((r) => r.map((c) => (decimalComma ? c.replace('.', ',') : c)).join(d)).join('\n') + '\n';

  const clean = table(
    [['Rotation (deg)', 'R1-W (kOhm)', 'RW-3 (kOhm)', 'R13 (kOhm)'], ...degs.map((d) => [String(d), k(r1w(d)), k(rw3(d)), '500.0000'])],
    ',',
  );
  const styles: [string, string][] = [
    [
      'lug numbering with a units row (comma)',
      table(
        [
          ['Angle', 'R1-2', 'R2-3', 'R1-3'],
          ['deg', 'kOhm', 'kOhm', 'kOhm'],
          ...degs.map((d) => [String(d), k(r1w(d)), k(rw3(d)), '500.0000']),
        ],
        ',',
      ),
    ],
    [
      '1-W / W-3 headers, tab-separated',
      table(
        [['Angle (deg)', '1-W (kOhm)', 'W-3 (kOhm)', 'R13 (kOhm)'], ...degs.map((d) => [String(d), k(r1w(d)), k(rw3(d)), '500.0000'])],
        '\t',
      ),
    ],
    [
      'semicolons, decimal commas, units row',
      table(
        [
          ['Angle', 'R1-2', 'R2-3', 'R1-3'],
          ['deg', 'kOhm', 'kOhm', 'kOhm'],
          ...degs.map((d) => [String(d), k(r1w(d)), k(rw3(d)), '500.0000']),
        ],
        ';',
        true,
      ),
    ],
  ];

  let cleanFit: Record<string, unknown>;
  let pot: number;
  beforeAll(async () => {
    const tech = await t.as('tech');
    pot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-STYLES', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body.id;
    // A stale bench reading that the sweep must not be normalised by.
    expect((await tech.post(`/api/parts/${pot}/readings`).send({ quantity: 'resistance', value: 475e3 })).status).toBe(201);
    const res = await upload(pot, 'taper', clean);
    expect(res.status).toBe(201);
    cleanFit = res.body.fit.result;
    expect(cleanFit).toMatchObject({ law: 'audio', totalSource: 'sweep-r13', total: 500e3 });
    expect(res.body.ignoredColumns).toEqual([]);
  });

  test.each(styles)('%s', async (_name, text) => {
    const res = await upload(pot, 'taper', text);
    expect(res.status).toBe(201);
    expect(res.body.fit.result).toEqual(cleanFit);
    expect(res.body.ignoredColumns).toEqual([]);
  });

  test('a sweep without R13: R1W + RW3 give the same R13 and fit', async () => {
    const text = table([['Angle', 'R1-2', 'R2-3'], ['deg', 'kOhm', 'kOhm'], ...degs.map((d) => [String(d), k(r1w(d)), k(rw3(d))])], ',');
    const res = await upload(pot, 'taper', text);
    expect(res.status).toBe(201);
    expect(res.body.fit.result.totalSource).toBe('sweep-halves');
    expect(res.body.fit.result.total).toBeCloseTo(500e3, 6);
    expect(res.body.fit.result.law).toBe(cleanFit.law);
    expect(res.body.fit.result.m).toBeCloseTo(cleanFit.m as number, 9);
  });

  test('a column the reader does not use is listed back as ignored', async () => {
    const text = table([['Angle (deg)', 'R1-W (kOhm)', 'Temp (C)'], ...degs.map((d) => [String(d), k(r1w(d)), '21.5'])], ',');
    const res = await upload(pot, 'taper', text);
    expect(res.status).toBe(201);
    expect(res.body.ignoredColumns).toEqual(['Temp (C)']);
    expect(res.body.fit.result.totalSource).toBe('sweep-full-rotation');
  });
});

describe('refit on start', () => {
  test('a stored taper fit of an older engine version is refitted once; the old fit stays as history and the status says why', async () => {
    const tech = await t.as('tech');
    const pot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-REFIT', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body.id;
    const res = await upload(pot, 'taper', potCsv());
    expect(res.status).toBe(201);
    // Make the stored fit look like one an older engine made.
    t.ctx.sqlite.prepare(`update fits set engine_version = 'analysis-0.9.0' where id = ?`).run(res.body.fit.id);
    const { refitOutdatedTaperFits } = await import('@server/features/sweeps/refit-on-start');
    const first = refitOutdatedTaperFits(t.ctx.db);
    expect(first.refitted).toBeGreaterThanOrEqual(1);
    expect(refitOutdatedTaperFits(t.ctx.db).refitted).toBe(0); // once
    const fits = (await tech.get(`/api/parts/${pot}/fits`)).body.fits as { engineVersion: string; supersededAt: number | null }[];
    expect(fits.map((f) => f.engineVersion).sort()).toEqual(['analysis-0.9.0', ANALYSIS_ENGINE_VERSION].sort());
    expect(fits.find((f) => f.engineVersion === 'analysis-0.9.0')!.supersededAt).not.toBeNull();
    const part = (await tech.get(`/api/parts/${pot}`)).body;
    expect(part.statusReason).toMatch(
      new RegExp(`^refitted by engine version ${ANALYSIS_ENGINE_VERSION.replace(/\./g, '\\.')} \\(was analysis-0\\.9\\.0\\)`),
    );
  });
});

describe('Fit again with choices', () => {
  test('a forced taper law and the coil loss resistance off/on are honoured; the default is auto', async () => {
    const tech = await t.as('tech');
    const pot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-FORCE', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body.id;
    const sweep = await upload(pot, 'taper', potCsv());
    const forced = await tech.post(`/api/parts/${pot}/sweeps/${sweep.body.id}/refit`).send({ law: 'two-segment' });
    expect(forced.status).toBe(200);
    expect(forced.body.fit.result.law).toBe('two-segment');
    const again = await tech.post(`/api/parts/${pot}/sweeps/${sweep.body.id}/refit`).send({});
    expect(again.body.fit.result.law).toBe('audio');
    const pu = (await tech.post('/api/parts').send({ kind: 'pickup', label: 'PU-FORCE', nominal: 7.8e3, tolerancePct: 8 }).expect(201)).body
      .id;
    const coil = await upload(pu, 'impedance', coilCsv());
    const on = await tech.post(`/api/parts/${pu}/sweeps/${coil.body.id}/refit`).send({ withRp: true });
    expect(on.body.fit.result.Rp).not.toBeNull();
    const off = await tech.post(`/api/parts/${pu}/sweeps/${coil.body.id}/refit`).send({ withRp: false });
    expect(off.body.fit.result.Rp).toBeNull();
    expect((await tech.post(`/api/parts/${pu}/sweeps/${coil.body.id}/refit`).send({ withRp: 'sometimes' })).status).toBe(422);
  });
});

describe('the sweep routes work in the pool', () => {
  test('listing, uploading and refitting ask the pool, and write nothing when it refuses', async () => {
    const first = await upload(potId, 'taper', potCsv());
    expect(first.status).toBe(201);
    const before = snapshot();
    const { asked } = await withPoolRefusing(t.ctx.pool, async () => {
      const tech = await t.as('tech');
      expect((await tech.get(`/api/parts/${potId}/sweeps`)).status).toBe(503);
      expect((await upload(potId, 'taper', potCsv(500))).status).toBe(503);
      expect((await tech.post(`/api/parts/${potId}/sweeps/${first.body.id}/refit`).send({})).status).toBe(503);
      expect((await tech.get(`/api/parts/${potId}/fits`)).status).toBe(503);
    });
    expect(asked).toEqual(['partSweeps', 'sweepIngest', 'sweepRefit', 'partFits']);
    expect(snapshot()).toEqual(before);
    // From the worker: the list holds the upload with the points as the engine takes them.
    const list = await (await t.as('viewer')).get(`/api/parts/${potId}/sweeps`);
    expect(list.status).toBe(200);
    const listed = list.body.sweeps.find((s: { id: number }) => s.id === first.body.id);
    expect(listed.points).toEqual(first.body.points);
    expect(listed.fit.id).toBe(first.body.fit.id);
    // And the fits, newest first, the upload's among them as stored.
    const fits = (await (await t.as('viewer')).get(`/api/parts/${potId}/fits`)).body.fits as { id: number }[];
    expect(fits.map((f) => f.id)).toEqual([...fits.map((f) => f.id)].sort((a, b) => b - a));
    expect(fits.find((f) => f.id === first.body.fit.id)).toEqual(first.body.fit);
  });
});
