/**
 * Performance figures for the web app (a measuring script, not a test): run after `vite build` with
 *   npx tsx tests/e2e/measure.mts
 * in headless Chromium with software WebGL at 1280×720. Prints JSON:
 * - fps while dragging the vehicle (re-solving on every move) and while orbiting (no re-solve), and their ratio
 * - ms per drag event spent solving and updating the scene objects
 * - time from navigation start to the first drawn, solved frame
 * - gzipped size of the JavaScript loaded at start, and of all JavaScript
 */
import { readFileSync, readdirSync } from 'node:fs';
import { resolve } from 'node:path';
import { gzipSync } from 'node:zlib';
import { preview } from 'vite';
import type { Page } from 'playwright-core';
import { launchChromium, waitForScene } from './browser';

const root = resolve(import.meta.dirname, '../..');
const dist = resolve(root, 'dist');

function jsSizes(): { firstLoadGzipKB: number; allGzipKB: number; files: Record<string, number> } {
  const html = readFileSync(resolve(dist, 'index.html'), 'utf8');
  const files: Record<string, number> = {};
  let first = 0;
  let all = 0;
  for (const f of readdirSync(resolve(dist, 'assets'))) {
    if (!f.endsWith('.js')) continue;
    const gz = gzipSync(readFileSync(resolve(dist, 'assets', f))).length / 1024;
    files[f] = Math.round(gz * 10) / 10;
    all += gz;
    // Loaded at start: the entry script and its modulepreloads, both named in index.html.
    if (html.includes(`assets/${f}`)) first += gz;
  }
  return { firstLoadGzipKB: Math.round(first), allGzipKB: Math.round(all), files };
}

async function stats(page: Page): Promise<{ frames: number; dragEvents: number; dragMs: number }> {
  return page.evaluate(() => {
    const s = window.__plumbline!.scene!.stats;
    return { frames: s.frames, dragEvents: s.dragEvents, dragMs: s.dragMs };
  });
}

/** Presses at (x0, y0) and sweeps the pointer ±dx for durationMs; returns frames per second and the stats delta. */
async function sweep(page: Page, x0: number, y0: number, dx: number, durationMs: number) {
  await page.mouse.move(x0, y0);
  await page.mouse.down();
  const s0 = await stats(page);
  const t0 = Date.now();
  let i = 0;
  while (Date.now() - t0 < durationMs) {
    const phase = (i++ % 40) / 40;
    const x = x0 + dx * Math.sin(phase * 2 * Math.PI);
    await page.mouse.move(x, y0 + 0.3 * dx * Math.sin(phase * 4 * Math.PI));
  }
  const elapsed = Date.now() - t0;
  const s1 = await stats(page);
  await page.mouse.up();
  return {
    fps: ((s1.frames - s0.frames) * 1000) / elapsed,
    moves: i,
    dragEvents: s1.dragEvents - s0.dragEvents,
    dragMs: s1.dragMs - s0.dragMs,
  };
}

const server = await preview({ root, logLevel: 'warn', preview: { host: '127.0.0.1', port: 0 } });
const url = server.resolvedUrls!.local[0];
const browser = await launchChromium();
try {
  const page = await browser.newPage({ viewport: { width: 1280, height: 720 } });
  await page.goto(url);
  await waitForScene(page);
  const firstFrameMs = await page.evaluate(() => window.__plumbline!.scene!.stats.firstFrameMs!);
  await page.getByTestId('view-above').click();
  await page.waitForTimeout(500);
  const box = (await page.getByTestId('scene').boundingBox())!;
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const runs: Record<string, Awaited<ReturnType<typeof sweep>>[]> = { orbit: [], drag: [] };
  for (let k = 0; k < 2; k++) {
    // Orbit: press on open ground near the top right corner of the view (no vehicle under the pointer).
    runs.orbit.push(await sweep(page, box.x + box.width - 90, box.y + 90, 60, 4000));
    await page.getByTestId('view-above').click();
    // Drag: press on the body, at the middle of the view from above.
    runs.drag.push(await sweep(page, cx, cy, 60, 4000));
    await page.getByTestId('view-above').click();
  }
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  const orbitFps = mean(runs.orbit.map((r) => r.fps));
  const dragFps = mean(runs.drag.map((r) => r.fps));
  const dragEvents = runs.drag.reduce((a, r) => a + r.dragEvents, 0);
  const dragMs = runs.drag.reduce((a, r) => a + r.dragMs, 0);
  console.log(
    JSON.stringify(
      {
        viewport: '1280x720',
        orbitFps: Math.round(orbitFps * 10) / 10,
        dragFps: Math.round(dragFps * 10) / 10,
        dragToOrbitRatio: Math.round((dragFps / orbitFps) * 100) / 100,
        dragEvents,
        msPerDragEvent: dragEvents ? Math.round((dragMs / dragEvents) * 1000) / 1000 : null,
        firstSolvedFrameMs: Math.round(firstFrameMs),
        ...jsSizes(),
        runs,
      },
      null,
      2,
    ),
  );
} finally {
  await browser.close();
  await new Promise<void>((r) => server.httpServer.close(() => r()));
}
