import fs from 'node:fs';
import { chromium, type Browser, type Page } from 'playwright-core';
import { expect, inject } from 'vitest';

/** Debian's Chromium, never a downloaded browser (DEVELOPERS.md, Set-up). */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run'],
  });
}

export async function signIn(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

export interface WatchedPage {
  page: Page;
  /** Console errors, page errors and server stderr seen so far. */
  problems(): string[];
  /**
   * Fails the test on any console error, page error or line the server wrote to stderr since the
   * page was opened; `allowed` lists expected console messages (e.g. a 422 answered on purpose).
   */
  expectNoProblems(allowed?: RegExp[]): void;
  close(): Promise<void>;
}

/** A page whose console errors, uncaught page errors and the server's stderr fail the test. */
export async function watchedPage(browser: Browser): Promise<WatchedPage> {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const seen: string[] = [];
  page.on('pageerror', (err) => seen.push(`page error: ${err.message}`));
  page.on('console', (msg) => {
    if (msg.type() === 'error') seen.push(`console: ${msg.text()}`);
  });
  const stderrFile = inject('serverStderrFile');
  const start = fs.statSync(stderrFile).size;
  const serverLines = () => {
    const text = fs.readFileSync(stderrFile).subarray(start).toString('utf8');
    return text
      .split('\n')
      .filter((l) => l.trim() !== '')
      .map((l) => `server stderr: ${l}`);
  };
  const problems = () => [...seen, ...serverLines()];
  return {
    page,
    problems,
    expectNoProblems(allowed = []) {
      expect(problems().filter((p) => !(p.startsWith('console: ') && allowed.some((a) => a.test(p))))).toEqual([]);
    },
    close: () => page.close(),
  };
}
