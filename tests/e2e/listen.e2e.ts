// Listen in a real browser. (1) The built-in phrase: the same samples in Chromium as in Node
// within 1e-6. (2) The browser path: white noise through Web Audio's ConvolverNode (normalisation
// off) with the shared impulse response, rendered by an OfflineAudioContext, has a Welch PSD ratio
// (P. D. Welch, IEEE Trans. Audio Electroacoustics 15(2), 1967) within 0.5 dB of simulate from
// 50 Hz to 10 kHz. (3) The Listen panel on the Harness screen plays, follows a knob and switches A/B.
// Chromium runs with --autoplay-policy=no-user-gesture-required so an AudioContext may start.
import fs from 'node:fs';
import path from 'node:path';
import { build } from 'esbuild';
import { chromium, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import type { harnessResponse, impulseResponse } from '@shared/audio/impulse';
import { synthesizePhrase } from '@shared/audio/phrase';
import { simulate } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import { welchPsd } from '../support/welch';
import { signIn } from './browser';

/** What the page holds after the bundle and the helper script (types only: the functions run in Chromium). */
interface PageGlobals {
  lugbookAudio: {
    harnessResponse: typeof harnessResponse;
    impulseResponse: typeof impulseResponse;
    synthesizePhrase: typeof synthesizePhrase;
    getPreset: typeof getPreset;
    seededNormals: (seed: number) => () => number;
  };
  f32ToBase64: (x: Float32Array) => string;
}

const baseUrl = inject('baseUrl');
const password = inject('demoPassword');
const root = path.resolve(import.meta.dirname, '../..');
let browser: Browser;
let bundle: string;

beforeAll(async () => {
  const out = await build({
    entryPoints: [path.join(root, 'tests/e2e/listen-entry.ts')],
    bundle: true,
    format: 'iife',
    write: false,
    platform: 'browser',
    tsconfig: path.join(root, 'tsconfig.json'),
    logLevel: 'silent',
  });
  bundle = out.outputFiles[0]!.text;
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--no-first-run',
      '--autoplay-policy=no-user-gesture-required',
    ],
  });
});
afterAll(async () => {
  await browser?.close();
});

/** Float32 samples as base64 in the page, and back in Node: far quicker than arrays of numbers through the protocol. */
const fromBase64 = (b64: string) => {
  const bytes = Buffer.from(b64, 'base64');
  return new Float32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength / 4);
};
const TO_BASE64 = `globalThis.f32ToBase64 = (x) => { const b = new Uint8Array(x.buffer, x.byteOffset, x.byteLength); let s = ''; for (let i = 0; i < b.length; i += 8192) s += String.fromCharCode.apply(null, b.subarray(i, i + 8192)); return btoa(s); };`;

async function audioPage(): Promise<Page> {
  const page = await browser.newPage();
  await page.addScriptTag({ content: bundle });
  await page.addScriptTag({ content: TO_BASE64 });
  return page;
}

test('the phrase generator gives the same samples in Chromium as in Node (within 1e-6 of full scale)', async () => {
  const page = await audioPage();
  for (const [sampleRate, positions] of [
    [48000, [0.062, 0.16, 0.25]],
    [44100, [0.16]],
  ] as const) {
    const browserTracks = (
      await page.evaluate(
        ({ sampleRate, positions }) => {
          const g = globalThis as unknown as PageGlobals;
          return g.lugbookAudio.synthesizePhrase({ sampleRate, pickupPositions: positions }).tracks.map((t) => g.f32ToBase64(t));
        },
        { sampleRate, positions: [...positions] },
      )
    ).map(fromBase64);
    const node = synthesizePhrase({ sampleRate, pickupPositions: positions }).tracks;
    expect(browserTracks).toHaveLength(positions.length);
    let worst = 0;
    node.forEach((t, k) => {
      expect(browserTracks[k]).toHaveLength(t.length);
      for (let i = 0; i < t.length; i++) worst = Math.max(worst, Math.abs(t[i]! - browserTracks[k]![i]!));
    });
    console.log(`phrase, Chromium against Node at ${sampleRate} Hz: largest difference ${worst.toExponential(2)}`);
    expect(worst, `${sampleRate} Hz`).toBeLessThanOrEqual(1e-6);
  }
  await page.close();
}, 240_000);

