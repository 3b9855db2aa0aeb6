/**
 * End-to-end: a trail leader draws a three-point line through the ledge demo's obstacle in the 3D
 * view, makes it the path, runs the pass and reads which wheel unloads first; saves the file,
 * reloads the page (the autosave) and opens the saved file: the line is still there. Then edits a
 * point, draws a second line and compares them. Expected values come from the core run here in Node
 * on the same points (read back from the page at full precision), never from the page.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import ledge from '../../assets/scenarios/ledge-crawler.json';
import { PathWalker, TerrainField, buildModel, candidateSpecs, parseScenario, passOptionsOf, polylinePath, rankCandidates, runLineSweepJob, runPass, type PathSpec, type Scenario } from '../../src/core';
import { AUTOSAVE_KEY } from '../../src/store/persist';
import { launchChromium, waitForScene, watchedPage } from './browser';

const LEDGE_FILE = resolve(import.meta.dirname, '../../assets/scenarios/ledge-crawler.json');
const SAVED_FILE = resolve(import.meta.dirname, '../../test-artifacts/fieldkit-path-saved.json');
let browser: Browser;
let page: Page;
const errors: string[] = [];
type XY = [number, number];

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
const drawnPoints = async (i: number): Promise<XY[]> => JSON.parse((await page.getByTestId(`path-line-${i}`).getAttribute('data-points')) ?? '[]');
const canvasBox = async () => (await page.locator('[data-testid="scene"] canvas').boundingBox())!;
let line: XY[] = [];

it('draw: three clicks make one line of three points over the ledge and the boulder', async () => {
  await page.getByTestId('view-above').click();
  const box = await canvasBox();
  // Zoom out (the wheel, before drawing) so the ledge (x = 3 m) and the boulder (x = 6.2 m) are in view.
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  for (let i = 0; i < 12; i++) await page.mouse.wheel(0, 200);
  await page.waitForTimeout(300);
  await page.locator('#path-h').click();
  await page.getByTestId('path-draw').click();
  await expect.poll(() => page.getByTestId('path-draw').getAttribute('aria-pressed')).toBe('true');
  // Where the screen meets the ground: a probe line across the view, then cleared. The above view
  // looks straight down, so ground x runs along the screen's width and y up its height, at one scale.
  const probe: XY[] = [[0.3, 0.6], [0.7, 0.6]];
  for (const [fx, fy] of probe) await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(2);
  const hit = await drawnPoints(0);
  await page.getByRole('button', { name: 'Clear' }).click();
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(0);
  const mPerPx = (hit[1][0] - hit[0][0]) / (0.4 * box.width);
  const screenOf = ([x, y]: XY): XY => [(0.3 * box.width + (x - hit[0][0]) / mPerPx) / box.width, (0.6 * box.height - (y - hit[0][1]) / mPerPx) / box.height];
  // The trail leader's line: bearing left to the ledge, then over it and on over the boulder (ground x 3 m and 6.2 m).
  const targets: XY[] = [[-0.5, 0], [2, 0.3], [7.5, 0]];
  const clicks = targets.map(screenOf);
  for (const [fx, fy] of clicks) {
    expect(fx).toBeGreaterThan(0.02);
    expect(fx).toBeLessThan(0.98);
    expect(fy).toBeGreaterThan(0.02);
    expect(fy).toBeLessThan(0.98);
  }
  for (const [fx, fy] of clicks) await page.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(3);
  await page.getByTestId('path-finish').click();
  line = await drawnPoints(0);
  expect(line).toHaveLength(3);
  // The markers sit where the clicks were (within a few pixels).
  for (let k = 0; k < 3; k++) {
    const m = (await page.locator(`[data-testid="path-point"][data-line="0"][data-point="${k}"]`).boundingBox())!;
    expect(Math.abs(m.x + m.width / 2 - (box.x + box.width * clicks[k][0]))).toBeLessThan(4);
    expect(Math.abs(m.y + m.height / 2 - (box.y + box.height * clicks[k][1]))).toBeLessThan(4);
  }
  // Through the obstacle: the ground along the drawn line (the core's terrain, in Node) rises by
  // more than 0.3 m somewhere (the demo's ledge is 0.40 m, the boulder 0.62 m).
  const s = scenarioOf(ledge);
  const field = new TerrainField(s.terrain);
  const walk = new PathWalker(polylinePath(line, 0.05), 0);
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i <= 400; i++) {
    walk.at((i / 400) * walk.lengthM);
    const h = field.height(walk.xM, walk.yM);
    lo = Math.min(lo, h);
    hi = Math.max(hi, h);
  }
  expect(hi - lo).toBeGreaterThan(0.3);
  // Kept in the scenario as a saved line at once.
  const saved = await page.evaluate(() => window.__plumbline!.store.getState().scenario.candidates);
  expect(saved).toEqual([{ name: 'Line 1', pointsM: line }]);
  await page.screenshot({ path: resolve(import.meta.dirname, '../../test-artifacts/fieldkit-path.png') });
  await page.getByTestId('path-draw').click();
});

it('run the pass along it: the headline names the first wheel to unload, as the core does on the same points', async () => {
  await page.getByTestId('path-use-0').click();
  await expect.poll(() => page.getByTestId('path-note').textContent()).toMatch(/Line 1 is the scenario's path/);
  const path = (await scenarioPath()) as PathSpec;
  expect([path.fromM, ...(path.viaM ?? []), path.toM]).toEqual(line);
  expect(path.stepM).toBe(ledge.path.step);
  await expect.poll(() => page.getByTestId('path-is-path-0').count()).toBe(1);
  const s = { ...scenarioOf(ledge), path };
  const pass = runPass(buildModel(s.vehicle, s.terrain), path, passOptionsOf(s));
  expect(pass.firstUnload).not.toBeNull();
  await page.getByTestId('pass-run').click();
  const headline = page.getByTestId('pass-headline');
  await headline.waitFor({ timeout: 60_000 });
  expect(await headline.getAttribute('data-first-unload-wheel')).toBe(pass.firstUnload!.wheel);
  expect((await headline.textContent()) ?? '').toContain(`${pass.firstUnload!.wheel} unloads first at ${pass.firstUnload!.distanceM.toFixed(2)} m`);
});

it('save the file, reload the page, open the saved file: the line and the path are still there', async () => {
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('scenario-export').click()]);
  await download.saveAs(SAVED_FILE);
  const file = JSON.parse(readFileSync(SAVED_FILE, 'utf8'));
  expect(file.candidates).toEqual([{ name: 'Line 1', points: line.map(([x, y]) => ({ x, y })) }]);
  expect(file.path.points).toEqual(line.map(([x, y]) => ({ x, y })));
  // The file opens in the core as the same path.
  expect(scenarioOf(file).path).toEqual(await scenarioPath());
  // Reload: the autosave brings the line back (once the autosave holds it).
  await expect.poll(() => page.evaluate((k) => JSON.parse(localStorage.getItem(k) ?? 'null')?.scenario?.candidates?.length ?? 0, AUTOSAVE_KEY)).toBe(1);
  await page.reload();
  await waitForScene(page);
  await page.locator('#path-h').click();
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(3);
  expect(await drawnPoints(0)).toEqual(line);
  // Clear the lines, then open the saved file: back again, with its path.
  await page.getByRole('button', { name: 'Clear' }).click();
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(0);
  expect(await page.evaluate(() => window.__plumbline!.store.getState().scenario.candidates)).toEqual([]);
  await page.getByTestId('scenario-import').setInputFiles(SAVED_FILE);
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(3);
  expect(await drawnPoints(0)).toEqual(line);
  expect(await page.getByTestId('path-line-0').getAttribute('data-name')).toBe('Line 1');
  const path = (await scenarioPath()) as PathSpec;
  expect([path.fromM, ...(path.viaM ?? []), path.toM]).toEqual(line);
});

it('edit: dragging the middle marker moves that point over the ground; × removes a point', async () => {
  const before = await drawnPoints(0);
  const marker = page.locator('[data-testid="path-point"][data-line="0"][data-point="1"]');
  await marker.waitFor({ state: 'visible' });
  const b = (await marker.boundingBox())!;
  await page.mouse.move(b.x + b.width / 2, b.y + b.height / 2);
  await page.mouse.down();
  await page.mouse.move(b.x + b.width / 2 + 30, b.y + b.height / 2 + 10, { steps: 5 });
  await page.mouse.up();
  await expect.poll(async () => JSON.stringify((await drawnPoints(0))[1])).not.toBe(JSON.stringify(before[1]));
  const after = await drawnPoints(0);
  expect(after[0]).toEqual(before[0]);
  expect(after[2]).toEqual(before[2]);
  const b2 = (await marker.boundingBox())!;
  expect(Math.abs(b2.x - b.x - 30)).toBeLessThan(4);
  // Saved in the scenario once let go.
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.candidates?.[0].pointsM[1])).toEqual(after[1]);
  // Remove the moved point: a straight line from the first to the last point remains.
  await page.getByTestId('path-point-remove-0-1').click();
  await expect.poll(() => drawnPoints(0)).toEqual([before[0], before[2]]);
});

it('compare two lines (a second one dragged): ranked in the workers as the core ranks them, named, ties as ties', async () => {
  const box = await canvasBox();
  const first = page.locator('[data-testid="path-point"][data-line="0"][data-point="0"]');
  const m0 = (await first.boundingBox())!;
  await page.getByTestId('path-draw').click();
  await page.mouse.move(box.x + box.width * 0.3, box.y + box.height * 0.7);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.7, { steps: 4 });
  await page.mouse.move(box.x + box.width * 0.7, box.y + box.height * 0.7, { steps: 4 });
  await page.mouse.up();
  await expect.poll(() => page.getByTestId('path-point').count()).toBe(4);
  // The drag drew a line and did not orbit the camera: the first line's start marker has not moved on screen.
  const m0after = (await first.boundingBox())!;
  expect(Math.abs(m0after.x - m0.x)).toBeLessThan(1);
  expect(Math.abs(m0after.y - m0.y)).toBeLessThan(1);
  await page.getByTestId('path-draw').click();
  await page.getByTestId('path-compare').click();
  const rows = page.getByTestId('path-rank-row');
  await expect.poll(() => rows.count(), { timeout: 60_000 }).toBe(2);
  const drawn = [await drawnPoints(0), await drawnPoints(1)];
  const s = scenarioOf(ledge);
  const step = ((await scenarioPath()) as PathSpec).stepM;
  const specs = candidateSpecs(drawn.map((l) => polylinePath(l, step)));
  const ranked = rankCandidates(runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: passOptionsOf(s), lines: specs }));
  for (let k = 0; k < 2; k++) {
    const row = rows.nth(k);
    expect(Number(await row.getAttribute('data-line'))).toBe(ranked[k].summary.index);
    expect(Number(await row.getAttribute('data-rank'))).toBe(ranked[k].rank);
    expect(Number(await row.getAttribute('data-tied'))).toBe(ranked[k].tiedWith);
    const text = (await row.textContent()) ?? '';
    expect(text).toContain(`Line ${ranked[k].summary.index + 1}`);
    const fu = ranked[k].summary.firstUnload;
    if (fu) expect(text).toContain(`${fu.wheel} unloads first at ${fu.distanceM.toFixed(2)} m`);
    else expect(text).toContain('no wheel goes light');
    if (ranked[k].tiedWith > 1) expect(text).toMatch(/tied with/);
    else expect(text).not.toMatch(/tied with/);
  }
  expect(errors).toEqual([]);
});
