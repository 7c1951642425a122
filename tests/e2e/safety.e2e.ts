// The safety notes appear where the work happens: beside the bench form, beside the ESR quantity,
// on a job's Install form and on the Harness screen. The expected sentences come from the one
// module that holds them, so a note that is dropped from a screen fails here.
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import { SAFETY_WORDS } from '@/components/safety/safety-notes';
import { launchBrowser, signIn } from './browser';

const baseUrl = inject('baseUrl');
const password = inject('demoPassword');
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function techPage(): Promise<{ page: Page; problems: string[] }> {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const problems: string[] = [];
  page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
  page.on('console', (msg) => {
    if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
  });
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  return { page, problems };
}

/** Saves a picture of the page when LUGBOOK_SHOTS is set (a folder outside the repository). */
async function shot(page: Page, name: string): Promise<void> {
  if (process.env.LUGBOOK_SHOTS) await page.screenshot({ path: `${process.env.LUGBOOK_SHOTS}/${name}.png`, fullPage: true });
}

test('the bench shows what is safe while measuring, and the discharge caution appears only with the ESR quantity', async () => {
  const { page, problems } = await techPage();
  await page.goto(`${baseUrl}/bench`);
  const bench = page.getByRole('complementary', { name: 'At the bench' });
  await bench.waitFor();
  for (const words of [SAFETY_WORDS.measure, SAFETY_WORDS.valve, SAFETY_WORDS.qualified, SAFETY_WORDS.solder, SAFETY_WORDS.solvents]) {
    expect(await bench.getByText(words, { exact: true }).count()).toBe(1);
  }
  await page.getByLabel('Label or scanned code').fill('CAP-001');
  await page.keyboard.press('Enter');
  const quantity = page.getByLabel('Quantity');
  await quantity.waitFor();
  expect(await page.getByText(SAFETY_WORDS.esr).count()).toBe(0);
  await quantity.selectOption('esr');
  await page.getByText(SAFETY_WORDS.esr).waitFor();
  await shot(page, 'bench-esr');
  expect(problems).toEqual([]);
  await page.close();
});

test("a job's Install form and the Harness screen carry their safety notes", async () => {
  const { page, problems } = await techPage();
  await page.goto(`${baseUrl}/jobs`);
  await page
    .getByRole('link', { name: /JOB-0001/ })
    .first()
    .click();
  const install = page.getByRole('form', { name: 'Install a part' });
  await install.waitFor();
  expect(await install.getByText(SAFETY_WORDS.install).count()).toBe(1);
  await shot(page, 'job-install');
  await page.goto(`${baseUrl}/harness`);
  await page.getByText(SAFETY_WORDS.harness).waitFor();
  await shot(page, 'harness');
  expect(problems).toEqual([]);
  await page.close();
});
