/**
 * End-to-end: a pose past the tip. The side-hill demo tilted 60° more, left side down, does not
 * stand (the rigid bound for this vehicle, atan(T/2h), is well below 60°). The app must say so and
 * show no loads as if they were real: no scale readings, no sum, no margins; the body is drawn as a
 * ghost. The expected status comes from the core run here in Node on the same file.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { buildModel, parseScenario, solveEquilibrium } from '../../src/core';
import { launchChromium, waitForScene, watchedPage } from './browser';

const WHEELS = ['FL', 'FR', 'RL', 'RR'] as const;
const pastTip = { ...demo, tilt: { ...demo.tilt, angle: 60 } };

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors, { width: 1280, height: 720 });
});
afterAll(async () => {
  await browser?.close();
});

describe('a pose past the tip in the app', () => {
  it('says it goes over and shows no loads, no sum and no margins', async () => {
    // The core's answer for the same file: it does not stand.
    const parsed = parseScenario(pastTip);
    if (!parsed.ok) throw new Error('the tilted demo does not parse');
    const s = parsed.scenario;
    const r = solveEquilibrium(buildModel(s.vehicle, s.terrain), s.pose, { tilt: s.tilt, friction: s.friction });
    expect(r.standing).toBe(false);

    await page.goto(inject('baseUrl'));
    await waitForScene(page);
    // Standing first: the demo as bundled shows loads and no "goes over" note.
    expect(await page.getByTestId('pose-not-standing').count()).toBe(0);
    await page.getByTestId('scenario-import').setInputFiles({ name: 'past-tip.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(pastTip)) });
    const note = page.getByTestId('pose-not-standing');
    await note.waitFor({ timeout: 30_000 });
    expect(await note.textContent()).toMatch(/^Goes over: this pose does not stand/);
    expect(await note.getAttribute('data-status')).toBe(r.status);
    // No number of a state that is not a balance.
    expect((await page.getByTestId('load-sum').textContent())?.trim()).toBe('—');
    for (const w of WHEELS) {
      const row = (await page.getByTestId(`table-load-${w}`).textContent()) ?? '';
      expect(row).not.toMatch(/\d\s*(kg|kN|%)/);
    }
    expect(await page.getByTestId('solve-status').textContent()).not.toMatch(/force-angle margin/);
    expect(errors).toEqual([]);
  }, 90_000);
});
