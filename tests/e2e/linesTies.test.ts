/**
 * End-to-end: the line sweep lists ties as ties. On the side-hill demo's plane, lines moved
 * sideways with the same heading cross the same 20° slope, so their smallest force-angle margins
 * agree to far less than the method's stated resolution (0.1°) and must share one rank; lines
 * turned 30° cross a gentler slope (a plane of slope s crossed at heading change ψ has a cross
 * slope atan(tan s · cos ψ), 17.5° here: plane geometry) and rank apart. Ranks follow standard
 * competition ranking (1, 1, 1, 4: tied entries share the best rank, the next rank skips; common
 * practice in sports tables). Expected ranks come from the core run here in Node on the same file.
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, passOptionsOf, sweepLines } from '../../src/core';
import { launchChromium, waitForScene, watchedPage } from './browser';

const DEG = Math.PI / 180;
// A coarser station step than the demo's (0.5 m instead of 5 cm) keeps the sweep short; it is the same file otherwise.
const file = { ...demo, path: { ...demo.path, step: 0.5 } };

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors, { width: 1280, height: 900 });
});
afterAll(async () => {
  await browser?.close();
});

it('tied lines share a rank and say they are tied, with the resolution stated', async () => {
  const p = parseScenario(file);
  if (!p.ok) throw new Error('the demo does not parse');
  const s = p.scenario;
  const offsets = { from: -1, to: 1, step: 1 };
  const headings = { from: 0, to: 30 * DEG, step: 30 * DEG };
  const expected = sweepLines(s.vehicle, s.terrain, s.path!, offsets, headings, passOptionsOf(s));
  // The case has ties and more than one rank (else the test would show nothing).
  expect(expected.groups.length).toBe(2);
  expect(expected.groups.map((g) => g.length)).toEqual([3, 3]);
  expect(expected.rank).toEqual([1, 1, 1, 4, 4, 4]);
  // Turned 30°, the cross slope is gentler: those lines are the better group.
  for (const l of expected.groups[0]) expect(Math.abs(l.headingChangeRad - 30 * DEG)).toBeLessThan(1e-9);

  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  await page.getByTestId('scenario-import').setInputFiles({ name: 'side-hill.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(file)) });
  await page.locator('#lines-h').click();
  await page.getByTestId('lines-offset-from').fill('-1');
  await page.getByTestId('lines-offset-to').fill('1');
  await page.getByTestId('lines-offset-step').fill('1');
  await page.getByTestId('lines-heading-from').fill('0');
  await page.getByTestId('lines-heading-to').fill('30');
  await page.getByTestId('lines-heading-step').fill('30');
  await page.getByTestId('lines-run').click();
  const items = page.getByTestId('lines-item');
  await expect.poll(() => items.count(), { timeout: 90_000 }).toBe(6);
  for (let k = 0; k < 6; k++) {
    const li = items.nth(k);
    expect(Number(await li.getAttribute('data-rank'))).toBe(expected.rank[k]);
    // The list's own number is the rank: tied lines show the same number.
    expect(await li.evaluate((e) => (e as HTMLLIElement).value)).toBe(expected.rank[k]);
    expect(Number(await li.getAttribute('data-tied'))).toBe(expected.tiedWith[k].length);
    const text = (await li.textContent()) ?? '';
    expect(text).toContain(`tied (rank ${expected.rank[k]}) with 2 others: margins within 0.1°`);
    expect(text.startsWith(expected.rank[k] === 1 ? 'Best: ' : 'Worst: ')).toBe(true);
  }
  expect(await page.getByTestId('lines-result').textContent()).toContain('differ by more than 0.1°, the method');
  expect(errors).toEqual([]);
}, 150_000);
