// The Harness screen's one editor in a real browser, point by point of its screen contract: a layout
// chooser and the presets as quick starts; the selector as a keyboard-operable control; one slider
// per knob; options per control; the load with its values; every selector position overlaid at the
// current knobs and each pickup alone; the finder with its best candidates' curves and one-click
// apply; A/B across layouts; the simplifications in words; a measured capacitor in a capacitor
// slot; saving and opening a layout design. Figures on the screen are compared with the shared
// engine run here on the same design. Set LUGBOOK_SHOTS=folder to keep screenshots.
import fs from 'node:fs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, expect, inject, test } from 'vitest';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig } from '@shared/circuit/layouts';
import { simulateInstrument } from '@shared/circuit/metrics';
import { formatValue } from '@shared/units/format';
import { formatDb } from '@/features/harness/components/harness-format';
import { launchBrowser, signIn, watchedPage } from './browser';

const baseUrl = inject('baseUrl');
const password = inject('demoPassword');
let browser: Browser;
const shots = process.env.LUGBOOK_SHOTS;

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

const shot = async (page: Page, name: string) => {
  if (!shots) return;
  fs.mkdirSync(shots, { recursive: true });
  await page.screenshot({ path: `${shots}/${name}.png`, fullPage: true });
};

/** The engine's figures for a layout design (as the screen's instrument line words them). */
function level1k(layoutId: string, selector: number, options: Record<string, string>, knobs: Record<string, number> = {}) {
  const layout = getLayout(layoutId)!;
  const { config } = resolveLayoutConfig(layout, { selector, options });
  return simulateInstrument(buildLayoutNetlist(layout, config), layoutKnobs(layout, knobs)).metrics!.level1kDb;
}

const legend = (page: Page, panel: string) => page.locator(`${panel} .u-legend`).first().innerText();

