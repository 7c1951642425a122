// The day's other screens in a real browser, on the seeded demo workshop: the numbers a person
// reads there are compared with the API's answer or with the shared engine run here on the same
// design. Every page fails its test on a console error, a page error or server stderr
// (watchedPage in browser.ts).
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import { simulate } from '@shared/circuit/metrics';
import { DEFAULT_HARNESS_VALUES, getPreset } from '@shared/circuit/presets';
import { formatDb } from '@/features/harness/components/harness-format';
import { fmtLotValue } from '@/features/lots/components/lot-format';
import { pct } from '@/features/compare/components/compare-model';
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

test('QA opens the 100,000-item demo lot and reads its statistics and histogram', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'qa@lugbook.test', password);
  expect(new URL(page.url()).pathname).toBe('/lots');
  await page
    .getByRole('link', { name: /C-2611-223K-BULK/ })
    .first()
    .click();
  const dd = (term: string | RegExp) => page.locator('dt', { hasText: term }).first().locator('xpath=following-sibling::dd[1]');
  const n = dd('Readings (n)');
  await n.waitFor({ timeout: 30_000 });
  expect((await n.textContent())?.replace(/\D/g, '')).toBe('100000');
  // The same lot from the API: the screen shows its n, mean, SD and Cpk.
  const id = /\/lots\/([^/?#]+)/.exec(new URL(page.url()).pathname)![1]!;
  const lot = await page.evaluate(async (lotId) => (await fetch(`/api/lots/${lotId}`)).json(), id);
  const stats = lot.stats as { n: number; mean: number; sd: number; cpk: number | null };
  expect(stats.n).toBe(100000);
  expect(await dd('Mean').textContent()).toMatch(new RegExp(`^${escapeRe(fmtLotValue(stats.mean, lot.unit))}`));
  expect(await dd('Std deviation').textContent()).toMatch(new RegExp(`^${escapeRe(fmtLotValue(stats.sd, lot.unit, 3))}`));
  expect(stats.cpk).not.toBeNull();
  expect((await dd(/^Cpk/).textContent())?.trim()).toBe(stats.cpk!.toFixed(2));
  expect(await page.locator('canvas').count()).toBeGreaterThan(0);
  watched.expectNoProblems();
  await watched.close();
});

test('a tech turns the volume knob on the Harness screen and the figures follow', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/harness`);
  const level = page.locator('th', { hasText: 'Level at 1 kHz' }).first().locator('xpath=following-sibling::td[1]');
  await level.waitFor();
  // The screen opens on the independent-tone preset with the default values, both knobs at 10.
  const design = getPreset('independent-tone')!.build(DEFAULT_HARNESS_VALUES);
  const expected = (volume: number) => formatDb(simulate(design, { volume, tone: 10 }).metrics.level1kDb);
  await expect.poll(() => level.textContent(), { timeout: 10_000 }).toBe(expected(10));
  const volume = page.getByRole('slider', { name: 'Volume knob' }).first();
  await volume.focus();
  for (let i = 0; i < 30; i++) await page.keyboard.press('ArrowLeft');
  await expect.poll(() => volume.inputValue(), { timeout: 10_000 }).toBe('7');
  expect(expected(7)).not.toBe(expected(10));
  await expect.poll(() => level.textContent(), { timeout: 10_000 }).toBe(expected(7));
  watched.expectNoProblems();
  await watched.close();
});

test('a viewer opens Compare and sees the demo pots overlaid by lot', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  const answers: { groups: { partIds: number[]; m: { mean: number; sd: number } | null }[] }[] = [];
  page.on('response', (r) => {
    if (r.request().method() === 'POST' && new URL(r.url()).pathname === '/api/compare/tapers') void r.json().then((b) => answers.push(b));
  });
  await signIn(page, baseUrl, 'viewer@lugbook.test', password);
  await page.getByText(/Comparing\s+\d+\s+pots in\s+3/).waitFor({ timeout: 30_000 });
  expect(await page.locator('canvas').count()).toBeGreaterThanOrEqual(2);
  // The group table shows each group's pot count and m mean and SD as the API answered them.
  await expect.poll(() => answers.length, { timeout: 10_000 }).toBeGreaterThan(0);
  const groups = answers.at(-1)!.groups;
  expect(groups).toHaveLength(3);
  const rows = page.locator('table', { has: page.locator('caption', { hasText: 'fitted mid-rotation value m' }) }).locator('tbody tr');
  await expect.poll(() => rows.count(), { timeout: 10_000 }).toBe(3);
  for (let i = 0; i < groups.length; i++) {
    const cells = rows.nth(i).locator('td');
    const g = groups[i]!;
    expect(g.m).not.toBeNull();
    expect((await cells.nth(0).textContent())?.trim()).toBe(String(g.partIds.length));
    expect((await cells.nth(1).textContent())?.trim()).toBe(pct(g.m!.mean));
    expect((await cells.nth(2).textContent())?.trim()).toBe(pct(g.m!.sd, 2));
  }
  watched.expectNoProblems();
  await watched.close();
});

test('at the bench a tech finds a pot by label, sees the verdict while typing, and saves it with the keyboard', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.getByLabel('Label or scanned code').fill('POT-005');
  await page.keyboard.press('Enter');
  const value = page.getByLabel('Value (Ω)');
  await value.waitFor();
  await value.fill('700k');
  // 700 kΩ against 500 kΩ ±20 %: outside the limit whatever the meter's accuracy.
  await page.getByText('Verdict as typed').waitFor();
  await expect.poll(() => page.getByText(/700 kΩ is 40 % over nominal 500 kΩ/).count(), { timeout: 10_000 }).toBeGreaterThan(0);
  await value.press('Enter');
  await page.getByText(/server verdict/).waitFor();
  const saved = page.getByRole('status').filter({ hasText: 'server verdict' });
  expect(await saved.textContent()).toMatch(/fail/i);
  watched.expectNoProblems();
  await watched.close();
});

test('a tech uploads the sample pot sweep on a part page and reads the fitted law; the broken sample is refused row by row', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/parts?q=POT-007`);
  await page.getByRole('link', { name: 'POT-007' }).click();
  const samples = new URL('../../samples/', import.meta.url).pathname;
  await page.getByLabel('Sweep file (CSV)').setInputFiles(`${samples}broken-sweep.csv`);
  await page.getByRole('button', { name: 'Upload and fit' }).click();
  await page
    .getByText(/was refused/)
    .first()
    .waitFor();
  expect(await page.getByText(/Line \d+, column/).count()).toBeGreaterThanOrEqual(3);
  await page.getByLabel('Sweep file (CSV)').setInputFiles(`${samples}pot-500k-audio-sweep.csv`);
  await page.getByRole('button', { name: 'Upload and fit' }).click();
  const law = page.locator('dt', { hasText: /^Law$/ }).first().locator('xpath=following-sibling::dd[1]');
  await law.waitFor({ timeout: 20_000 });
  expect(await law.textContent()).toMatch(/audio/i);
  expect(await page.locator('canvas').count()).toBeGreaterThan(0);
  // The refused upload is answered 422 on purpose; the browser logs that response, nothing else may appear.
  watched.expectNoProblems([/status of 422/]);
  await watched.close();
});

/** A string as a literal inside a regular expression. */
function escapeRe(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
