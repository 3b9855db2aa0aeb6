/**
 * End-to-end: a scenario whose imported grid has a filled patch under the front-left tyre, opened in
 * the built app: the pass, rose and heading sweep panels each say so, in the words the core and the
 * presentation layer give for the same file in Node (the positions are checked against the geometry
 * in tests/core/analysis/filledGround.test.ts).
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { buildModel, footprintRadiusM, groundPlaneAt, headingsEvery, parseScenario, parseScenarioText, runHeadingJob, runPass, scenarioToFile, TerrainField, type Scenario } from '../../src/core';
import { filledHeadingsWords, filledPassWords, filledSpotWords } from '../../src/present/words';
import { filledScenario, patchOf } from '../helpers/filledGrid';
import { launchChromium, waitForScene, watchedPage } from './browser';

let browser: Browser;
let page: Page;
const errors: string[] = [];
const dir = mkdtempSync(join(tmpdir(), 'plumbline-filled-e2e-'));
const FILE = join(dir, 'filled-patch.json');
let s: Scenario;

beforeAll(async () => {
  const base = parseScenario(demo);
  if (!base.ok) throw new Error('demo does not parse');
  // Filled nodes from x 1.2 to 3.0 m along the left track: under FL at the pose and along the path.
  writeFileSync(FILE, JSON.stringify(scenarioToFile(filledScenario(base.scenario, patchOf(1.2, 3.0, 0.6, 1.0)))));
  const back = parseScenarioText(readFileSync(FILE, 'utf8'));
  if (!back.ok) throw new Error(JSON.stringify(back.errors));
  s = back.scenario;
  browser = await launchChromium();
  page = await watchedPage(browser, errors);
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
  await page.getByTestId('scenario-import').setInputFiles(FILE);
  await page.waitForFunction((name) => document.querySelector('[data-testid="scenario-name"]')?.textContent === name, s.name, { timeout: 30_000 });
});
afterAll(async () => {
  await browser?.close();
  rmSync(dir, { recursive: true, force: true });
});

it('pass: the note names each wheel\'s stretch on filled ground, as in Node', async () => {
  const want = filledPassWords(runPass(buildModel(s.vehicle, s.terrain), s.path!, { friction: s.friction }), s.units);
  expect(want).toMatch(/^FL stands on filled ground from \d+\.\d\d m to \d+\.\d\d m; RL stands on filled ground from/);
  await page.getByTestId('pass-run').click();
  const note = page.getByTestId('pass-filled-ground');
  await note.waitFor({ timeout: 60_000 });
  expect(await note.textContent()).toBe(want);
  expect(errors).toEqual([]);
}, 90_000);

it('rose: the spot\'s front-left tyre stands on filled ground', async () => {
  await page.locator('#rose-h').click();
  await page.getByTestId('rose-run').click();
  const note = page.getByTestId('rose-filled-ground');
  await note.waitFor({ timeout: 120_000 });
  expect(await note.textContent()).toBe(filledSpotWords(['FL']));
  expect(errors).toEqual([]);
}, 150_000);

it('heading sweep: the headings at which a tyre stands on filled ground, as in Node', async () => {
  const ground = groundPlaneAt(new TerrainField(s.terrain), s.pose.xM, s.pose.yM, footprintRadiusM(s.vehicle));
  const results = runHeadingJob({ vehicle: s.vehicle, terrain: s.terrain, xM: s.pose.xM, yM: s.pose.yM, ground, headingsRad: headingsEvery((5 * Math.PI) / 180), friction: s.friction });
  const want = filledHeadingsWords(results);
  expect(want).not.toBeNull();
  await page.locator('#headings-h').click();
  await page.getByTestId('heading-sweep').click();
  const note = page.getByTestId('heading-filled-ground');
  await note.waitFor({ timeout: 120_000 });
  expect(await note.textContent()).toBe(want);
  expect(errors).toEqual([]);
}, 150_000);
