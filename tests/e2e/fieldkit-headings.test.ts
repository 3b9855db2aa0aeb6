/**
 * End-to-end: a fleet officer sweeps every heading (5° apart) at the vehicle's spot on the side-hill
 * demo's ground in the app; the worst heading and its margin are named and drawn (chart, rose over
 * the terrain). Expected values: the core's heading sweep run here in Node on the same scenario (the
 * physics of the sweep is checked against the closed forms in tests/fieldkit/headings.test.ts).
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { headingSweep, parseScenario, type Scenario } from '../../src/core';
import { launchChromium, waitForScene, watchedPage } from './browser';

let browser: Browser;
let page: Page;
const errors: string[] = [];
const DEG = Math.PI / 180;

function scenarioOf(data: unknown): Scenario {
  const p = parseScenario(data);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors);
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

it('sweeps every 5° on the real ground, names the worst heading as the core does, and draws it', async () => {
  const name = await page.getByTestId('scenario-name').textContent();
  expect(name).toBe(demo.name);
  const s = scenarioOf(demo);
  const want = headingSweep(s.vehicle, s.terrain, s.pose.xM, s.pose.yM, { stepRad: 5 * DEG, friction: s.friction });
  expect(want.headings).toHaveLength(72);
  expect(want.worst).not.toBeNull();
  await page.getByTestId('view-above').click();
  const canvas = page.locator('[data-testid="scene"] canvas');
  const before = await canvas.screenshot();
  await page.locator('#headings-h').click();
  await page.getByTestId('heading-sweep').click();
  const worst = page.getByTestId('heading-worst');
  await worst.waitFor({ timeout: 60_000 });
  expect(Number(await worst.getAttribute('data-heading-deg'))).toBeCloseTo(want.worst!.headingRad / DEG, 9);
  expect(Number(await worst.getAttribute('data-tip-extra-deg'))).toBeCloseTo(want.worst!.tip!.extraRad / DEG, 9);
  const text = (await worst.textContent()) ?? '';
  expect(text).toContain(`Worst heading ${(want.worst!.headingRad / DEG).toFixed(1)}°`);
  expect(text).toContain(`tips after ${(want.worst!.tip!.extraRad / DEG).toFixed(1)}° more than the ground here`);
  expect(text).toContain(`(${((want.worst!.tip!.extraRad + want.ground.slopeRad) / DEG).toFixed(1)}° from level)`);
  // The fall line's direction in the vehicle's words, as the core has it.
  expect(text).toMatch(/(nose|tail|left side|right side) down|° from the nose, counter-clockwise/);
  expect(want.ground.slopeRad / DEG).toBeCloseTo(20, 6);
  await expect.poll(() => page.getByTestId('heading-chart').count()).toBe(1);
  // Headings the solver could not settle are listed as such, the same ones as in Node.
  const unsolved = want.unsolved.map((h) => `${(h.headingRad / DEG).toFixed(1)}°`);
  if (unsolved.length > 0) expect(await page.getByTestId('heading-unsolved').textContent()).toContain(unsolved.join(', '));
  else expect(await page.getByTestId('heading-unsolved').count()).toBe(0);
  // The rose over the terrain changes the picture.
  await page.waitForTimeout(300);
  const after = await canvas.screenshot();
  expect(after.equals(before)).toBe(false);
  expect(errors).toEqual([]);
});
