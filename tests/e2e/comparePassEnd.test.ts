/**
 * End-to-end: the compare panel's hang-up row. The ledge demo from the top of its ledge (x = 5 m) to
 * past its boulder, with one build lifted 0.35 m: the vehicle as given hangs up on its belly at the
 * boulder (0.62 m high, belly 0.38 m up), the lifted build's belly clears it (plain geometry, see
 * tests/report/comparePassEnd.test.ts). The panel's words are the core's, run here in Node.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { AS_GIVEN, applyBuild, compareVehicles, parseScenarioText } from '../../src/core';
import { passEndWords } from '../../src/present/words';
import { launchChromium, waitForScene, watchedPage } from './browser';

let browser: Browser;
let page: Page;
const errors: string[] = [];

function fileText(): string {
  const s = JSON.parse(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));
  s.path = { from: [5.0, 0], to: [7.5, 0], step: 0.05 };
  s.builds = [{ name: 'tall: 0.35 m lift', lift: { suspension: 0.35 } }];
  return JSON.stringify(s);
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

it('compare: the hang-up row says the vehicle as given hangs up on its belly and the lifted build does not', async () => {
  const text = fileText();
  await page.getByTestId('scenario-import').setInputFiles({ name: 'ledge-top.json', mimeType: 'application/json', buffer: Buffer.from(text) });
  await page.locator('#compare-h').click();
  await expect.poll(() => page.getByTestId('compare-run').isEnabled(), { timeout: 30_000 }).toBe(true);
  await page.getByTestId('compare-run').click();
  const row = page.getByTestId('compare-row-passEnd');
  await row.waitFor({ timeout: 240_000 });
  expect(await page.getByTestId('compare-passEnd-0').getAttribute('data-outcome')).toBe('hangs-up');
  expect(await page.getByTestId('compare-passEnd-1').getAttribute('data-outcome')).not.toBe('hangs-up');
  // The words, in the app's units (the file's: metric), as the core gives them in Node.
  const r = parseScenarioText(text);
  if (!r.ok) throw new Error('file');
  const s = r.scenario;
  const rows = compareVehicles([{ name: 'as given', vehicle: s.vehicle, changes: AS_GIVEN }, applyBuild(s.vehicle, s.builds![0])], {
    terrain: s.terrain,
    path: s.path,
    friction: s.friction,
    roseStepRad: Math.PI / 2,
  });
  expect(await page.getByTestId('compare-passEnd-0').textContent()).toBe(passEndWords(rows[0].passEnd, 'metric'));
  expect(await page.getByTestId('compare-passEnd-1').textContent()).toBe(passEndWords(rows[1].passEnd, 'metric'));
  expect(await page.getByTestId('compare-passEnd-0').textContent()).toMatch(/^hangs up on the belly at \d+\.\d\d m/);
  expect(errors).toEqual([]);
}, 300_000);
