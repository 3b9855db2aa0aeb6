/**
 * End-to-end: editing with validation at the field, presets, undo; the stability rose in a worker
 * (progress, cancel, result matching the core); offline start from the service worker cache.
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { buildModel, parseScenario, stabilityRose } from '../../src/core';
import { launchChromium, waitForScene } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});

it('a refused value shows the rule at the field and leaves the scenario; a preset adds a feature; undo takes it back', async () => {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 720 }, serviceWorkers: 'block' });
  const page = await ctx.newPage();
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  await page.locator('#vehicle-h').click();
  const wb = page.getByTestId('field-vehicle.wheelbase');
  await wb.fill('-2');
  const field = wb.locator('xpath=ancestor::label[1]');
  await expect.poll(() => field.locator('.field-error').count()).toBe(1);
  const msg = (await field.locator('.field-error').textContent()) ?? '';
  expect(msg.length).toBeGreaterThan(5);
  expect(await page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle.wheelbaseM)).toBe(3.1);
  await wb.fill('3.25');
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle.wheelbaseM)).toBe(3.25);

  await page.locator('#terrain-h').click();
  await page.getByTestId('preset-rock').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features.length)).toBe(2);
  await page.getByTestId('undo').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features.length)).toBe(1);
  await ctx.close();
});

it('the stability rose runs in a worker with progress and cancel, and matches the core', async () => {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  const s = p.scenario;
  const want = stabilityRose(buildModel(s.vehicle, s.terrain), s.pose, { stepRad: (5 * Math.PI) / 180, friction: s.friction });
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 720 }, serviceWorkers: 'block' });
  const page = await ctx.newPage();
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  await page.locator('#rose-h').click();
  await page.getByTestId('rose-run').click();
  await page.getByTestId('rose-cancel').click();
  await expect.poll(() => page.getByText('Cancelled.').count()).toBe(1);
  await page.getByTestId('rose-run').click();
  await page.getByTestId('rose-progress').waitFor();
  // The page keeps answering while the worker runs.
  const t0 = Date.now();
  await page.evaluate(() => 1 + 1);
  expect(Date.now() - t0).toBeLessThan(1000);
  const result = page.getByTestId('rose-result');
  await result.waitFor({ timeout: 60_000 });
  const text = (await result.textContent()) ?? '';
  const m = /tips at (\d+\.\d)°/.exec(text);
  expect(m, text).not.toBeNull();
  expect(Math.abs(Number(m![1]) - (want.weakest.tip!.angleRad * 180) / Math.PI)).toBeLessThanOrEqual(0.06);
  await ctx.close();
});

it('opens offline once loaded (service worker cache)', async () => {
  const ctx = await browser.newContext({ viewport: { width: 1024, height: 640 } });
  const page = await ctx.newPage();
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 15_000 }).toBe(true);
  await ctx.setOffline(true);
  await page.reload();
  await waitForScene(page);
  await expect(page.getByTestId('wheel-load-FL').textContent()).resolves.toMatch(/\d+ kg/);
  // The panels loaded on demand (their own chunks) come from the cache too.
  await page.getByTestId('pass-run').waitFor({ timeout: 15_000 });
  await page.getByTestId('report-button').waitFor({ timeout: 15_000 });
  await ctx.close();
});
