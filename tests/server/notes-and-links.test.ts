// Saved comparisons keep notes; a production server with the default PUBLIC_URL warns at start.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { startupWarnings } from '@server/env';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('saved comparison notes', () => {
  test('notes are saved, changed with PATCH, cleared, and limited in length', async () => {
    const tech = await t.as('tech');
    const created = await tech
      .post('/api/comparisons')
      .send({ name: 'Noted', selection: {}, notes: 'Supplier B runs 5 % low at mid-rotation.' });
    expect(created.status).toBe(201);
    expect(created.body.notes).toBe('Supplier B runs 5 % low at mid-rotation.');
    const changed = await tech.patch(`/api/comparisons/${created.body.id}`).send({ notes: 'Checked again with the second meter.' });
    expect(changed.status).toBe(200);
    expect((await tech.get(`/api/comparisons/${created.body.id}`)).body.notes).toBe('Checked again with the second meter.');
    expect((await tech.patch(`/api/comparisons/${created.body.id}`).send({ notes: '' })).body.notes).toBeNull();
    const long = await tech.patch(`/api/comparisons/${created.body.id}`).send({ notes: 'x'.repeat(4001) });
    expect(long.status).toBe(422);
    expect(long.body.error.fields).toHaveProperty('notes');
  });
});

describe('PUBLIC_URL', () => {
  test('production with the default PUBLIC_URL warns; a set address or development does not', () => {
    expect(startupWarnings({ NODE_ENV: 'production' })).toEqual([expect.stringMatching(/PUBLIC_URL/)]);
    expect(startupWarnings({ NODE_ENV: 'production', PUBLIC_URL: 'http://localhost:3000' })).toHaveLength(1);
    expect(startupWarnings({ NODE_ENV: 'production', PUBLIC_URL: 'https://bench.example.org' })).toEqual([]);
    expect(startupWarnings({ NODE_ENV: 'development' })).toEqual([]);
  });
});
