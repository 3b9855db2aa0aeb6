/**
 * End-to-end, the presentation layer in the built app: the user's units reach the downloaded
 * report, and the camera (drei's OrbitControls) orbits and zooms while a press on the vehicle
 * still drags the vehicle, not the view.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, beforeEach, describe, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { isHarmless, launchChromium, waitForScene } from './browser';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let errors: string[];

type Cam = { position: [number, number, number]; target: [number, number, number] };
type Handles = { store: { getState(): { scenario: { pose: { xM: number; yM: number } } } }; scene: { cameraState(): Cam | null } | null };

const cam = (): Promise<Cam> => page.evaluate(() => (window as unknown as { __plumbline: Handles }).__plumbline.scene!.cameraState()!);
const pose = (): Promise<{ xM: number; yM: number }> => page.evaluate(() => (window as unknown as { __plumbline: Handles }).__plumbline.store.getState().scenario.pose);
const dist = (c: Cam): number => Math.hypot(c.position[0] - c.target[0], c.position[1] - c.target[1], c.position[2] - c.target[2]);

beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await browser?.close();
});
beforeEach(async () => {
  await context?.close();
  context = await browser.newContext({ viewport: { width: 1280, height: 720 }, serviceWorkers: 'block', acceptDownloads: true });
  page = await context.newPage();
  errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});

describe('the user\'s units', () => {
  it('app set to imperial: the downloaded report shows in, lb and lbf, and no mm, kg or N in its tables and charts', async () => {
    await page.getByTestId('units').selectOption('imperial');
    await page.locator('#report-h').scrollIntoViewIfNeeded();
    const [download] = await Promise.all([page.waitForEvent('download', { timeout: 90_000 }), page.getByTestId('report-button').click()]);
    const html = readFileSync((await download.path())!, 'utf8');
    const tables = (html.match(/<table[\s\S]*?<\/table>/g) ?? []).join('\n');
    const chartText = (html.match(/<text[^>]*>[^<]*<\/text>/g) ?? []).join('\n');
    expect(tables.length).toBeGreaterThan(1000);
    // Imperial: lengths in inches, masses in pounds, forces in pound-force (src/present/units.ts).
    expect(tables).toMatch(/\d in\b/);
    expect(tables).toMatch(/\d lb\b/);
    expect(tables).toMatch(/\blbf\b/);
    expect(html).toContain('Units: imperial (in, ft, lb, lbf, lbf/in, lbf·ft/deg)');
    expect(chartText).toContain('Normal load per tyre (lbf) along the path');
    for (const text of [tables, chartText]) {
      // Matched as the first hit, not the whole text, so a failure stays readable.
      expect(/.{0,30}\b(mm|kg)\b.{0,30}/.exec(text)?.[0] ?? null).toBeNull();
      expect(/.{0,30}\d N\b.{0,30}/.exec(text)?.[0] ?? null).toBeNull();
      expect(/.{0,30}\(N\).{0,30}/.exec(text)?.[0] ?? null).toBeNull();
    }
    expect(errors).toEqual([]);
  });
});

describe('the camera', () => {
  it('orbits and zooms with the mouse; a press on the vehicle drags the vehicle, not the view', async () => {
    const canvas = page.locator('[data-testid="scene"] canvas');
    const box = (await canvas.boundingBox())!;
    const c0 = await cam();
    const p0 = await pose();

    // Orbit from near the top-left corner (sky or far terrain, not the vehicle).
    await page.mouse.move(box.x + 40, box.y + 40);
    await page.mouse.down();
    await page.mouse.move(box.x + 140, box.y + 60, { steps: 5 });
    await page.mouse.up();
    const c1 = await cam();
    expect(Math.hypot(c1.position[0] - c0.position[0], c1.position[1] - c0.position[1], c1.position[2] - c0.position[2])).toBeGreaterThan(0.5);
    expect(dist(c1)).toBeCloseTo(dist(c0), 3); // a rotation about the target keeps the distance
    expect(c1.target).toEqual(c0.target);
    expect(await pose()).toEqual(p0);

    // Zoom with the wheel: closer, same target.
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    // (three's orbit controls dolly by a fixed step per wheel event: 0.95^zoomSpeed.)
    for (let i = 0; i < 5; i++) await page.mouse.wheel(0, -100);
    await expect.poll(async () => dist(await cam())).toBeLessThan(dist(c1) * 0.9);
    const c2 = await cam();

    // Back to the corner view, where the vehicle sits at the middle of the canvas: dragging it moves the vehicle.
    await page.getByTestId('view-corner').click();
    const c3 = await cam();
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width / 2 + 80, box.y + box.height / 2, { steps: 6 });
    await page.mouse.up();
    const p1 = await pose();
    expect(Math.hypot(p1.xM - p0.xM, p1.yM - p0.yM)).toBeGreaterThan(0.1);
    const c4 = await cam();
    // The view did not orbit during the drag (the camera followed nothing while dragging): the same
    // position to 1e-9 m (the controls' damping settles in the last bits of a double, run to run).
    expect(c4.position).toHaveLength(3);
    for (let k = 0; k < 3; k++) expect(c4.position[k]).toBeCloseTo(c3.position[k], 9);
    expect(dist(c2)).toBeLessThan(dist(c1));
    expect(errors).toEqual([]);
  });
});
