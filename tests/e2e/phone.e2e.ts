// A phone at the bench (390 × 844 CSS pixels): the live verdict is in view while the value field
// has focus, no screen scrolls sideways (tables become lists), and Esc closes the menu.
// Set LUGBOOK_SHOTS_DIR to keep a full-page screenshot of each screen checked here.
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import { launchBrowser, signIn, watchedPage } from './browser';

const baseUrl = inject('baseUrl');
const password = inject('demoPassword');
const PHONE = { width: 390, height: 844 };
let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function phonePage(email: string) {
  const watched = await watchedPage(browser);
  await watched.page.setViewportSize(PHONE);
  await signIn(watched.page, baseUrl, email, password);
  return watched;
}

async function shot(page: Page, name: string, fullPage = true): Promise<void> {
  const dir = process.env.LUGBOOK_SHOTS_DIR;
  if (!dir) return;
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage });
}

/**
 * What scrolls sideways on the page: the document itself when it is wider than the viewport, and
 * every element that lets its content scroll horizontally (overflow-x auto or scroll) and has more
 * content than width. Each entry names the element so a failure says where to look.
 */
function sidewaysScrollers(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const found: string[] = [];
    const doc = document.scrollingElement!;
    if (doc.scrollWidth > window.innerWidth) {
      // The document is too wide: name the elements that reach past the right edge.
      const past = [...document.querySelectorAll<HTMLElement>('body *')]
        .filter((el) => el.getBoundingClientRect().right > window.innerWidth + 0.5)
        .slice(0, 5)
        .map(
          (el) => `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)} right=${Math.round(el.getBoundingClientRect().right)}`,
        );
      found.push(`document ${doc.scrollWidth} px wide in a ${window.innerWidth} px viewport; past the edge: ${past.join(' | ')}`);
    }
    for (const el of document.querySelectorAll<HTMLElement>('body *')) {
      const ox = getComputedStyle(el).overflowX;
      if ((ox === 'auto' || ox === 'scroll') && el.scrollWidth > el.clientWidth) {
        found.push(
          `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)} scrollWidth=${el.scrollWidth} clientWidth=${el.clientWidth}`,
        );
      }
    }
    return found;
  });
}

test('on Bench at 390 × 844 the live verdict is inside the viewport while the value field has focus', async () => {
  const watched = await phonePage('tech@lugbook.test');
  const { page } = watched;
  expect(new URL(page.url()).pathname).toBe('/bench');
  const field = page.getByLabel('Label or scanned code');
  await field.fill('POT-006');
  await field.press('Enter');
  const value = page.getByLabel('Value (Ω)');
  await value.waitFor({ timeout: 10_000 });
  await value.focus();
  await value.pressSequentially('247k');
  const verdict = page.locator('[aria-live="polite"]', { hasText: 'Verdict as typed' });
  await verdict.waitFor({ timeout: 5_000 });
  expect(await value.evaluate((el) => el === document.activeElement)).toBe(true);
  const box = (await verdict.boundingBox())!;
  const field$ = (await value.boundingBox())!;
  // Both the field being typed in and the verdict it gives are on screen at once, with no scrolling by hand.
  for (const b of [box, field$]) {
    expect(b.x).toBeGreaterThanOrEqual(0);
    expect(b.y).toBeGreaterThanOrEqual(0);
    expect(b.x + b.width).toBeLessThanOrEqual(PHONE.width);
    expect(b.y + b.height).toBeLessThanOrEqual(PHONE.height);
  }
  // The panel is not hiding the field it judges.
  expect(box.y >= field$.y + field$.height || box.y + box.height <= field$.y).toBe(true);
  await shot(page, 'bench-390-value-focused', false);
  expect(await sidewaysScrollers(page)).toEqual([]);
  watched.expectNoProblems();
  await watched.close();
});

test('nothing scrolls sideways at 390 px on Parts, Jobs, a job page, Lots and a lot page', async () => {
  const tech = await phonePage('tech@lugbook.test');
  const page = tech.page;
  await shot(page, 'bench-390');
  expect(await sidewaysScrollers(page)).toEqual([]);

  await page.goto(`${baseUrl}/parts`);
  await page.getByRole('link', { name: 'POT-006' }).first().waitFor({ timeout: 10_000 });
  await shot(page, 'parts-390');
  expect(await sidewaysScrollers(page)).toEqual([]);

  await page.goto(`${baseUrl}/jobs`);
  const job = page.getByRole('link', { name: /JOB-0001/ }).first();
  await job.waitFor({ timeout: 10_000 });
  await shot(page, 'jobs-390');
  expect(await sidewaysScrollers(page)).toEqual([]);
  await job.click();
  await page.getByLabel('Part label').waitFor({ timeout: 10_000 });
  await shot(page, 'job-390');
  expect(await sidewaysScrollers(page)).toEqual([]);
  tech.expectNoProblems();
  await tech.close();

  const qa = await phonePage('qa@lugbook.test');
  const lots = qa.page;
  const lot = lots.getByRole('link', { name: /P-2611-A/ }).first();
  await lot.waitFor({ timeout: 10_000 });
  await shot(lots, 'lots-390');
  expect(await sidewaysScrollers(lots)).toEqual([]);
  await lot.click();
  await lots
    .getByRole('checkbox', { name: /^Select item / })
    .first()
    .waitFor({ timeout: 20_000 });
  await shot(lots, 'lot-390');
  expect(await sidewaysScrollers(lots)).toEqual([]);
  qa.expectNoProblems();
  await qa.close();
});

test('Esc closes the open menu on a phone', async () => {
  const watched = await phonePage('tech@lugbook.test');
  const { page } = watched;
  const menu = page.getByRole('button', { name: 'Menu' });
  await menu.click();
  await page.locator('#mobile-nav').waitFor();
  expect(await menu.getAttribute('aria-expanded')).toBe('true');
  await shot(page, 'menu-390-open');
  await page.keyboard.press('Escape');
  await page.locator('#mobile-nav').waitFor({ state: 'detached', timeout: 2_000 });
  expect(await menu.getAttribute('aria-expanded')).toBe('false');
  watched.expectNoProblems();
  await watched.close();
});
