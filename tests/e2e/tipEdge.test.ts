/**
 * End-to-end: the tip edge drawn for a pose past the tip. The side-hill demo on a table tilted 60°,
 * left side down, does not stand (the same vehicle made rigid goes over at about 49° of ground
 * slope from level, tan θ = (T/2 + w/2 − y)/h, REFERENCES "Rollover of a rigid vehicle"; the
 * demo ground is already 20°). The scene must draw the edge it goes over (a bar on the ground, the
 * scene object's userData read through the scene handle), tag it in words, state the tip with its
 * datum, and show no loads as real. Expected values come from the core run here in Node on the
 * same file (tipViewOf on a store of the same scenario), never from the page.
 */
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario } from '../../src/core';
import { createPlumbStore } from '../../src/store/store';
import { tipViewOf } from '../../src/view/tipState';
import { launchChromium, waitForScene, watchedPage } from './browser';

const WHEELS = ['FL', 'FR', 'RL', 'RR'] as const;
const pastTip = { ...demo, tilt: { ...demo.tilt, angle: 60 } };

let browser: Browser;
let page: Page;
const errors: string[] = [];

type TipState = { visible: boolean; edge: string; fromM: number[]; toM: number[] } | null;
const tipState = () => page.evaluate(() => (window as unknown as { __plumbline: { scene: { tipEdgeState: () => TipState } } }).__plumbline.scene.tipEdgeState());

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors, { width: 1280, height: 720 });
});
afterAll(async () => {
  await browser?.close();
});

describe('the tip edge in the 3D view', () => {
  it('is drawn for a pose past the tip, on the downhill side, with the tip in words; never for a pose that stands', async () => {
    const parsed = parseScenario(pastTip);
    if (!parsed.ok) throw new Error('the tilted demo does not parse');
    const st = createPlumbStore(parsed.scenario).getState();
    expect(st.result.standing).toBe(false);
    const tv = tipViewOf(st);
    if (!tv) throw new Error('the core finds no tip for the tilted demo');

    await page.goto(inject('baseUrl'));
    await waitForScene(page);
    // The demo as bundled stands: no tip edge drawn, no tip sentence.
    expect((await tipState())?.visible).toBe(false);
    expect(await page.getByTestId('tip-edge').count()).toBe(0);

    await page.getByTestId('scenario-import').setInputFiles({ name: 'past-tip.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(pastTip)) });
    const note = page.getByTestId('tip-edge');
    await note.waitFor({ timeout: 60_000 });

    // The scene object: visible, about the edge tyres the core names, at the core's ends (the same
    // solve in the page; 1 mm allows the float32 of nothing here, the numbers are plain doubles).
    const drawn = await tipState();
    expect(drawn?.visible).toBe(true);
    expect(drawn?.edge).toBe(tv.tip.edge.join(','));
    expect(drawn?.edge).toBe('FL,RL');
    for (let k = 0; k < 3; k++) {
      expect(Math.abs(drawn!.fromM[k] - tv.edgeFromM[k])).toBeLessThan(1e-3);
      expect(Math.abs(drawn!.toM[k] - tv.edgeToM[k])).toBeLessThan(1e-3);
    }
    // In words, on the view: the side, the tip's tilt from level rounded to 0.1°, how far past it.
    const tag = page.getByTestId('tip-edge-tag');
    expect(await tag.textContent()).toBe('tips about the left side');
    expect(await tag.isVisible()).toBe(true);
    const tipDeg = (tv.tip.angleRad * 180) / Math.PI;
    const text = (await note.textContent()) ?? '';
    expect(text).toContain(`Tips about the left side (FL–RL) at ${tipDeg.toFixed(1)}° table tilt from level`);
    expect(text).toContain(`is ${(60 - tipDeg).toFixed(1)}° past it`);
    // The load panel says the same and shows no loads as real.
    expect(await page.getByTestId('pose-tip').textContent()).toContain(`at ${tipDeg.toFixed(1)}° table tilt from level`);
    expect((await page.getByTestId('load-sum').textContent())?.trim()).toBe('—');
    for (const w of WHEELS) {
      expect(await page.getByTestId(`table-load-${w}`).textContent()).not.toMatch(/\d\s*(kg|kN|lb|lbf|%)/);
      expect(await page.getByTestId(`wheel-load-${w}`).textContent()).not.toMatch(/\d\s*(kg|kN|lb|lbf|%)/);
    }
    expect(await page.getByTestId('solve-status').textContent()).not.toMatch(/force-angle margin/);

    // Back to a standing tilt: the edge and the sentence go.
    await page.getByTestId('tilt-angle').fill('0');
    await page.getByTestId('tilt-angle').press('Enter');
    await expect.poll(async () => (await tipState())?.visible, { timeout: 30_000 }).toBe(false);
    expect(await page.getByTestId('tip-edge').count()).toBe(0);
    expect(errors).toEqual([]);
  }, 120_000);
});
