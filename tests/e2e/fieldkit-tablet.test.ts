/**
 * End-to-end on an emulated 768 × 1024 touch tablet: touch targets of at least 44 px, hints for a
 * finger, and the live tilt readout driven by emulated device orientation events (the W3C
 * DeviceOrientation event, dispatched on the window as the browser would): zero on level ground,
 * then a roll and a pitch read against the build's limits as the core computes them here in Node.
 * A desktop page with no sensor readings says so.
 */
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario } from '../../src/core';
import { cardFor } from '../../src/report/card';
import { isHarmless, launchChromium, waitForScene } from './browser';

const DEG = 180 / Math.PI;
let browser: Browser;
let context: BrowserContext;
let page: Page;
const errors: string[] = [];

beforeAll(async () => {
  browser = await launchChromium();
  context = await browser.newContext({ viewport: { width: 768, height: 1024 }, hasTouch: true, isMobile: true, serviceWorkers: 'block' });
  page = await context.newPage();
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});
afterAll(async () => {
  await browser?.close();
});

const orient = (beta: number, gamma: number) =>
  page.evaluate(([b, g]) => window.dispatchEvent(new DeviceOrientationEvent('deviceorientation', { alpha: 0, beta: b, gamma: g, absolute: false })), [beta, gamma]);

it('touch: coarse pointer, buttons and fields at least 44 px high, hints for a finger', async () => {
  expect(await page.evaluate(() => matchMedia('(pointer: coarse)').matches)).toBe(true);
  const small = await page.evaluate(() =>
    [...document.querySelectorAll('button, select, input[type="text"]')]
      .filter((e) => (e as HTMLElement).offsetParent !== null)
      .map((e) => ({ h: e.getBoundingClientRect().height, t: (e.textContent || (e as HTMLInputElement).name || e.tagName).slice(0, 30) }))
      .filter((x) => x.h < 44),
  );
  expect(small).toEqual([]);
  const help = page.getByTestId('scene-help');
  expect(await help.getAttribute('data-input')).toBe('touch');
  expect(await help.textContent()).not.toMatch(/Shift|right-drag|wheel/);
  // A tap on the view keeps the finger hints.
  await page.getByTestId('view-above').tap();
  expect(await help.getAttribute('data-input')).toBe('touch');
});

it('live tilt: zero on level ground, roll and pitch from emulated orientation, the margin against this build\'s limits', async () => {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  const card = cardFor(p.scenario, 'as given', p.scenario.vehicle, null);
  const d = Object.fromEntries(card.directions.map((x) => [x.name, x]));
  await page.locator('#tilt-live-h').scrollIntoViewIfNeeded();
  await page.locator('#tilt-live-h').tap();
  await page.getByTestId('tilt-live-start').tap();
  await orient(0, 0);
  await expect.poll(() => page.getByTestId('tilt-live-status').textContent()).toMatch(/Zero here on level ground/);
  await page.getByTestId('tilt-live-zero').tap();
  // Device flat, top edge forward: gamma 10° = right side down 10°; beta −5° = nose down 5°.
  await orient(-5, 10);
  // Expected from the W3C rotation R = Rz(α)·Rx(β)·Ry(γ): gravity in device axes = −(third row of R)
  // = (cos β sin γ, −sin β, −cos β cos γ); flat with the top edge (+y) forward and the right edge +x:
  // roll (right side down) = atan2(g_x, −g_z), pitch (nose down) = atan2(g_y, −g_z).
  const b = -5 / DEG, g = 10 / DEG;
  const gx = Math.cos(b) * Math.sin(g), gy = -Math.sin(b), gz = -Math.cos(b) * Math.cos(g);
  const rollDeg = Math.atan2(gx, -gz) * DEG; // 10.000°
  const pitchDeg = Math.atan2(gy, -gz) * DEG; // 5.077°
  await expect.poll(() => page.getByTestId('tilt-live-roll').textContent()).toBe(`${rollDeg.toFixed(1)}° right side down`);
  expect(await page.getByTestId('tilt-live-pitch').textContent()).toBe(`${pitchDeg.toFixed(1)}° nose down`);
  // The smaller margin to the first lift of the two axes, as the core gives the limits.
  const rightLift = (d.rightDown.lift ?? d.rightDown.tip)!.angleRad * DEG;
  const noseLift = (d.noseDown.lift ?? d.noseDown.tip)!.angleRad * DEG;
  const toLift = Math.min(rightLift - rollDeg, noseLift - pitchDeg);
  const margin = page.getByTestId('tilt-live-margin');
  expect(Number(await margin.getAttribute('data-to-lift-deg'))).toBeCloseTo(toLift, 6);
  expect(await margin.textContent()).toContain(`Margin left: ${toLift.toFixed(1)}° to the first wheel lift`);
  expect(await margin.getAttribute('data-past-operating')).toBe('false');
  // Past the operating line (15° at most, common practice): 20° left side down.
  await orient(0, -20);
  await expect.poll(() => page.getByTestId('tilt-live-roll').textContent()).toBe('20.0° left side down');
  expect(await margin.getAttribute('data-past-operating')).toBe('true');
  expect(await margin.textContent()).toMatch(/^PAST THE OPERATING LINE/);
  expect(errors).toEqual([]);
});

it('a desktop page that gets no readings says there is no sensor', async () => {
  await context.close();
  const deskContext = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
  const desk = await deskContext.newPage();
  await desk.goto(inject('baseUrl'));
  await waitForScene(desk);
  await desk.locator('#tilt-live-h').click();
  await desk.getByTestId('tilt-live-start').click();
  await expect.poll(() => desk.getByTestId('tilt-live-status').textContent(), { timeout: 6000 }).toMatch(/No tilt sensor on this device/);
  expect(await desk.getByTestId('tilt-live-roll').textContent()).toBe('–');
  await deskContext.close();
});
