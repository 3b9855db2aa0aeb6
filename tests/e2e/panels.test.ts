/**
 * End-to-end: the analysis panels of the built app in headless Chromium: the obstacle pass
 * (scrubber, events, headline), compare builds, the CG form, the report download, the line sweep
 * and CSV heights. Expected values come from the core run here in Node on the same scenario
 * files, never from the page. Screenshots of each panel go to test-artifacts/.
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, beforeEach, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import ledge from '../../assets/scenarios/ledge-crawler.json';
import demo from '../../assets/scenarios/side-hill-stock.json';
import {
  STANDARD_GRAVITY_M_PER_S2,
  buildModel,
  cgFromLevelReadings,
  cgHeightFromAxleLift,
  parseScenario,
  passOptionsOf,
  type Scenario,
} from '../../src/core';
import { REPORT_CAUTIONS, esc } from '../../src/report';
import { significant } from '../../src/present/units';
import { runPassWithSolves } from '../../src/worker/passReplay';
import { isHarmless, launchChromium, waitForScene } from './browser';

const ARTIFACTS = resolve(import.meta.dirname, '../../test-artifacts');
const LEDGE_FILE = resolve(import.meta.dirname, '../../assets/scenarios/ledge-crawler.json');

function scenarioOf(data: unknown): Scenario {
  const p = parseScenario(data);
  if (!p.ok) throw new Error(JSON.stringify(p.errors));
  return p.scenario;
}

function kgOf(text: string): number {
  const m = /(-?\d+)\s*kg\b/.exec(text);
  if (!m) throw new Error(`no kg load in "${text}"`);
  return Number(m[1]);
}

let browser: Browser;
let context: BrowserContext;
let page: Page;
let errors: string[];

beforeAll(async () => {
  browser = await launchChromium();
  mkdirSync(ARTIFACTS, { recursive: true });
});
afterAll(async () => {
  await context?.close();
  await browser?.close();
});
beforeEach(async () => {
  await context?.close();
  context = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block', acceptDownloads: true });
  page = await context.newPage();
  errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});

async function openLedge(): Promise<void> {
  await page.getByTestId('scenario-import').setInputFiles(LEDGE_FILE);
  await expect.poll(() => page.getByTestId('scenario-name').textContent()).toBe(ledge.name);
}

async function panelShot(heading: string, file: string): Promise<void> {
  const panel = page.locator(`section[aria-labelledby="${heading}"]`);
  await panel.scrollIntoViewIfNeeded();
  await panel.screenshot({ path: resolve(ARTIFACTS, file) });
}

it('obstacle pass: the headline is the core\'s, scrubbing poses the vehicle at the station with its loads, an event jumps there', async () => {
  const s = scenarioOf(ledge);
  const model = buildModel(s.vehicle, s.terrain);
  const { result: pass, solved } = runPassWithSolves(model, s.path!, passOptionsOf(s));
  expect(pass.firstUnload).not.toBeNull();
  expect(pass.events.length).toBeGreaterThan(2);
  await openLedge();
  await page.getByTestId('pass-run').click();
  const headline = page.getByTestId('pass-headline');
  await headline.waitFor({ timeout: 60_000 });
  const text = (await headline.textContent()) ?? '';
  // The outcome leads: the demo's belly hangs up on the boulder (src/core/analysis/pass.ts).
  expect(text).toMatch(/^Hangs up on the belly at \d+\.\d\d m/);
  const m = /(FL|FR|RL|RR) unloads first at (\d+\.\d\d) m/.exec(text);
  expect(m, text).not.toBeNull();
  expect(m![1]).toBe(pass.firstUnload!.wheel);
  expect(Number(m![2])).toBeCloseTo(pass.firstUnload!.distanceM, 2);
  const mm = /smallest force-angle margin (\d+\.\d)° at (\d+\.\d\d) m/.exec(text);
  expect(mm, text).not.toBeNull();
  expect(Number(mm![1])).toBeCloseTo((pass.minMargin!.forceAngleRad * 180) / Math.PI, 1);
  expect(Number(mm![2])).toBeCloseTo(pass.minMargin!.distanceM, 2);

  // Two stations whose FL scale readings differ by more than 20 kg (chosen from the Node pass).
  const kg = (i: number, k: number) => solved[i].wheels[k].verticalLoadN! / STANDARD_GRAVITY_M_PER_S2;
  const a = 0;
  let b = 0;
  for (let i = 0; i < solved.length; i++) if (Math.abs(kg(i, 0) - kg(0, 0)) > Math.abs(kg(b, 0) - kg(0, 0))) b = i;
  expect(Math.abs(kg(b, 0) - kg(a, 0))).toBeGreaterThan(20);
  const scrub = page.getByTestId('pass-station');
  await scrub.fill(String(a));
  await expect.poll(async () => kgOf((await page.getByTestId('wheel-load-FL').textContent()) ?? '')).toBe(Number(significant(kg(a, 0)))); // loads to 3 significant figures (src/present)
  await scrub.fill(String(b));
  await expect.poll(async () => kgOf((await page.getByTestId('wheel-load-FL').textContent()) ?? '')).toBe(Number(significant(kg(b, 0))));
  for (let k = 0; k < 4; k++) {
    const name = ['FL', 'FR', 'RL', 'RR'][k];
    expect(kgOf((await page.getByTestId(`wheel-load-${name}`).textContent()) ?? '')).toBe(Number(significant(kg(b, k))));
  }
  // The scene draws the station: the shown pose is the station's, the scenario is unchanged.
  const st = await page.evaluate(() => {
    const x = window.__plumbline!.store.getState();
    return { shown: x.shown?.pose ?? null, pose: x.scenario.pose, past: x.past.length };
  });
  expect(st.shown).toEqual(pass.stations[b].pose);
  expect(st.pose).toEqual(s.pose);
  await page.screenshot({ path: resolve(ARTIFACTS, 'pass-scene.png') });
  await panelShot('pass-h', 'pass-panel.png');

  // An event in the list jumps the scrubber to where it starts.
  const e = pass.events.findIndex((x) => x.kind === 'light');
  await page.getByTestId(`pass-event-${e}`).click();
  await expect.poll(() => scrub.inputValue()).toBe(String(pass.events[e].startStation));
  // And a mark on a chart does the same (the last one is drawn on top of any at the same place).
  await page.getByTestId('pass-chart-loads').locator('.chart-mark').last().click();
  await expect.poll(() => scrub.inputValue()).toBe(String(pass.events[pass.events.length - 1].startStation));
  // Play moves on along the path.
  await scrub.fill('0');
  await page.getByTestId('pass-play').click();
  await expect.poll(async () => Number(await scrub.inputValue()), { timeout: 5000 }).toBeGreaterThan(10);
  await page.getByTestId('pass-play').click();
  expect(errors).toEqual([]);
});

it('compare builds: one column per build (the vehicle as given first); two builds in the scene, one as an outline', async () => {
  const s = scenarioOf(ledge);
  const n = s.builds!.length + 1;
  await openLedge();
  await page.locator('#compare-h').click();
  await page.getByTestId('compare-run').click();
  const table = page.getByTestId('compare-table');
  await table.waitFor({ timeout: 90_000 });
  // Builds are the columns (after the quantity names), every quantity of the compare command a row.
  await expect(table.locator('thead th').count()).resolves.toBe(n + 1);
  await expect(table.locator('tbody tr').count()).resolves.toBe(19);
  const names = (await table.locator('thead th').allTextContents()).slice(1);
  expect(names[0]).toContain('as given');
  s.builds!.forEach((b, i) => expect(names[i + 1]).toContain(b.name));
  // The second build solid, the first as an outline.
  await page.getByTestId('compare-solid').selectOption('2');
  await page.getByTestId('compare-ghost').selectOption('1');
  const st = await page.evaluate(() => {
    const x = window.__plumbline!.store.getState();
    return { shown: x.shown?.vehicle.name ?? null, ghost: x.ghost?.vehicle.name ?? null, tyreRadius: x.shown?.vehicle.tyreFront.radiusM ?? null };
  });
  expect(st.shown).toContain(s.builds![1].name);
  expect(st.ghost).toContain(s.builds![0].name);
  await page.getByTestId('compare-swap').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().shown?.vehicle.name ?? '')).toContain(s.builds![0].name);
  await page.getByTestId('view-corner').click();
  await page.screenshot({ path: resolve(ARTIFACTS, 'compare-scene.png') });
  // The panel (build list and 19-row table) is taller than the side column at 800 px.
  await page.setViewportSize({ width: 1280, height: 2000 });
  await panelShot('compare-h', 'compare-panel.png');
  expect(errors).toEqual([]);
});

it('measure CG: the form gives the core\'s CG with its warnings and writes it into the vehicle (undoable)', async () => {
  const s = scenarioOf(demo);
  const g = STANDARD_GRAVITY_M_PER_S2;
  const corners = [560, 540, 590, 570];
  const level = cgFromLevelReadings({ cornersN: corners.map((c) => c * g) as [number, number, number, number], wheelbaseM: s.vehicle.wheelbaseM, trackFrontM: s.vehicle.trackFrontM, trackRearM: s.vehicle.trackRearM });
  // Front raised 0.45 m on a 3.1 m wheelbase: 8.3°, under the 10° of common practice.
  const lift = cgHeightFromAxleLift({
    wheelbaseM: s.vehicle.wheelbaseM,
    weightN: level.weightN,
    raisedAxle: 'front',
    raiseM: 0.45,
    levelStayingAxleN: level.rearAxleN,
    raisedStayingAxleN: (626 + 604) * g,
    loadedRadiusM: 0.37,
    suspensionLocked: false,
  });
  expect(lift.warnings.length).toBe(2);
  await page.locator('#cg-h').click();
  for (const [i, c] of ['fl', 'fr', 'rl', 'rr'].entries()) await page.getByTestId(`cg-${c}`).fill(String(corners[i]));
  await page.getByTestId('cg-axle').selectOption('front');
  await page.getByTestId('cg-raise').fill('0.45');
  await page.getByTestId('cg-staying-left').fill('626');
  await page.getByTestId('cg-staying-right').fill('604');
  await page.getByTestId('cg-radius').fill('0.37');
  await expect(page.getByTestId('cg-height').textContent()).resolves.toBe(`${lift.heightM.toFixed(3)} m high`);
  const warnings = await page.getByTestId('cg-warnings').locator('li').allTextContents();
  expect(warnings.some((w) => w.includes('below 10°'))).toBe(true);
  expect(warnings.some((w) => w.includes('lock'))).toBe(true);
  await panelShot('cg-h', 'cg-panel.png');
  await page.getByTestId('cg-write').click();
  const v = await page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle);
  expect(v.cg.heightM).toBeCloseTo(lift.heightM, 12);
  expect(v.cg.behindFrontAxleM).toBeCloseTo(level.behindFrontAxleM, 12);
  expect(v.cg.leftOfCentreM).toBeCloseTo(level.leftOfCentreM!, 12);
  expect(v.massKg).toBeCloseTo(level.massKg, 9);
  // The vehicle field shows the new height.
  await page.locator('#vehicle-h').click();
  await expect.poll(async () => Number(await page.getByTestId('field-vehicle.cg.height').inputValue())).toBeCloseTo(lift.heightM, 5);
  await page.getByTestId('undo').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.vehicle.cg.heightM)).toBe(s.vehicle.cg.heightM);
  expect(errors).toEqual([]);
});

it('the report button downloads one HTML file with the cautions, a picture of the 3D view and no outside address', async () => {
  await page.locator('#report-h').scrollIntoViewIfNeeded();
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 90_000 }), page.getByTestId('report-button').click()]);
  expect(download.suggestedFilename()).toMatch(/report-\d{4}-\d\d-\d\d\.html$/);
  const path = await download.path();
  const html = readFileSync(path!, 'utf8');
  expect(html.startsWith('<!DOCTYPE html>')).toBe(true);
  for (const c of REPORT_CAUTIONS) expect(html).toContain(esc(c));
  expect(html).toMatch(/<img src="data:image\/jpeg;base64,[A-Za-z0-9+/]+=*"/);
  // No address outside the file: no scheme with "://", no src/href other than data: or #, no CSS url() (":" cannot occur in base64).
  // (Matched as booleans: a failure must not print the whole report.)
  expect(/[a-z]+:\/\//i.exec(html)?.[0] ?? null).toBeNull();
  expect(/\b(?:src|href)\s*=\s*(?!["']?(?:data:|#)).{0,40}/i.exec(html)?.[0] ?? null).toBeNull();
  expect(/url\(\s*(?!["']?data:).{0,40}/i.exec(html)?.[0] ?? null).toBeNull();
  expect(/<script/i.test(html)).toBe(false);
  await expect(page.getByTestId('report-note').textContent()).resolves.toContain('Report saved');
  await panelShot('report-h', 'report-panel.png');
  expect(errors).toEqual([]);
});

it('line sweep: ranked lines from the worker, the best drawn on the terrain', async () => {
  await openLedge();
  await page.locator('#lines-h').click();
  await page.getByTestId('lines-offset-from').fill('-0.5');
  await page.getByTestId('lines-offset-to').fill('0.5');
  await page.getByTestId('lines-offset-step').fill('0.5');
  await page.getByTestId('lines-heading-from').fill('0');
  await page.getByTestId('lines-heading-to').fill('0');
  await page.getByTestId('lines-run').click();
  const list = page.getByTestId('lines-list');
  await list.waitFor({ timeout: 60_000 });
  await expect(list.locator('li').count()).resolves.toBe(3);
  const first = (await list.locator('li').first().textContent()) ?? '';
  expect(first).toMatch(/^Best: /);
  // The three lines were spread over the browser's cores (one worker each, up to four).
  const cores = await page.evaluate(() => navigator.hardwareConcurrency);
  const workers = Math.max(1, Math.min(4, cores, 3));
  await expect(page.getByText(/lines in \d+ ms on \d+ workers?\./).textContent()).resolves.toContain(`on ${workers} ${workers === 1 ? 'worker' : 'workers'}`);
  // The best line is drawn; picking the worst draws that one instead.
  const best = await page.evaluate(() => window.__plumbline!.store.getState().overlayPath);
  expect(best).not.toBeNull();
  await page.getByTestId('lines-row-2').click();
  const worst = await page.evaluate(() => window.__plumbline!.store.getState().overlayPath);
  expect(worst).not.toEqual(best);
  await page.getByTestId('view-above').click();
  await page.screenshot({ path: resolve(ARTIFACTS, 'lines-scene.png') });
  await panelShot('lines-h', 'lines-panel.png');
  expect(errors).toEqual([]);
});

it('CSV heights: a bad file lists its problems by row and column and keeps the scenario; a good one adds a profile; a broken rule is named by its field', async () => {
  await page.locator('#terrain-h').click();
  const before = await page.evaluate(() => window.__plumbline!.store.getState().scenario);
  const csv = page.getByTestId('terrain-csv');
  await csv.setInputFiles({ name: 'bad.csv', mimeType: 'text/csv', buffer: Buffer.from('\uFEFFs,z\r\n0,0\r\n1,abc\r\n2,0.1,4\r\n') });
  const list = page.getByTestId('error-list');
  await list.waitFor();
  const items = await list.locator('li').allTextContents();
  expect(items.some((t) => t.includes('bad.csv row 3, column 2') && t.includes('"abc" is not a number'))).toBe(true);
  expect(items.some((t) => t.includes('bad.csv row 4') && t.includes('expected 2'))).toBe(true);
  expect(await page.evaluate(() => window.__plumbline!.store.getState().scenario)).toEqual(before);
  await page.screenshot({ path: resolve(ARTIFACTS, 'csv-errors.png') });

  // Distances out of order: the scenario rule, named by the feature's field.
  await csv.setInputFiles({ name: 'order.csv', mimeType: 'text/csv', buffer: Buffer.from('0,0\n2,0.1\n1,0.2\n') });
  await expect.poll(() => list.textContent()).toContain('terrain.features[1].points');
  expect(await page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features.length)).toBe(1);

  await csv.setInputFiles({ name: 'hump.csv', mimeType: 'text/csv', buffer: Buffer.from('distance,height\n1,0\n1.5,0.12\n2,0\n') });
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features.length)).toBe(2);
  const f = await page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features[1]);
  expect(f).toEqual({ type: 'profile', axis: 'x', points: [[1, 0], [1.5, 0.12], [2, 0]], acrossM: null });
  expect(await page.getByTestId('error-list').count()).toBe(0);
  // Bounded across, then a point edited.
  await page.getByTestId('feature-1-bounded').check();
  await expect.poll(() => page.evaluate(() => (window.__plumbline!.store.getState().scenario.terrain.features[1] as { acrossM: unknown }).acrossM)).toEqual([-1.5, 1.5]);
  await page.getByTestId('feature-1-point-1-z').fill('0.2');
  await expect.poll(() => page.evaluate(() => (window.__plumbline!.store.getState().scenario.terrain.features[1] as unknown as { points: number[][] }).points[1][1])).toBe(0.2);
  await panelShot('terrain-h', 'terrain-panel.png');
  expect(errors).toEqual([]);
});
