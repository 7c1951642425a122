import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('parts', () => {
  test('a tech creates a part and finds it in the list; the audit log records it', async () => {
    const tech = await t.as('tech');
    const res = await tech
      .post('/api/parts')
      .send({ kind: 'pot', label: 'POT-NEW-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ id: expect.any(Number), label: 'POT-NEW-1', nominal: 500e3, status: 'incoming' });
    const list = await tech.get('/api/parts').query({ q: 'POT-NEW' });
    expect(list.status).toBe(200);
    expect(list.body.parts.map((p: { label: string }) => p.label)).toEqual(['POT-NEW-1']);
    const admin = await t.as('admin');
    const audit = await admin.get('/api/audit');
    expect(
      audit.body.entries.find(
        (e: { action: string; entityId: string }) => e.action === 'part.create' && e.entityId === String(res.body.id),
      ),
    ).toBeTruthy();
  });

  test('a duplicate label is a 409; a bad nominal is a 422 naming the field', async () => {
    const tech = await t.as('tech');
    await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-DUP', nominal: 22e-9 }).expect(201);
    const dup = await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-DUP', nominal: 22e-9 });
    expect(dup.status).toBe(409);
    const bad = await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-BAD', nominal: -1 });
    expect(bad.status).toBe(422);
    expect(bad.body.error.fields).toHaveProperty('nominal');
  });

  test('a viewer is refused (403) before validation, whatever it sends', async () => {
    const viewer = await t.as('viewer');
    expect((await viewer.post('/api/parts').send({ kind: 'pot', label: 'X', nominal: 1 })).status).toBe(403);
    expect((await viewer.post('/api/parts').send({ nonsense: true })).status).toBe(403);
    expect((await viewer.get('/api/parts')).status).toBe(200);
  });

  test('edit and retire keep the status history and the audit trail', async () => {
    const tech = await t.as('tech');
    const created = (await tech.post('/api/parts').send({ kind: 'resistor', label: 'RES-EDIT', nominal: 150e3, tolerancePct: 1 })).body;
    const edited = await tech.patch(`/api/parts/${created.id}`).send({ nominal: 160e3, notes: 'remeasured' });
    expect(edited.status).toBe(200);
    expect(edited.body.nominal).toBe(160e3);
    const retired = await tech.patch(`/api/parts/${created.id}`).send({ status: 'retired', statusReason: 'lead broken' });
    expect(retired.body.status).toBe('retired');
    const detail = await tech.get(`/api/parts/${created.id}`);
    expect(detail.body.statusHistory.map((e: { toStatus: string }) => e.toStatus)).toEqual(['incoming', 'retired']);
    expect((await tech.get('/api/parts/999999')).status).toBe(404);
  });
});

test('a nominal outside the physical range of its kind is refused naming the field (ranges.ts, common practice)', async () => {
  const tech = await t.as('tech');
  // 22 mF read from a bare "22" typed as farads is no film capacitor; 1 GΩ is no pot.
  const cap = await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-RANGE', nominal: 22 });
  expect(cap.status).toBe(422);
  expect(cap.body.error.fields).toHaveProperty(['nominal']);
  const pot = await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-RANGE', nominal: 1e9 });
  expect(pot.status).toBe(422);
  expect(pot.body.error.fields.nominal).toMatch(/1 mΩ to 100 MΩ/);
  expect((await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-RANGE', nominal: 4.7e-3 })).status).toBe(201);
});
