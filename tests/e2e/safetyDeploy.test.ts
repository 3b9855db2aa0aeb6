/**
 * Deploys reach users, offline ones too: two builds of the app (the second differs by one comment in
 * its entry script) served in turn from one address. Each build's service worker is byte-different
 * (its build id and file list are written in at build time), so the browser installs the new one;
 * the open page says "A new version … Reload"; after the reload the page runs the new build, only the
 * new build's cache is left, and offline the new build opens from it.
 */
import { cpSync, mkdtempSync, readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { extname, join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build } from 'vite';
import type { Browser } from 'playwright-core';
import { launchChromium, waitForScene } from './browser';

const ROOT = resolve(import.meta.dirname, '../..');
let browser: Browser;
let dirA: string;
let dirB: string;
let served: string;
let server: Server;
let url: string;

const buildId = (dir: string) => /const BUILD = "([0-9a-f]{16})"/.exec(readFileSync(join(dir, 'sw.js'), 'utf8'))?.[1] ?? null;
const entryScript = (dir: string) => /assets\/(index-[^"]+\.js)/.exec(readFileSync(join(dir, 'index.html'), 'utf8'))?.[1] ?? null;

beforeAll(async () => {
  const tmp = mkdtempSync(join(tmpdir(), 'plumbline-deploy-'));
  dirA = join(tmp, 'a');
  dirB = join(tmp, 'b');
  // Build A: the app as built for the test run. Build B: the same with one comment added to the entry script.
  cpSync(join(ROOT, 'dist'), dirA, { recursive: true });
  await build({
    root: ROOT,
    logLevel: 'warn',
    build: { outDir: dirB, emptyOutDir: true },
    plugins: [{ name: 'second-build', renderChunk: (code, chunk) => (chunk.isEntry ? `${code}\n/* second build */\n` : null) }],
  });
  served = dirA;
  const types: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.svg': 'image/svg+xml', '.webmanifest': 'application/manifest+json' };
  server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    const file = resolve(served, '.' + (path === '/' ? '/index.html' : path));
    if (!file.startsWith(served)) return void res.writeHead(403).end();
    try {
      const body = readFileSync(file);
      res.writeHead(200, { 'Content-Type': types[extname(file)] ?? 'application/octet-stream', 'Cache-Control': 'no-cache' }).end(body);
    } catch {
      res.writeHead(404).end();
    }
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  url = `http://127.0.0.1:${(server.address() as { port: number }).port}/`;
  browser = await launchChromium();
}, 300_000);

afterAll(async () => {
  await browser?.close();
  server?.close();
});

describe('a new build reaches users', () => {
  it('each build has its own service worker script and cache name', () => {
    const a = buildId(dirA);
    const b = buildId(dirB);
    expect(a).not.toBeNull();
    expect(b).not.toBeNull();
    expect(a).not.toBe(b);
    expect(readFileSync(join(dirA, 'sw.js'), 'utf8')).not.toBe(readFileSync(join(dirB, 'sw.js'), 'utf8'));
    // Every file of the build is in its worker's list (so offline has them all).
    const swB = readFileSync(join(dirB, 'sw.js'), 'utf8');
    expect(swB).toContain(`./assets/${entryScript(dirB)}`);
    expect(swB).toMatch(/analysis\.worker-[^"]+\.js/);
  });

  it('the open page says a new version is ready; after a reload it runs the new build, the old cache is gone, and offline it opens', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1024, height: 700 }, serviceWorkers: 'allow' });
    const page = await ctx.newPage();
    served = dirA;
    await page.goto(url);
    await waitForScene(page);
    await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 30_000 });
    const cachesA = await page.evaluate(() => caches.keys());
    expect(cachesA).toEqual([`plumbline-${buildId(dirA)}`]);
    expect(await page.getByTestId('update-ready').count()).toBe(0);

    // Deploy B; the open page looks for an update (as it does when it comes back into view).
    served = dirB;
    await page.evaluate(() => navigator.serviceWorker.getRegistration().then((r) => r?.update()));
    await page.getByTestId('update-ready').waitFor({ timeout: 30_000 });
    expect(await page.getByTestId('update-ready').textContent()).toContain('A new version of Plumbline is ready');
    await Promise.all([page.waitForEvent('load'), page.getByTestId('update-reload').click()]);
    await waitForScene(page);
    const scripts = await page.evaluate(() => [...document.scripts].map((s) => s.src));
    expect(scripts.some((s) => s.endsWith(entryScript(dirB)!))).toBe(true);
    await expect.poll(() => page.evaluate(() => caches.keys())).toEqual([`plumbline-${buildId(dirB)}`]);

    // Offline: the new build opens from its cache.
    await ctx.setOffline(true);
    await page.reload();
    await waitForScene(page);
    const offlineScripts = await page.evaluate(() => [...document.scripts].map((s) => s.src));
    expect(offlineScripts.some((s) => s.endsWith(entryScript(dirB)!))).toBe(true);
    await ctx.setOffline(false);
    await ctx.close();
  });
});