test('one editor: quick starts, layouts, keyboard selector, a slider per knob, positions and pickups overlaid, finder curves, A/B across layouts, save and open', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/harness`);
  const wiring = page.locator('#harness-wiring');
  const level = page.locator('#harness-response th', { hasText: 'Level at 1 kHz' }).first().locator('xpath=following-sibling::td[1]');
  await level.waitFor();

  // presets as quick starts: the one-pickup layout with their options
  expect(await wiring.getByLabel('Layout').inputValue()).toBe('one-pickup');
  expect(await wiring.getByLabel('Quick start').inputValue()).toBe('independent-tone');
  await wiring.getByLabel('Quick start').selectOption('bleed-cap');
  expect(await wiring.getByLabel('Treble bleed').inputValue()).toBe('cap');
  await expect.poll(() => level.textContent()).toBe(formatDb(level1k('one-pickup', 0, { bleed: 'cap' })));
  // stacking a tone network on the bleed is no preset any more, and still one design
  await wiring.getByLabel('Tone network').selectOption('floor-resistor');
  expect(await wiring.getByLabel('Quick start').inputValue()).toBe('');
  await expect.poll(() => level.textContent()).toBe(formatDb(level1k('one-pickup', 0, { bleed: 'cap', toneNetwork: 'floor-resistor' })));
  // the load with its values: a low-impedance pedal shows its input resistance among the part values
  await wiring.getByLabel('Plays into').selectOption('low-impedance-pedal');
  const values = page.locator('#harness-values');
  await values.getByLabel("Low-impedance pedal input resistance (from memory; enter your pedal's)").waitFor();
  expect(await values.getByLabel('Amplifier input resistance').count()).toBe(0);
  await expect
    .poll(() => level.textContent())
    .toBe(formatDb(level1k('one-pickup', 0, { bleed: 'cap', toneNetwork: 'floor-resistor', load: 'low-impedance-pedal' })));
  await wiring.getByLabel('Plays into').selectOption('amp');
  await wiring.getByLabel('Quick start').selectOption('bleed-cap');

  // a measured capacitor in the tone capacitor's slot: its latest capacitance reading
  const toneGroup = values.locator('fieldset', { hasText: 'Tone pot and capacitor' });
  await toneGroup.getByRole('button', { name: 'Use a measured capacitor…' }).click();
  const picker = toneGroup.getByLabel(/Measured capacitor for the tone capacitor/);
  await expect.poll(async () => picker.locator('option').count(), { timeout: 20_000 }).toBeGreaterThan(1);
  const option = picker.locator('option').nth(1);
  const partId = Number(await option.getAttribute('value'));
  await picker.selectOption(String(partId));
  const readings = (await page.evaluate(async (id) => (await fetch(`/api/parts/${id}/readings`)).json(), partId)) as {
    readings: { quantity: string; value: number; takenAt: number; id: number }[];
  };
  const latest = readings.readings.filter((r) => r.quantity === 'capacitance').sort((a, b) => b.takenAt - a.takenAt || b.id - a.id)[0]!;
  expect(await toneGroup.getByLabel('Tone capacitor').inputValue()).toBe(formatValue(latest.value, 'F', { digits: 4 }));
  expect(await toneGroup.getByText(/capacitance reading of/).count()).toBe(1);
  await shot(page, 'harness-one-pickup');

  // pin this one-pickup design as A
  await wiring.getByRole('button', { name: 'Pin as A to compare' }).click();

  // a three-pickup layout: a slider per knob, the selector by keyboard, every position overlaid, each pickup alone
  await wiring.getByLabel('Layout').selectOption('three-pickups-5way');
  for (const name of ['Volume knob', 'Tone 1 (neck) knob', 'Tone 2 (middle) knob'])
    expect(await page.getByRole('slider', { name }).count()).toBe(1);
  await wiring.getByRole('radio', { name: /^0:/ }).focus();
  await page.keyboard.press('ArrowRight');
  await expect.poll(() => wiring.getByRole('radio', { name: /^1:/ }).isChecked()).toBe(true);
  const figures = page.getByTestId('instrument-figures');
  await expect.poll(async () => (await figures.textContent()) ?? '').toContain(formatDb(level1k('three-pickups-5way', 1, {})));
  await expect.poll(() => legend(page, '#harness-response')).toMatch(/Position 0: Neck/);
  const shown = await legend(page, '#harness-response');
  for (const words of ['Position 2: Middle', 'Position 3: Middle and bridge', 'Position 4: Bridge', 'Neck alone', 'Middle alone', 'A: '])
    expect(shown).toContain(words);
  expect(await page.getByTestId('harness-simplifications').textContent()).toMatch(/unit source.*no mutual inductance/s);
  // A/B across layouts: A is the one-pickup design
  const ab = page.locator('#harness-ab');
  await ab.waitFor();
  expect(await ab.getByText('Layout and position').count()).toBe(1);
  // a knob the pinned design lacks moves B only
  const tone2 = page.getByRole('slider', { name: 'Tone 2 (middle) knob' });
  await tone2.focus();
  await page.keyboard.press('PageDown');
  await expect.poll(() => tone2.inputValue()).toBe('9');
  await shot(page, 'harness-three-pickups');

  // the finder: the best candidates' curves beside no bleed, one click applies one
  const finder = page.locator('#harness-finder');
  await finder.getByRole('button', { name: 'Find a bleed' }).click();
  const rows = finder.getByTestId('finder-candidates').locator('tbody tr');
  await expect.poll(() => rows.count(), { timeout: 30_000 }).toBe(5);
  expect(await finder.locator('canvas').count()).toBeGreaterThanOrEqual(2);
  const finderLegend = await legend(page, '#harness-finder');
  expect(finderLegend).toContain('No bleed');
  expect(finderLegend).toMatch(/1: .*(alone|parallel|series)/);
  const first = (await rows.nth(0).locator('td').nth(1).textContent())!;
  await finder.getByRole('button', { name: /^Apply candidate 1:/ }).click();
  const topology = /in parallel/.test(first) ? 'cap-parallel-r' : /in series/.test(first) ? 'cap-series-r' : 'cap';
  expect(await wiring.getByLabel('Treble bleed').inputValue()).toBe(topology);
  const capText = first.split(' ')[0] + ' ' + first.split(' ')[1];
  expect(await values.getByLabel('Treble-bleed capacitor').inputValue()).toBe(capText);
  await finder.scrollIntoViewIfNeeded();
  if (shots) await finder.screenshot({ path: `${shots}/harness-finder.png` });
  await shot(page, 'harness-finder-page');

  // save the layout design, then open it again from the saved list after a reload
  const name = `Three pickups ${Date.now()}`;
  await page.locator('#harness-save').getByLabel('Name').fill(name);
  await page.locator('#harness-save').getByRole('button', { name: 'Save as a new design' }).click();
  await page.getByText(`Saved “${name}” as a new design.`).waitFor();
  await page.reload();
  await page.getByRole('button', { name: `Open ${name} in the editor` }).click();
  await expect.poll(() => page.locator('#harness-wiring').getByLabel('Layout').inputValue()).toBe('three-pickups-5way');
  expect(await page.locator('#harness-wiring').getByRole('radio', { name: /^1:/ }).isChecked()).toBe(true);
  expect(await page.getByRole('slider', { name: 'Tone 2 (middle) knob' }).inputValue()).toBe('9');
  expect(await page.locator('#harness-wiring').getByLabel('Treble bleed').inputValue()).toBe(topology);

  // identical coils in opposition: "no signal (cancelled)", not a curve at −300 dB
  await page.locator('#harness-wiring').getByLabel('Layout').selectOption('dual-coil');
  await page.locator('#harness-wiring').getByLabel('Coils').selectOption('series-reversed');
  await page.getByText(/No signal \(cancelled\)/).waitFor();
  await page.locator('#harness-wiring').getByLabel('Coils').selectOption('series');
  await expect.poll(() => page.getByText(/No signal \(cancelled\)/).count()).toBe(0);
  watched.expectNoProblems();
  await watched.close();
}, 180_000);

test('downloads of a layout design: the SPICE netlist has one AC source per pickup, the CSV names its conditions and every position', async () => {
  const watched = await watchedPage(browser);
  const { page } = watched;
  await signIn(page, baseUrl, 'tech@lugbook.test', password);
  await page.goto(`${baseUrl}/harness`);
  const wiring = page.locator('#harness-wiring');
  await wiring.getByLabel('Layout').selectOption('two-pickups-3way');
  await wiring.getByLabel('Phase').selectOption('reversed');
  await wiring.getByRole('radio', { name: /^1:/ }).check({ force: true });
  const read = async (button: string) => {
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: button }).click()]);
    return { name: download.suggestedFilename(), text: fs.readFileSync((await download.path())!, 'utf8') };
  };
  const spice = await read('SPICE netlist');
  expect(spice.name).toMatch(/^harness-two-pickups-3way-pos1-.*\.cir$/);
  const sources = spice.text.split('\n').filter((l) => /^V/i.test(l));
  expect(sources).toHaveLength(2);
  expect(sources.filter((l) => / AC 1 180$/.test(l))).toHaveLength(1);
  const csv = await read('Curves (CSV)');
  expect(csv.text).toContain('# layout: Two pickups, three-way selector\n');
  expect(csv.text).toContain('# selector position: 1: Both\n');
  expect(csv.text).toContain('# phase: One pickup reversed\n');
  expect(csv.text).toMatch(/# sources: every pickup or coil a unit source/);
  const header = csv.text.split('\n').find((l) => l.startsWith('frequency_Hz'))!;
  expect(header).toContain('position_0_neck_dB');
  expect(header).toContain('position_2_bridge_dB');
  expect(header).toContain('neck_alone_dB');
  watched.expectNoProblems();
  await watched.close();
}, 120_000);