test('white noise through the shared impulse response in an OfflineAudioContext: Welch PSD ratio within 0.5 dB of simulate (50 Hz–10 kHz)', async () => {
  const page = await audioPage();
  const fs = 48000;
  const cases = [
    { preset: 'bleed-cap', knobs: { volume: 4, tone: 10 } },
    { preset: 'dual-cap-tone', knobs: { volume: 10, tone: 2 } },
  ];
  for (const c of cases) {
    const { input, output, delay } = await page.evaluate(
      async ({ fs, c }) => {
        const a = (globalThis as unknown as PageGlobals).lugbookAudio;
        const preset = a.getPreset(c.preset)!;
        const ir = a.impulseResponse(a.harnessResponse(preset.build(preset.defaults), c.knobs), fs);
        const frames = fs * 8;
        const ctx = new OfflineAudioContext(1, frames, fs);
        const g = a.seededNormals(1967);
        const noise = new Float32Array(frames);
        for (let i = 0; i < frames; i++) noise[i] = 0.1 * g();
        const src = ctx.createBuffer(1, frames, fs);
        src.copyToChannel(noise, 0);
        const irBuf = ctx.createBuffer(1, ir.samples.length, fs);
        irBuf.copyToChannel(Float32Array.from(ir.samples), 0);
        const node = new AudioBufferSourceNode(ctx, { buffer: src });
        const conv = new ConvolverNode(ctx, { disableNormalization: true, buffer: irBuf });
        node.connect(conv).connect(ctx.destination);
        node.start();
        const rendered = await ctx.startRendering();
        const g2 = globalThis as unknown as PageGlobals;
        return { input: g2.f32ToBase64(noise), output: g2.f32ToBase64(rendered.getChannelData(0)), delay: ir.delay };
      },
      { fs, c },
    );
    const seg = 4096;
    // the output lags by the modelling delay: line the two up so that each segment pair holds the same noise
    const x = fromBase64(input);
    const y = fromBase64(output);
    const pin = welchPsd(x.subarray(0, x.length - delay), seg);
    const pout = welchPsd(y.subarray(delay), seg);
    const ks: number[] = [];
    for (let k = 1; k < pin.length; k++) if ((k * fs) / seg >= 50 && (k * fs) / seg <= 10000) ks.push(k);
    const p = getPreset(c.preset)!;
    const sim = simulate(
      p.build(p.defaults),
      c.knobs,
      Float64Array.from(ks, (k) => (k * fs) / seg),
    );
    let worst = 0;
    ks.forEach((k, j) => (worst = Math.max(worst, Math.abs(10 * Math.log10(pout[k]! / pin[k]!) - sim.magnitudeDb[j]!))));
    console.log(`OfflineAudioContext ${c.preset} ${c.knobs.volume}/${c.knobs.tone}: Welch ratio within ${worst.toFixed(3)} dB of simulate`);
    expect(worst, `${c.preset} ${c.knobs.volume}/${c.knobs.tone}`).toBeLessThan(0.5);
  }
  await page.close();
}, 240_000);

