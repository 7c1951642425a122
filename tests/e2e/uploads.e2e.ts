// The one column-mapping step on both upload screens, and a lot judged −20 %/+80 % (IEC 60062 Z).
// Set LUGBOOK_SHOTS_DIR to keep a screenshot of the mapping step of each upload kind and of the Z lot.
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import { launchBrowser, signIn, watchedPage } from './browser';

const baseUrl = inject('baseUrl');
const password = inject('demoPassword');
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function shot(page: Page, name: string): Promise<void> {
  const dir = process.env.LUGBOOK_SHOTS_DIR;
  if (!dir) return;
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}

/** A lot made through the API from inside the signed-in page. */
async function createLot(page: Page, body: Record<string, unknown>): Promise<{ id: number }> {
  return page.evaluate(async (b) => {
    const res = await fetch('/api/lots', { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(b) });
    return res.json();
  }, body);
}

test('a lot file whose value column gives no unit opens the mapping step; with nF chosen it is stored and the unused column listed', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  const lot = await createLot(page, { kind: 'capacitor', marking: '473J', code: 'E2E-MAP-1' });
  await page.goto(`${baseUrl}/lots/${lot.id}`);
  await page.getByLabel('Meter export (CSV or TSV)').setInputFiles({
    name: 'meter.csv',
    mimeType: 'text/csv',
    buffer: Buffer.from('Item,C,Operator\n1,47.1,ab\n2,46.8,ab\n3,47.4,cd\n'),
  });
  await page.getByRole('button', { name: 'Upload', exact: true }).click();
  const step = page.getByTestId('column-mapping');
  await step.waitFor();
  expect(await step.textContent()).toMatch(/"C" names no unit/);
  await shot(page, 'mapping-step-lot');
  // Not sent without a unit
  await step.getByRole('button', { name: 'Read the file with these columns' }).click();
  await step.getByText('Choose the unit the value is written in.').waitFor();
  await step.getByLabel('Unit of value').selectOption('nF');
  await step.getByRole('button', { name: 'Read the file with these columns' }).click();
  const done = page.getByText(/Stored 3 readings/);
  await done.waitFor();
  const status = page.getByRole('status').filter({ hasText: 'Stored 3 readings' });
  expect(await status.textContent()).toMatch(/Columns not used: “Operator”/);
  const detail = await page.evaluate(async (id) => (await fetch(`/api/lots/${id}`)).json(), lot.id);
  expect(detail.stats.n).toBe(3);
  expect(detail.stats.mean).toBeCloseTo(47.1e-9, 18);
  // The first upload was answered 422 (needs_mapping) on purpose.
  watched.expectNoProblems([/status of 422/]);
  await watched.close();
});

test('a sweep whose headers are not recognised opens the same mapping step and is fitted with the chosen columns', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/parts?q=POT-007`);
  await page.getByRole('link', { name: 'POT-007' }).click();
  const samples = new URL('../../samples/', import.meta.url).pathname;
  // The sample audio sweep with its headers renamed to words the reader does not know.
  const [head, ...rows] = fs.readFileSync(`${samples}pot-500k-audio-sweep.csv`, 'utf8').split('\n');
  const preamble: string[] = [];
  const body = [head!, ...rows];
  while (body[0]!.startsWith('#')) preamble.push(body.shift()!);
  const columns = body[0]!.split(',').length;
  body[0] = ['Winkel', 'Widerstand', 'Spalte3', 'Spalte4'].slice(0, columns).join(',');
  await page
    .getByLabel('Sweep file (CSV)')
    .setInputFiles({ name: 'renamed.csv', mimeType: 'text/csv', buffer: Buffer.from([...preamble, ...body].join('\n')) });
  await page.getByRole('button', { name: 'Upload and fit' }).click();
  const step = page.getByTestId('column-mapping');
  await step.waitFor();
  await shot(page, 'mapping-step-sweep');
  await step.getByLabel('Unit of rotation').selectOption('deg');
  // The sample gives kΩ; the renamed header no longer says so.
  await step.getByLabel('Unit of resistance lug 1 to wiper').selectOption('kΩ');
  await step.getByRole('button', { name: 'Read the file with these columns' }).click();
  const law = page.locator('dt', { hasText: /^Law$/ }).first().locator('xpath=following-sibling::dd[1]');
  await law.waitFor({ timeout: 20_000 });
  expect(await law.textContent()).toMatch(/audio/i);
  watched.expectNoProblems([/status of 422/]);
  await watched.close();
});

test('a 104Z lot is shown −20 %/+80 %, with limits 80 nF … 180 nF and Cp/Cpk explained', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'qa@lugbook.test', password);
  const lot = await createLot(page, { kind: 'capacitor', marking: '104Z', code: 'E2E-Z-1' });
  const values = [79, 84, 95, 102, 110, 118, 124, 130, 137, 150, 158, 165, 176, 181];
  const csv = `Item,C (nF)\n${values.map((v, i) => `${i + 1},${v}`).join('\n')}\n`;
  const status = await page.evaluate(
    async ({ id, text }) => {
      const form = new FormData();
      form.set('file', new File([text], 'z.csv', { type: 'text/csv' }));
      return (await fetch(`/api/lots/${id}/readings`, { method: 'POST', body: form })).status;
    },
    { id: lot.id, text: csv },
  );
  expect(status).toBe(201);
  await page.goto(`${baseUrl}/lots/${lot.id}`);
  const note = page.getByTestId('asymmetric-capability');
  await note.waitFor();
  expect(await note.textContent()).toMatch(/−20 %\/\+80 %/);
  expect(await note.textContent()).toMatch(/130 nF/);
  expect(await page.locator('main').textContent()).toMatch(/100 nF\s*−20 %\/\+80 %/);
  const limits = page.locator('dt', { hasText: /^Limits$/ }).locator('xpath=following-sibling::dd[1]');
  expect(await limits.textContent()).toMatch(/80(\.0+)?\s*nF … 180(\.0+)?\s*nF/);
  const detail = await page.evaluate(async (id) => (await fetch(`/api/lots/${id}`)).json(), lot.id);
  expect([detail.stats.countBelow, detail.stats.countAbove]).toEqual([1, 1]);
  await shot(page, 'lot-z-asymmetric');
  watched.expectNoProblems();
  await watched.close();
});
