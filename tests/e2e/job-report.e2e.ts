// The job page: installed parts assigned to the design's slots with the keyboard alone; the report
// preview changes with them and is exactly what goes out; the Outbox lists the sent message's
// attachment and serves it back. Set LUGBOOK_SHOTS_DIR to keep screenshots of both screens.
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

async function shot(page: Page, name: string) {
  const dir = process.env.LUGBOOK_SHOTS_DIR;
  if (!dir) return;
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}

/** Waits until the preview was asked with the fields as they are (Send is enabled then). */
async function previewSettled(page: Page) {
  await page.getByTestId('report-preview').and(page.locator('[aria-busy="false"]')).waitFor({ timeout: 20_000 });
}

test('slots are assigned with the keyboard, the preview names the measured values, and the sent e-mail equals the preview', async () => {
  const w = await watchedPage(browser);
  const { page } = w;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/jobs`);
  await page
    .getByRole('link', { name: /JOB-0001/ })
    .first()
    .click();
  const volume = page.getByLabel('Part in the slot Volume pot');
  await volume.waitFor({ timeout: 20_000 });
  await previewSettled(page);
  const preview = page.locator('[data-testid="report-preview"] pre');
  expect(await preview.textContent()).toMatch(/Volume pot: no part assigned, typical values used/);

  // Keyboard only: focus the select, choose the option with the arrow keys.
  await volume.focus();
  await page.keyboard.press('ArrowDown');
  await page
    .getByRole('cell', { name: /POT-001/ })
    .first()
    .waitFor({ timeout: 10_000 });
  await previewSettled(page);
  await expect.poll(async () => preview.textContent(), { timeout: 20_000 }).toMatch(/Volume pot: POT-001: /);
  const tone = page.getByLabel('Part in the slot Tone capacitor');
  await tone.focus();
  await page.keyboard.press('ArrowDown');
  await expect.poll(async () => preview.textContent(), { timeout: 20_000 }).toMatch(/Tone capacitor: CAP-003: /);
  const text = (await preview.textContent())!;
  // Each assigned part is either measured (named with its source) or says it was not measured.
  expect(text).toMatch(/Volume pot: POT-001: (measured resistance|resistance not measured)/);
  expect(text).toMatch(
    /Tone capacitor: CAP-003: (measured capacitance [\d.]+ nF \(capacitance reading|capacitance not measured, typical value used)/,
  );
  expect(text).toMatch(/Treble-bleed resistor: no part assigned, typical values used: resistance 150 kΩ/);

  // A note from the shop appears in the preview, and the message sent is the preview, word for word.
  await page.getByLabel('A note from the shop (optional)').fill('Thanks for waiting: the bleed is in.');
  await expect.poll(async () => preview.textContent(), { timeout: 20_000 }).toContain('Thanks for waiting: the bleed is in.');
  await previewSettled(page);
  await shot(page, 'job-slots-assigned');
  const shown = (await preview.textContent())!;
  const attachmentName = (await page.locator('[data-testid="report-preview"] li .num').first().textContent())!;
  await page.getByRole('button', { name: 'E-mail the report' }).click();
  await page.getByText(/Sent to customer\.a@lugbook\.test/).waitFor({ timeout: 20_000 });
  w.expectNoProblems();
  await w.close();

  // The Outbox, as an admin: the message, its text, its attachment and the download.
  const a = await watchedPage(browser);
  await signIn(a.page, baseUrl, 'admin@lugbook.test', password);
  await a.page.goto(`${baseUrl}/outbox`);
  await a.page
    .getByRole('button', { name: /work record JOB-0001/ })
    .first()
    .click();
  const attachments = a.page.getByRole('list', { name: 'Attachments' });
  await attachments.waitFor({ timeout: 20_000 });
  expect(await attachments.textContent()).toContain(attachmentName);
  expect(await attachments.textContent()).toMatch(/text\/csv · [\d.]+ KiB/);
  const body = (await a.page.locator('article').textContent())!;
  expect(body.replace(/\s+/g, ' ')).toContain(shown.replace(/\s+/g, ' '));
  const link = a.page.getByRole('link', { name: `Download ${attachmentName}` });
  const href = (await link.getAttribute('href'))!;
  const res = await a.page.request.get(`${baseUrl}${href}`);
  expect(res.status()).toBe(200);
  expect(res.headers()['content-disposition']).toMatch(/^attachment;/);
  expect(await res.text()).toMatch(/^# design: Keeps its treble at low volume/);
  await shot(a.page, 'outbox-attachments');
  a.expectNoProblems();
  await a.close();
});