test('the Listen panel plays the phrase, follows a knob, switches A/B, and shows its caution and meter', async () => {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const problems: string[] = [];
  page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
  page.on('console', (msg) => {
    if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
  });
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/harness`);
  const panel = page.locator('#harness-listen');
  await panel.waitFor();
  await expect.poll(() => panel.getByText('Start quiet.').count()).toBe(1);
  await panel.getByRole('button', { name: 'Play' }).focus();
  await page.keyboard.press('Enter');
  const meter = panel.getByTestId('listen-meter-text');
  await expect.poll(async () => (await meter.textContent()) ?? '', { timeout: 15_000 }).toMatch(/dBFS/);
  // a knob move while playing
  const volume = page.getByRole('slider', { name: 'Volume knob' }).first();
  await volume.focus();
  await page.keyboard.press('PageDown');
  await page.keyboard.press('PageDown');
  await page.waitForTimeout(300);
  expect(await panel.getByRole('button', { name: 'Stop' }).count()).toBe(1);
  // pin A, then hear A and B
  await page
    .locator('#harness-wiring')
    .getByRole('button', { name: /Pin as A to compare/ })
    .click();
  await panel.getByRole('radio', { name: /^A:/ }).check();
  await page.waitForTimeout(200);
  expect(await panel.getByRole('radio', { name: /^A:/ }).isChecked()).toBe(true);
  await panel.getByRole('radio', { name: /^B:/ }).check();
  await expect.poll(async () => (await meter.textContent()) ?? '', { timeout: 5_000 }).toMatch(/dBFS/);
  // screenshots for a person to look at, when asked for (LUGBOOK_SHOTS=folder)
  const shots = process.env.LUGBOOK_SHOTS;
  if (shots) {
    fs.mkdirSync(shots, { recursive: true });
    await panel.screenshot({ path: `${shots}/listen-panel.png` });
    await page.screenshot({ path: `${shots}/harness-with-listen.png`, fullPage: true });
  }
  await panel.getByRole('button', { name: 'Stop' }).click();
  expect(await meter.textContent()).toBe('stopped');
  expect(problems).toEqual([]);
  await page.close();
}, 120_000);

test('with a multi-pickup layout in the editor, Listen plays that layout at its selector position and knobs, and states the simplification', async () => {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const problems: string[] = [];
  page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
  page.on('console', (msg) => {
    if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
  });
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/harness`);
  const panel = page.locator('#harness-listen');
  await panel.waitFor();
  // with the one-pickup layout, Listen plays it without the whole-instrument note
  expect(await panel.getByTestId('listen-instrument').count()).toBe(0);
  // the one editor: choose the two-pickup layout, then the selector's bridge position
  const instrument = page.locator('#harness-wiring');
  await instrument.getByLabel('Layout').selectOption('two-pickups-3way');
  await instrument.getByRole('radio', { name: /^2:/ }).check({ force: true });
  const note = panel.getByTestId('listen-instrument');
  await expect.poll(async () => (await note.textContent()) ?? '').toMatch(/Two pickups.*bridge/i);
  expect(await note.textContent()).toMatch(/unit source.*place along the string.*no mutual inductance/s);
  await panel.getByRole('button', { name: 'Play' }).click();
  const meter = panel.getByTestId('listen-meter-text');
  await expect.poll(async () => (await meter.textContent()) ?? '', { timeout: 15_000 }).toMatch(/dBFS/);
  // the selector moves while playing: the same phrase tracks, new filters, still playing
  await instrument.getByRole('radio', { name: /^0:/ }).check({ force: true });
  await expect.poll(async () => (await note.textContent()) ?? '').toMatch(/neck/i);
  await page.waitForTimeout(300);
  expect(await panel.getByRole('button', { name: 'Stop' }).count()).toBe(1);
  await expect.poll(async () => (await meter.textContent()) ?? '', { timeout: 5_000 }).toMatch(/dBFS/);
  const shots = process.env.LUGBOOK_SHOTS;
  if (shots) {
    fs.mkdirSync(shots, { recursive: true });
    await panel.screenshot({ path: `${shots}/listen-instrument.png` });
    await page.screenshot({ path: `${shots}/harness-instrument-listen.png`, fullPage: true });
  }
  await panel.getByRole('button', { name: 'Stop' }).click();
  expect(problems).toEqual([]);
  await page.close();
}, 120_000);

