// Foundation issue: a tech signs in, creates a part and sees it listed; a viewer finds no way to
// create one, and the server refuses the viewer's hand-made request.
import type { Browser } from 'playwright-core';
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

test('a tech creates a part in the browser and finds it in the list', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  expect(new URL(page.url()).pathname).toBe('/bench');
  await page.goto(`${baseUrl}/parts`);
  await page.getByRole('button', { name: 'New part' }).click();
  await page.getByLabel('Kind').first().selectOption('pot');
  await page.getByLabel('Label').fill('E2E-POT-1');
  await page.getByLabel('Nominal').fill('500k');
  await page.getByLabel('Tolerance (%)').fill('20');
  await page.getByRole('button', { name: 'Save part' }).click();
  await page.getByText('Saved').waitFor();
  await page.getByRole('button', { name: 'Close' }).click();
  await page.getByLabel('Search').fill('E2E-POT');
  const row = page.getByRole('row', { name: /E2E-POT-1/ });
  await row.waitFor();
  expect(await row.textContent()).toMatch(/500\s*kΩ/);
  watched.expectNoProblems();
  await watched.close();
});

test('a viewer sees no way to create a part, and the server refuses one sent by hand', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'viewer@lugbook.test', password);
  expect(new URL(page.url()).pathname).toBe('/compare');
  await page.goto(`${baseUrl}/parts`);
  await page.getByRole('table').waitFor();
  expect(await page.getByRole('button', { name: 'New part' }).count()).toBe(0);
  const status = await page.evaluate(async () => {
    const res = await fetch('/api/parts', {
      method: 'POST',
      headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ kind: 'pot', label: 'BY-HAND', nominal: 1000 }),
    });
    return res.status;
  });
  expect(status).toBe(403);
  // the browser logs the refused request (403, asked for on purpose); nothing else may appear
  watched.expectNoProblems([/status of 403/]);
  await watched.close();
});
