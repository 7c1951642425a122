// Labels in any case: look-up ignores case, new labels are unique regardless of case, and labels
// that already differ only in case are listed (never renamed) and answer 409 naming both parts.
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createContext } from '@server/bootstrap';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('part labels in any case', () => {
  test('look-up ignores case; a label differing only in case is refused on create and on rename', async () => {
    const tech = await t.as('tech');
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-CASE-5', nominal: 500e3, tolerancePct: 20 }).expect(201))
      .body;
    const found = await tech.get('/api/parts/by-label/pot-case-5');
    expect(found.status).toBe(200);
    expect(found.body.id).toBe(pot.id);
    expect((await tech.get('/api/parts/by-label/Pot-Case-5')).body.id).toBe(pot.id);
    expect((await tech.get('/api/parts/by-label/pot-case-6')).status).toBe(404);

    const dup = await tech.post('/api/parts').send({ kind: 'pot', label: 'pot-case-5', nominal: 500e3 });
    expect(dup.status).toBe(409);
    expect(dup.body.error.message).toMatch(/POT-CASE-5/);
    const other = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-CASE-7', nominal: 250e3 }).expect(201)).body;
    const rename = await tech.patch(`/api/parts/${other.id}`).send({ label: 'Pot-Case-5' });
    expect(rename.status).toBe(409);
    // Changing only the case of a part's own label is allowed.
    expect((await tech.patch(`/api/parts/${other.id}`).send({ label: 'pot-case-7' })).status).toBe(200);
  });

  test('labels that already differ only in case are kept, listed at start and on Team, and a look-up names both parts', async () => {
    // As an older database could hold them: written past the API (the unique index compares case).
    t.ctx.sqlite
      .prepare(
        "insert into parts (kind, label, status, created_at) values ('resistor', 'RES-OLD-9', 'incoming', 1), ('resistor', 'res-old-9', 'incoming', 2)",
      )
      .run();
    const ids = t.ctx.sqlite.prepare("select id, label from parts where lower(label) = 'res-old-9' order by id").all() as {
      id: number;
      label: string;
    }[];
    expect(ids.map((r) => r.label)).toEqual(['RES-OLD-9', 'res-old-9']);

    const tech = await t.as('tech');
    const clash = await tech.get('/api/parts/by-label/Res-Old-9');
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toContain('RES-OLD-9');
    expect(clash.body.error.message).toContain('res-old-9');
    expect(clash.body.error.details.parts.map((p: { id: number }) => p.id)).toEqual(ids.map((r) => r.id));

    const admin = await t.as('admin');
    const listed = await admin.get('/api/team/label-clashes');
    expect(listed.status).toBe(200);
    expect(listed.body.clashes).toEqual([{ key: 'res-old-9', parts: ids }]);
    expect((await tech.get('/api/team/label-clashes')).status).toBe(403);

    // Opening the database again (migrations run, as at start) renames nothing and logs the clash.
    const logs: string[] = [];
    const again = createContext({
      dbFile: path.join(t.dataDir, 'lugbook.db'),
      uploadsDir: path.join(t.dataDir, 'uploads'),
      log: (m) => logs.push(m),
    });
    again.sqlite.close();
    expect(logs.filter((l) => /differ only in case/.test(l))).toEqual([
      expect.stringMatching(/RES-OLD-9 \(id \d+\), res-old-9 \(id \d+\)/),
    ]);
    expect(
      (t.ctx.sqlite.prepare("select label from parts where lower(label) = 'res-old-9' order by id").all() as { label: string }[]).map(
        (r) => r.label,
      ),
    ).toEqual(['RES-OLD-9', 'res-old-9']);
  });
});
