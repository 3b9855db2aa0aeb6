/**
 * End-to-end: a trail leader draws lines through the ledge demo's obstacle in the 3D view, moves an
 * end, makes one the path, runs the pass along it and compares the lines. Expected values come from
 * the core run here in Node on the same lines (read back from the page at full precision).
 */
import { resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import ledge from '../../assets/scenarios/ledge-crawler.json';
import { buildModel, candidateSpecs, parseScenario, passOptionsOf, rankCandidates, runLineSweepJob, runPass, type PathSpec, type Scenario } from '../../src/core';
import { lineToPath } from '../../src/view/PathDrawState';
import { launchChromium, waitForScene, watchedPage } from './browser';

const LEDGE_FILE = resolve(import.meta.dirname, '../../assets/scenarios/ledge-crawler.json');
let browser: Browser;
let page: Page;
const errors: string[] = [];

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
  await page.getByTestId('scenario-import').setInputFiles(LEDGE_FILE);
  await page.waitForFunction((name) => document.querySelector('[data-testid="scenario-name"]')?.textContent === name, ledge.name);
});
afterAll(async () => {
  await browser?.close();
});

const scenarioPath = () => page.evaluate(() => window.__plumbline!.store.getState().scenario.path);

it('draw: two clicks on the ground make a line with two markers; the view does not turn', async () => {
  await page.getByTestId('view-above').click();
  const canvas = page.locator('[data-testid="scene"] canvas');
  const box = (await canvas.boundingBox())!;
  await page.locator('#path-h').click();
  await page.getByTestId('path-draw').click();
  await expect.poll(() => page.getByTestId('path-draw').getAttribute('aria-pressed')).toBe('true');
  // Two points across the view's middle (the above view looks down on the vehicle).
  await page.mouse.click(box.x + box.width * 0.3, box.y + box.height * 0.5);
  await page.mouse.click(box.x + box.width * 0.7, box.y + box.height * 0.5);
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(2);
  await expect.poll(() => page.getByTestId('path-line-0').textContent()).toMatch(/\(-?\d+\.\d\d, -?\d+\.\d\d\) m → \(-?\d+\.\d\d, -?\d+\.\d\d\) m/);
  // The markers sit where the clicks were (within a few pixels).
  const m0 = (await page.locator('[data-testid="path-point"][data-end="from"]').boundingBox())!;
  expect(Math.abs(m0.x + m0.width / 2 - (box.x + box.width * 0.3))).toBeLessThan(4);
  expect(Math.abs(m0.y + m0.height / 2 - (box.y + box.height * 0.5))).toBeLessThan(4);
  // A second line, pressed and dragged.
  await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.65);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.65, { steps: 4 });
  await page.mouse.move(box.x + box.width * 0.7, box.y + box.height * 0.65, { steps: 4 });
  await page.mouse.up();
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(4);
  // The drag drew a line and did not orbit the camera: the first line's start marker has not moved on screen.
  const m0after = (await page.locator('[data-testid="path-point"][data-line="0"][data-end="from"]').boundingBox())!;
  expect(Math.abs(m0after.x - m0.x)).toBeLessThan(1);
  expect(Math.abs(m0after.y - m0.y)).toBeLessThan(1);
  await page.screenshot({ path: resolve(import.meta.dirname, '../../test-artifacts/fieldkit-path.png') });
  await page.getByTestId('path-draw').click();
});

it('edit: dragging a marker moves that end over the ground', async () => {
  const text0 = (await page.getByTestId('path-line-0').textContent()) ?? '';
  const marker = page.locator('[data-testid="path-point"][data-line="0"][data-end="to"]');
  const b = (await marker.boundingBox())!;
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width / 2 + 40, b.y + b.height / 2 + 10, { steps: 5 });
  await page.mouse.up();
  await expect.poll(() => page.getByTestId('path-line-0').textContent()).not.toBe(text0);
  const b2 = (await marker.boundingBox())!;
  expect(Math.abs(b2.x - b.x - 40)).toBeLessThan(4);
  // The start did not move.
  expect(((await page.getByTestId('path-line-0').textContent()) ?? '').split('→')[0]).toBe(text0.split('→')[0]);
});

it('use a line as the path: saved in the scenario; the pass runs along it and names the first wheel to unload', async () => {
  await page.getByTestId('path-use-0').click();
  await expect.poll(() => page.getByTestId('path-note').textContent()).toMatch(/Line 1 is the scenario's path/);
  const path = (await scenarioPath()) as PathSpec;
  const shown = ((await page.getByTestId('path-line-0').textContent()) ?? '').match(/-?\d+\.\d\d/g)!.map(Number);
  expect(path.fromM[0]).toBeCloseTo(shown[0], 2);
  expect(path.toM[1]).toBeCloseTo(shown[3], 2);
  expect(path.stepM).toBe(ledge.path.step);
  // The pass in the app along it, against the core in Node on the same scenario.
  const s = { ...scenarioOf(ledge), path };
  const pass = runPass(buildModel(s.vehicle, s.terrain), path, passOptionsOf(s));
  await page.getByTestId('pass-run').click();
  const headline = page.getByTestId('pass-headline');
  await headline.waitFor({ timeout: 60_000 });
  expect(await headline.getAttribute('data-first-unload-wheel')).toBe(pass.firstUnload?.wheel ?? '');
  const text = (await headline.textContent()) ?? '';
  if (pass.firstUnload) expect(text).toContain(`${pass.firstUnload.wheel} unloads first at ${pass.firstUnload.distanceM.toFixed(2)} m`);
  // The scenario file written from the app keeps the path (it is saved in the scenario).
  const saved = await page.evaluate(() => window.__plumbline!.store.getState().scenario.path);
  expect(saved).toEqual(path);
});

it('compare the drawn lines: ranked in the workers as the core ranks them, each with its first wheel to unload', async () => {
  await page.getByTestId('path-compare').click();
  const rows = page.getByTestId('path-rank-row');
  await expect.poll(() => rows.count(), { timeout: 60_000 }).toBe(2);
  // The drawn lines at full precision, and the core's answer for them in Node.
  const drawn = await page.locator('[data-testid^="path-line-"]').evaluateAll((els) =>
    els.map((e) => ({ from: e.getAttribute('data-from')!.split(',').map(Number), to: e.getAttribute('data-to')!.split(',').map(Number) })),
  );
  const s = scenarioOf(ledge);
  const step = ((await scenarioPath()) as PathSpec).stepM;
  const specs = candidateSpecs(drawn.map((l) => lineToPath({ from: [l.from[0], l.from[1]], to: [l.to[0], l.to[1]] }, step)));
  const ranked = rankCandidates(runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: passOptionsOf(s), lines: specs }));
  for (let k = 0; k < 2; k++) {
    const row = rows.nth(k);
    expect(Number(await row.getAttribute('data-line'))).toBe(ranked[k].summary.index);
    expect(Number(await row.getAttribute('data-rank'))).toBe(ranked[k].rank);
    expect(Number(await row.getAttribute('data-tied'))).toBe(ranked[k].tiedWith);
    const fu = ranked[k].summary.firstUnload;
    const text = (await row.textContent()) ?? '';
    if (fu) expect(text).toContain(`${fu.wheel} unloads first at ${fu.distanceM.toFixed(2)} m`);
    else expect(text).toContain('no wheel goes light');
    if (ranked[k].tiedWith > 1) expect(text).toMatch(/tied with/);
  }
  expect(errors).toEqual([]);
});
