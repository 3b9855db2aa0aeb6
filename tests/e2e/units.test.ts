/**
 * A file keeps its own units (built app, headless Chromium): open the imperial demo, edit, save:
 * still imperial, the typed values intact, every untouched number as the file had it. A value
 * typed with the app in metric is written in the file's unit, to 0.1 lb or 0.01 in.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launchChromium, waitForScene } from './browser';

const QUARRY_FILE = resolve(import.meta.dirname, '../../assets/scenarios/quarry-haul-road-utv.json');
const quarry = JSON.parse(readFileSync(QUARRY_FILE, 'utf8'));

let browser: Browser;
let page: Page;
beforeAll(async () => {
  browser = await launchChromium();
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true, serviceWorkers: 'block' });
  page = await ctx.newPage();
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

async function openQuarry(): Promise<void> {
  await page.getByTestId('scenario-import').setInputFiles(QUARRY_FILE);
  await expect.poll(() => page.getByTestId('scenario-name').textContent()).toBe(quarry.name);
}

async function saved(): Promise<Record<string, any>> {
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('scenario-export').click()]);
  return JSON.parse(readFileSync(await download.path(), 'utf8'));
}

/** Every number of `original` that `written` does not hold at the same place. */
function changed(original: unknown, written: unknown, path = ''): string[] {
  if (typeof original === 'number') return written === original ? [] : [`${path}: ${original} → ${String(written)}`];
  if (original === null || typeof original !== 'object') return [];
  return Object.entries(original).flatMap(([k, x]) => changed(x, (written as Record<string, unknown> | undefined)?.[k], `${path}.${k}`));
}

async function setField(testId: string, value: string): Promise<void> {
  const field = page.getByTestId(testId);
  await field.scrollIntoViewIfNeeded();
  await field.fill(value);
  await field.blur();
}

it('the imperial demo, mass typed in lb: saved imperial with 1750 and every other number as the file had it', async () => {
  await openQuarry();
  await page.getByTestId('units').selectOption('imperial');
  await page.locator('#vehicle-h').click();
  await setField('field-vehicle.mass', '1750');
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle.massKg)).toBeCloseTo(1750 * 0.45359237, 9);
  const file = await saved();
  expect(file.units).toBe('imperial');
  expect(file.vehicle.mass).toBe(1750);
  const expected = structuredClone(quarry);
  expected.vehicle.mass = 1750;
  expect(changed(expected, file)).toEqual([]);
});

it('the same file edited with the app in metric: still imperial, the new value in lb to 0.1 lb', async () => {
  await openQuarry();
  await page.getByTestId('units').selectOption('metric');
  await setField('field-vehicle.mass', '800');
  // 800 kg / 0.45359237 kg/lb = 1763.698… lb (1959 agreement) → 1763.7 lb.
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle.massKg)).toBeCloseTo(1763.7 * 0.45359237, 9);
  const file = await saved();
  expect(file.units).toBe('imperial');
  expect(file.vehicle.mass).toBe(1763.7);
  const expected = structuredClone(quarry);
  expected.vehicle.mass = 1763.7;
  expect(changed(expected, file)).toEqual([]);
});
