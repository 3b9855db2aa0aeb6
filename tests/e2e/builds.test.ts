/**
 * End-to-end: build options defined in the app's form (validation at the field, undo), then
 * compared; the table's column for the new build is checked against the core's compareBuilds run
 * here in Node on the same scenario, never against the page. Screenshot: test-artifacts/builds-form.png.
 */
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { compareBuilds, parseScenario, type MetricName, type Scenario } from '../../src/core';
import { launchChromium, waitForScene, watchedPage } from './browser';

const ARTIFACTS = resolve(import.meta.dirname, '../../test-artifacts');
const RAD_PER_DEG = Math.PI / 180;
/** Every quantity the compare command prints (src/cli/commands/compare.ts), in its order. */
const QUANTITIES: readonly MetricName[] = [
  'ssf', 'cgHeightM', 'trackMeanM', 'noseDownLiftRad', 'noseDownTipRad', 'tailDownLiftRad', 'tailDownTipRad',
  'leftDownLiftRad', 'leftDownTipRad', 'rightDownLiftRad', 'rightDownTipRad', 'weakestDownhillRad', 'weakestTipRad',
  'passFirstUnloadM', 'passFirstLiftM', 'passTipM', 'passMinForceAngleRad', 'passMinEnergyM', 'passMinClearanceM',
];

function scenarioOf(data: unknown): Scenario {
  const p = parseScenario(data);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  mkdirSync(ARTIFACTS, { recursive: true });
  page = await watchedPage(browser, errors);
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

const builds = () => page.evaluate(() => window.__plumbline!.store.getState().scenario.builds ?? []);

it('a build defined in the form (a 0.05 m suspension lift) compares as the core says; refused values show at the field; undo takes it back', async () => {
  const s = scenarioOf(demo);
  expect(s.builds ?? []).toEqual([]);
  const build = { name: '50 mm lift', lift: { suspensionM: 0.05 } };
  // The core in Node, as the app's worker runs it: the vehicle as given first, then the build.
  const rows = compareBuilds(s.vehicle, [{ name: 'as given' }, build], { terrain: s.terrain, path: s.path, friction: s.friction, roseStepRad: 5 * RAD_PER_DEG });
  const dCgM = rows[1].change.cgHeightM!;
  expect(dCgM).toBeGreaterThan(0.03);
  expect(dCgM).toBeLessThan(0.05);

  await page.locator('#compare-h').click();
  await page.getByTestId('build-add').click();
  await expect.poll(builds).toEqual([{ name: 'build 1' }]);
  await page.getByTestId('build-0-name').fill(build.name);
  await expect.poll(builds).toEqual([{ name: build.name }]);

  // Over the file format's 0.5 m limit: the rule's message at the field, nothing applied.
  const lift = page.getByTestId('build-0-lift-suspension');
  await lift.fill('0.9');
  const liftField = page.locator('label.field', { has: lift });
  await expect.poll(() => liftField.locator('.field-error').textContent()).toContain('≤ 0.5 m');
  expect(await builds()).toEqual([{ name: build.name }]);
  await lift.fill('0.05');
  await expect.poll(builds).toEqual([build]);
  expect(await liftField.locator('.field-error').count()).toBe(0);
  // Units: lengths follow the unit system, the wheel fitment stays in inches and millimetres.
  expect(await liftField.locator('.unit').textContent()).toBe('m');
  await page.getByTestId('build-0-wheels-new').check();
  await expect(page.getByTestId('build-0-wheel-rim').locator('xpath=following-sibling::span[@class="unit"]').textContent()).resolves.toBe('in');
  await expect(page.getByTestId('build-0-wheel-offset').locator('xpath=following-sibling::span[@class="unit"]').textContent()).resolves.toBe('mm');
  // The form with a new wheel open (the panel scrolls inside the side column: a tall viewport shows it whole).
  await page.setViewportSize({ width: 1280, height: 2200 });
  const form = page.getByTestId('builds-form');
  await form.scrollIntoViewIfNeeded();
  await form.screenshot({ path: resolve(ARTIFACTS, 'builds-form.png') });
  await page.getByTestId('build-0-wheels-new').uncheck();
  await expect.poll(builds).toEqual([build]);

  await page.getByTestId('compare-run').click();
  const table = page.getByTestId('compare-table');
  await table.waitFor({ timeout: 90_000 });
  // Builds are the columns (the vehicle as given first), every quantity of the command a row.
  await expect(table.locator('thead th').allTextContents()).resolves.toEqual(['Quantity', '[1] as given (reference)', `[2] ${build.name}`]);
  await expect(table.locator('tbody tr').count()).resolves.toBe(QUANTITIES.length);
  const change = page.getByTestId('compare-cgHeightM-1-change');
  await expect(change.textContent()).resolves.toBe(`+${dCgM.toFixed(3)}`);
  expect(Number(await change.getAttribute('data-value'))).toBeCloseTo(dCgM, 12);
  // And every other quantity of the new column: the value and the change, as the core gives them.
  for (const k of QUANTITIES) {
    const cell = page.getByTestId(`compare-${k}-1`);
    const v = rows[1].metrics[k];
    const dv = rows[1].change[k];
    const got = await cell.getAttribute('data-value');
    const gotChange = await page.getByTestId(`compare-${k}-1-change`).getAttribute('data-value');
    if (v === null) expect(got, k).toBe('');
    else expect(Number(got), k).toBeCloseTo(v, 9);
    if (dv === null) expect(gotChange, k).toBe('');
    else expect(Number(gotChange), k).toBeCloseTo(dv, 9);
  }

  // The table (the form closed above it).
  await page.getByTestId('build-0-edit').click();
  const result = page.getByTestId('compare-result');
  await result.scrollIntoViewIfNeeded();
  await result.screenshot({ path: resolve(ARTIFACTS, 'builds-compare.png') });
  await page.setViewportSize({ width: 1280, height: 800 });

  // Undo goes back one change at a time: the new-wheels box (off, then on), the lift (one step for
  // the field), the name, the build itself.
  const undo = () => page.getByTestId('undo').click();
  await undo();
  await expect.poll(async () => (await builds())[0]?.wheels?.fitted !== undefined).toBe(true);
  await undo();
  await expect.poll(builds).toEqual([build]);
  await undo();
  await expect.poll(builds).toEqual([{ name: build.name }]);
  await expect(page.getByTestId('compare-result').textContent()).resolves.toContain('The scenario changed since this comparison');
  await undo();
  await expect.poll(builds).toEqual([{ name: 'build 1' }]);
  await undo();
  await expect.poll(builds).toEqual([]);
  expect(errors).toEqual([]);
});