test("Listen on a saved design's page and on a job's page (before as A, after as B); the job's report preview names the two clips", async () => {
  const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
  const problems: string[] = [];
  page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
  page.on('console', (msg) => {
    if (msg.type() === 'error') problems.push(`console: ${msg.text()}`);
  });
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  // the browser's own session, with the Origin a state-changing request needs
  const send = async (method: 'post' | 'put', url: string, data: object) => {
    const r = await page.request[method](`${baseUrl}${url}`, { data, headers: { Origin: baseUrl } });
    expect(r.status(), `${method} ${url}: ${await r.text()}`).toBeLessThan(300);
    return r.json();
  };
  const knobs = { volume: 5, tone: 10 };
  const before = await send('post', '/api/harnesses', { name: 'E2E as it came in', preset: 'independent-tone', values: {}, knobs });
  const after = await send('post', '/api/harnesses', { name: 'E2E with a bleed', preset: 'bleed-cap', values: {}, knobs });
  const job = await send('post', '/api/jobs', {
    customer: 'E. Example',
    customerEmail: 'e.example@lugbook.test',
    instrument: 'Solid-body six-string',
    harnessId: after.id,
  });
  await send('put', `/api/jobs/${job.id}/before`, { harnessId: before.id });
  const shots = process.env.LUGBOOK_SHOTS;
  if (shots) fs.mkdirSync(shots, { recursive: true });

  // the saved design's page
  await page.goto(`${baseUrl}/harness/designs/${after.id}`);
  const designPanel = page.locator('#design-listen');
  await designPanel.waitFor();
  expect(await designPanel.getByText('Start quiet.').count()).toBe(1);
  expect(await designPanel.getByRole('slider', { name: 'Volume' }).inputValue()).toBe('5');
  await designPanel.getByRole('button', { name: 'Play' }).click();
  const designMeter = designPanel.getByTestId('listen-meter-text');
  await expect.poll(async () => (await designMeter.textContent()) ?? '', { timeout: 15_000 }).toMatch(/dBFS/);
  if (shots) await page.screenshot({ path: `${shots}/design-page-listen.png`, fullPage: true });
  await designPanel.getByRole('button', { name: 'Stop' }).click();

  // the job's page: before as A, after as B, at the same knobs
  await page.goto(`${baseUrl}/jobs/${job.id}`);
  const jobPanel = page.locator('#job-listen');
  await jobPanel.waitFor();
  expect(await jobPanel.getByText('Start quiet.').count()).toBe(1);
  await expect.poll(() => jobPanel.getByRole('radio', { name: /^A: Before: E2E as it came in/ }).count()).toBe(1);
  expect(await jobPanel.getByRole('radio', { name: /^B: After: E2E with a bleed/ }).count()).toBe(1);
  await jobPanel.getByRole('button', { name: 'Play' }).click();
  const jobMeter = jobPanel.getByTestId('listen-meter-text');
  await expect.poll(async () => (await jobMeter.textContent()) ?? '', { timeout: 15_000 }).toMatch(/dBFS/);
  await jobPanel.getByRole('radio', { name: /^A:/ }).check();
  await jobPanel.getByRole('slider', { name: 'Volume' }).focus();
  await page.keyboard.press('ArrowLeft');
  await page.waitForTimeout(300);
  expect(await jobPanel.getByRole('button', { name: 'Stop' }).count()).toBe(1);
  // the report preview names the clips, as the e-mail will
  const report = page.locator('#job-report');
  await expect.poll(async () => (await report.textContent()) ?? '', { timeout: 10_000 }).toMatch(new RegExp(`${job.code}-1-before\\.wav`));
  expect(await report.textContent()).toMatch(new RegExp(`${job.code}-2-after\\.wav: the wiring after the work, E2E with a bleed`));
  if (shots) {
    await page.locator('#job-before-after').screenshot({ path: `${shots}/job-listen.png` });
    // the preview scrolls: show its end, where the clips are named
    await report.locator('pre').evaluate((el) => (el.scrollTop = el.scrollHeight));
    await report.screenshot({ path: `${shots}/job-report-clips.png` });
    await page.screenshot({ path: `${shots}/job-page.png`, fullPage: true });
  }
  await jobPanel.getByRole('button', { name: 'Stop' }).click();
  expect(problems).toEqual([]);
  await page.close();
}, 120_000);
