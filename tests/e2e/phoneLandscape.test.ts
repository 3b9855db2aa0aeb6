/**
 * End-to-end on an emulated phone held in landscape (844 × 390 CSS px, touch, mobile viewport,
 * pixel ratio 3: the size class of a current 6.1-inch phone turned sideways). The page must not
 * scroll sideways, the 3D view must keep a usable size, the caution must be on the first screen,
 * every control must be at least 44 × 44 CSS px (WCAG 2.1 success criterion 2.5.5, Target Size:
 * 44 by 44 CSS pixels), and the panels must be reachable by touch: scrolled into view and tapped.
 * The tilt sweep's answer comes from the core run here in Node on the same file.
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { buildModel, parseScenario, tiltSweep } from '../../src/core';
import { launchChromium, waitForScene, watchedPage } from './browser';

const VIEW = { width: 844, height: 390 };
/** WCAG 2.1 SC 2.5.5: 44 × 44 CSS px. */
const TARGET_PX = 44;

let browser: Browser;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  page = await watchedPage(browser, errors, VIEW, { hasTouch: true, isMobile: true, deviceScaleFactor: 3 });
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

const pageWidth = () => page.evaluate(() => ({ scroll: document.scrollingElement!.scrollWidth, inner: innerWidth }));

/** Scrolls an element into view and checks that all of it is on the screen before a tap. */
async function reach(l: Locator): Promise<void> {
  await l.scrollIntoViewIfNeeded();
  const b = await l.boundingBox();
  expect(b).not.toBeNull();
  expect(b!.x).toBeGreaterThanOrEqual(0);
  expect(b!.y).toBeGreaterThanOrEqual(0);
  expect(b!.x + b!.width).toBeLessThanOrEqual(VIEW.width + 0.5);
  expect(b!.y + b!.height).toBeLessThanOrEqual(VIEW.height + 0.5);
}

it('fits the screen: no sideways scroll, a usable 3D view, the caution on the first screen', async () => {
  expect(await page.evaluate(() => matchMedia('(pointer: coarse)').matches)).toBe(true);
  const w = await pageWidth();
  expect(w.inner).toBe(VIEW.width);
  expect(w.scroll).toBeLessThanOrEqual(w.inner);
  const canvas = await page.locator('[data-testid="scene"] canvas').boundingBox();
  expect(canvas).not.toBeNull();
  // Usable (our target for a short screen): on the screen, at least 320 px wide and 60 % of the
  // screen's height (the top bar and the caution take the rest), and a third of its area: the
  // tyres and their labels readable, room to drag.
  expect(canvas!.x).toBeGreaterThanOrEqual(0);
  expect(canvas!.y + canvas!.height).toBeLessThanOrEqual(VIEW.height + 0.5);
  expect(canvas!.width).toBeGreaterThanOrEqual(320);
  expect(canvas!.height).toBeGreaterThanOrEqual(0.6 * VIEW.height);
  expect((canvas!.width * canvas!.height) / (VIEW.width * VIEW.height)).toBeGreaterThan(1 / 3);
  // The caution is read before anything else: wholly on the first screen.
  const caution = await page.locator('.caution').boundingBox();
  expect(caution).not.toBeNull();
  expect(caution!.y + caution!.height).toBeLessThanOrEqual(VIEW.height);
});

it('every control is at least 44 × 44 px', async () => {
  const small = await page.evaluate((min) => {
    const els = [...document.querySelectorAll('button, select, summary, .file-button, input[type="text"], input[type="number"]')] as HTMLElement[];
    return els
      .filter((e) => e.offsetParent !== null)
      .map((e) => {
        const r = e.getBoundingClientRect();
        // Fields are as wide as their column: only their height is a target size.
        const isField = e.tagName === 'INPUT' || e.tagName === 'SUMMARY';
        return { w: r.width, h: r.height, ok: r.height >= min && (isField || r.width >= min), what: `${e.tagName} ${(e.textContent || e.getAttribute('data-testid') || '').trim().slice(0, 30)}` };
      })
      .filter((x) => !x.ok);
  }, TARGET_PX);
  expect(small).toEqual([]);
});

it('the panels are in reach: the loads, a tilt sweep tapped and its answer, a closed panel opened', async () => {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  const s = p.scenario;
  const expected = tiltSweep(buildModel(s.vehicle, s.terrain), s.pose, { downhillRad: s.tilt.downhillRad, friction: s.friction });

  // The loads: every row of the table can be brought on screen.
  for (const w of ['FL', 'FR', 'RL', 'RR']) await reach(page.getByTestId(`table-load-${w}`));
  // The tilt table: scroll to the sweep button, tap it, read the first lift.
  const sweep = page.getByTestId('tilt-sweep');
  await reach(sweep);
  await sweep.tap();
  const first = page.getByTestId('first-lift');
  await first.waitFor({ timeout: 30_000 });
  await reach(first);
  expect(await first.getAttribute('data-wheel')).toBe(expected.firstLift!.wheel);
  expect(Math.abs(Number(await first.getAttribute('data-angle-deg')) - (expected.firstLift!.angleRad * 180) / Math.PI)).toBeLessThan(0.1);
  // A closed panel further down: tap its heading, it opens, its button is in reach.
  const roseHeading = page.locator('#rose-h');
  await reach(roseHeading);
  await roseHeading.tap();
  await reach(page.getByTestId('rose-run'));
  expect(await page.locator('details:has(#rose-h)').evaluate((d) => (d as HTMLDetailsElement).open)).toBe(true);
  // The view buttons over the 3D view stay in reach and work by touch.
  const above = page.getByTestId('view-above');
  await reach(above);
  await above.tap();
  // Still no sideways scroll with the results open.
  const w = await pageWidth();
  expect(w.scroll).toBeLessThanOrEqual(w.inner);
  expect(errors).toEqual([]);
});
