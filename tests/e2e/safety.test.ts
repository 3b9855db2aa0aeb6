/**
 * Saved work is never lost, and the app is safe to open (the built app in headless Chromium):
 * - a share link opens as a new document beside the saved work (kept in the garage, one Undo away),
 *   and leaves the address bar, so a reload keeps later edits;
 * - "Share link" leaves the address bar alone, and refuses a scenario past 32 kB with a message;
 * - two tabs (two pages of one context) see each other's saves and never overwrite newer work silently;
 * - a large scenario (a height grid) is autosaved to IndexedDB and back after a reload;
 * - a failed save's warning stays through a later import's messages, until a save succeeds;
 * - a page on another local port that frames the app gets nothing: the header stops the frame, and
 *   where no header is sent the app refuses to run and reads no saved work;
 * - the analysis worker that closes, throws or hangs is re-run, or fails with a message.
 * Prints the hardening counts (tried, rejected, accepted, hung, crashed, lost work, executed).
 */
import { readFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { extname, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, type Scenario } from '../../src/core';
import { shareHash } from '../../src/store/persist';
import { isHarmless, launchChromium, waitForScene } from './browser';

const DIST = resolve(import.meta.dirname, '../../dist');
const AUTOSAVE_KEY = 'plumbline.autosave.v1';

interface Counts {
  tried: number;
  rejected: number;
  accepted: number;
  hung: number;
  crashed: number;
  lost: number;
  executed: number;
}
const counts: Counts = { tried: 0, rejected: 0, accepted: 0, hung: 0, crashed: 0, lost: 0, executed: 0 };

let browser: Browser;
let errors: string[] = [];
beforeAll(async () => {
  browser = await launchChromium();
});
afterAll(async () => {
  console.log(
    `[hardening] saved work, links, tabs, frames, app workers: ${counts.tried} tried, ${counts.rejected} rejected with a message, ` +
      `${counts.accepted} accepted, ${counts.hung} hung, ${counts.crashed} crashed, ${counts.lost} lost work, ${counts.executed} executed`,
  );
  await browser?.close();
});

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  return p.scenario;
}

async function newContext(): Promise<BrowserContext> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 720 }, serviceWorkers: 'block', acceptDownloads: true });
  ctx.on('page', (p) => {
    p.on('pageerror', (e) => errors.push(e.message));
    p.on('crash', () => counts.crashed++);
    p.on('console', (m) => {
      if (m.type() === 'error' && !isHarmless(m.text())) errors.push(m.text());
    });
  });
  return ctx;
}

async function open(page: Page, hash = ''): Promise<void> {
  await page.goto(inject('baseUrl') + hash);
  await waitForScene(page);
}

const state = (page: Page) =>
  page.evaluate(() => {
    const s = window.__plumbline!.store.getState();
    return { xM: s.scenario.pose.xM, tiltRad: s.scenario.tilt.angleRad, name: s.scenario.name, past: s.past.length };
  });

const savedX = (page: Page) => page.evaluate((k) => JSON.parse(localStorage.getItem(k) ?? 'null')?.scenario?.pose?.x ?? null, AUTOSAVE_KEY);

describe('share links and reloads', () => {
  it('a link opens beside the saved work: the earlier work is kept in the garage and one Undo away, and the link leaves the address bar', async () => {
    counts.tried++;
    errors = [];
    const ctx = await newContext();
    const page = await ctx.newPage();
    await open(page);
    await page.getByTestId('pose-x').fill('1.7');
    await expect.poll(async () => (await state(page)).xM).toBe(1.7);
    await expect.poll(() => savedX(page)).toBe(1.7);
    const linked = { ...demoScenario(), name: 'Linked side-hill (invented)', pose: { ...demoScenario().pose, xM: 0.9 } };
    // From another page, as a link is followed (a hash change alone would not load the page again).
    await page.goto('about:blank');
    await open(page, shareHash(linked));
    await page.getByTestId('link-opened').waitFor();
    expect(await page.getByTestId('link-opened').textContent()).toContain('kept in the garage');
    expect(new URL(page.url()).hash).toBe('');
    expect(await state(page)).toMatchObject({ xM: 0.9, name: linked.name });
    // The earlier work is in the garage.
    const names = await page.getByTestId('garage-item-name').allTextContents();
    expect(names.some((n) => n.includes('(kept when a link was opened)'))).toBe(true);
    // A reload opens the saved work (now the link's scenario), not the link again; edits after it survive.
    await page.getByTestId('pose-x').fill('1.25');
    await expect.poll(() => savedX(page)).toBe(1.25);
    await page.reload();
    await waitForScene(page);
    expect((await state(page)).xM).toBe(1.25);
    expect(await page.getByTestId('link-opened').count()).toBe(0);
    // Undo over an opened link: open it again, then step back.
    await page.goto('about:blank');
    await open(page, shareHash(linked));
    await page.getByTestId('link-opened').waitFor();
    expect((await state(page)).xM).toBe(0.9);
    await page.getByTestId('link-keep-mine').click();
    expect((await state(page)).xM).toBe(1.25);
    await expect.poll(() => savedX(page)).toBe(1.25);
    if ((await state(page)).xM !== 1.25) counts.lost++;
    counts.accepted++;
    expect(errors).toEqual([]);
    await ctx.close();
  });

  it('"Share link" leaves the address bar alone (a reload keeps later edits) and refuses a scenario past 32 kB', async () => {
    counts.tried += 2;
    const ctx = await newContext();
    const page = await ctx.newPage();
    await open(page);
    await page.getByTestId('pose-x').fill('0.9');
    await expect.poll(() => savedX(page)).toBe(0.9);
    await page.getByTestId('share').click();
    await page.getByTestId('share-note').waitFor();
    expect(new URL(page.url()).hash).toBe('');
    await page.getByTestId('pose-x').fill('1.7');
    await page.getByTestId('tilt-angle').fill('4');
    await expect.poll(() => savedX(page)).toBe(1.7);
    await page.reload();
    await waitForScene(page);
    const st = await state(page);
    expect(st.xM).toBe(1.7);
    expect(st.tiltRad).toBeCloseTo((4 * Math.PI) / 180, 12);
    counts.accepted++;
    // A profile of 20 000 points: far past 32 kB as a link.
    await page.evaluate(() => {
      const store = window.__plumbline!.store;
      const s = store.getState().scenario;
      const n = 20_000;
      const points = Array.from({ length: n }, (_, i) => [-50 + i * 0.01, 0.05 * Math.sin(-50 + i * 0.01)] as [number, number]);
      store.getState().replaceScenario({ ...s, terrain: { features: [...s.terrain.features, { type: 'profile', axis: 'x', points, acrossM: null }] } });
    });
    await page.getByTestId('share').click();
    await expect.poll(() => page.getByTestId('share-note').textContent()).toMatch(/too large for a link \(\d+ kB; links stop at 32 kB\)/);
    expect(await page.getByTestId('share-note').textContent()).not.toContain('Link copied');
    expect(await page.getByTestId('share-url').count()).toBe(0);
    counts.rejected++;
    await ctx.close();
  });
});

describe('two tabs', () => {
  it("each sees the other's saves and never overwrites newer work silently: load theirs or keep mine", async () => {
    counts.tried++;
    const ctx = await newContext();
    const a = await ctx.newPage();
    const b = await ctx.newPage();
    await open(a);
    await open(b);
    await a.getByTestId('pose-x').fill('0.9');
    await expect.poll(() => savedX(a)).toBe(0.9);
    // B hears of it at once.
    await b.getByTestId('tab-conflict').waitFor({ timeout: 5000 });
    await b.getByTestId('pose-x').fill('1.7');
    await expect.poll(async () => (await state(b)).xM).toBe(1.7);
    // A's newer save is not overwritten by B's edit.
    expect(await savedX(a)).toBe(0.9);
    await b.getByTestId('conflict-load').click();
    await expect.poll(async () => (await state(b)).xM).toBe(0.9);
    // B's own edit is one Undo away (and that undo is saved: B is up to date now).
    await b.getByTestId('undo').click();
    await expect.poll(async () => (await state(b)).xM).toBe(1.7);
    await expect.poll(() => savedX(b)).toBe(1.7);
    // Now A is behind: it says so, and "keep mine" saves A's over it.
    await a.getByTestId('tab-conflict').waitFor({ timeout: 5000 });
    await a.getByTestId('conflict-keep').click();
    await expect.poll(() => savedX(a)).toBe(0.9);
    await b.getByTestId('tab-conflict').waitFor({ timeout: 5000 });
    counts.accepted++;
    await ctx.close();
  });
});

describe('large scenarios and failed saves', () => {
  it('a 600 × 600 height grid is autosaved to IndexedDB and comes back after a reload', async () => {
    counts.tried++;
    const ctx = await newContext();
    const page = await ctx.newPage();
    await open(page);
    await page.evaluate(() => {
      const store = window.__plumbline!.store;
      const s = store.getState().scenario;
      const n = 600;
      const heightsM = Array.from({ length: n * n }, (_, i) => Math.round(200 * Math.sin(i * 0.0007)) / 1000);
      store.getState().replaceScenario({ ...s, terrain: { features: [{ type: 'grid', originM: [-30, -30], spacingM: 0.1, cols: n, rows: n, heightsM }] } as never });
    });
    await page.waitForFunction(() => localStorage.getItem('plumbline.autosave.rev')?.includes('"inDatabase":true'), undefined, { timeout: 30_000 });
    await page.reload();
    await waitForScene(page);
    const grid = await page.evaluate(() => {
      const f = window.__plumbline!.store.getState().scenario.terrain.features[0] as unknown as { type: string; cols: number; heightsM: ArrayLike<number> };
      return { type: f.type, cols: f.cols, n: f.heightsM.length, v: f.heightsM[123457] };
    });
    expect(grid).toEqual({ type: 'grid', cols: 600, n: 360_000, v: Math.round(200 * Math.sin(123457 * 0.0007)) / 1000 });
    counts.accepted++;
    await ctx.close();
  });

  it("a failed save's warning stays through a later import's messages until a save succeeds", async () => {
    counts.tried++;
    const ctx = await newContext();
    // No IndexedDB in this tab, so a full localStorage leaves nowhere to save.
    await ctx.addInitScript(() => Object.defineProperty(window, 'indexedDB', { value: undefined, configurable: true }));
    const page = await ctx.newPage();
    await open(page);
    await page.evaluate(() => {
      for (let size = 1 << 20, n = 0; size >= 1; size >>= 1) {
        const junk = 'j'.repeat(size);
        for (;;) {
          try {
            localStorage.setItem(`junk.${n++}`, junk);
          } catch {
            break;
          }
        }
      }
    });
    await page.getByTestId('pose-x').fill('1.1');
    await page.getByTestId('save-status').waitFor();
    expect(await page.getByTestId('save-status').textContent()).toContain('Autosave failed');
    // Open a valid file: its messages replace the warnings list, but the failure stays.
    const file = JSON.stringify({ ...demo, name: 'Imported while full' });
    await page.getByTestId('scenario-import').setInputFiles({ name: 'f.json', mimeType: 'application/json', buffer: Buffer.from(file) });
    await expect.poll(async () => (await state(page)).name).toBe('Imported while full');
    expect(await page.getByTestId('save-status').textContent()).toContain('Autosave failed');
    expect(await page.getByTestId('import-warnings').textContent()).toContain('Autosave failed');
    await page.evaluate(() => {
      for (const k of Object.keys(localStorage)) if (k.startsWith('junk.')) localStorage.removeItem(k);
    });
    await page.getByTestId('pose-x').fill('1.2');
    await expect.poll(() => page.getByTestId('save-status').count()).toBe(0);
    expect(await savedX(page)).toBe(1.2);
    counts.rejected++;
    await ctx.close();
  });
});

/** A static server for dist/ that sends no security headers (as a host that cannot set them). */
function plainServer(): Promise<{ server: Server; url: string }> {
  const types: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.svg': 'image/svg+xml', '.webmanifest': 'application/manifest+json' };
  const server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    const file = resolve(DIST, '.' + (path === '/' ? '/index.html' : path));
    if (!file.startsWith(DIST)) return void res.writeHead(403).end();
    try {
      const body = readFileSync(file);
      res.writeHead(200, { 'Content-Type': types[extname(file)] ?? 'application/octet-stream' }).end(body);
    } catch {
      res.writeHead(404).end();
    }
  });
  return new Promise((r) => server.listen(0, '127.0.0.1', () => r({ server, url: `http://127.0.0.1:${(server.address() as { port: number }).port}/` })));
}

/** A page on its own port that frames the given address. */
function framingServer(target: string): Promise<{ server: Server; url: string }> {
  const server = createServer((_req, res) => {
    res.writeHead(200, { 'Content-Type': 'text/html' }).end(`<!doctype html><title>framer</title><iframe id="f" src="${target}" width="800" height="600"></iframe>`);
  });
  return new Promise((r) => server.listen(0, '127.0.0.1', () => r({ server, url: `http://127.0.0.1:${(server.address() as { port: number }).port}/` })));
}

describe('framing by another page', () => {
  it("the preview server's frame-ancestors header stops the frame", async () => {
    counts.tried++;
    const framer = await framingServer(inject('baseUrl'));
    const ctx = await newContext();
    const page = await ctx.newPage();
    const resp = await page.request.get(inject('baseUrl'));
    expect(resp.headers()['content-security-policy']).toBe("frame-ancestors 'none'");
    await page.goto(framer.url);
    await page.waitForTimeout(2000);
    const frame = page.frames().find((f) => f !== page.mainFrame());
    const ran = frame ? await frame.evaluate(() => typeof (window as unknown as { __plumbline?: unknown }).__plumbline !== 'undefined').catch(() => false) : false;
    expect(ran).toBe(false);
    if (ran) counts.executed++;
    counts.rejected++;
    await ctx.close();
    framer.server.close();
  });

  it('where no header is sent, the app refuses to run framed and reads no saved work', async () => {
    counts.tried++;
    const plain = await plainServer();
    const framer = await framingServer(plain.url);
    const ctx = await newContext();
    // Saved work on the app's origin (as a user who used it there).
    const own = await ctx.newPage();
    await own.goto(plain.url);
    await waitForScene(own);
    await own.getByTestId('pose-x').fill('1.4');
    await expect.poll(() => savedX(own)).toBe(1.4);
    const page = await ctx.newPage();
    await page.goto(framer.url);
    const frame = page.frameLocator('#f');
    await frame.getByTestId('framed-refusal').waitFor({ timeout: 15_000 });
    expect(await frame.getByTestId('framed-refusal').textContent()).toContain('does not run inside another page');
    const child = page.frames().find((f) => f !== page.mainFrame())!;
    expect(await child.evaluate(() => typeof (window as unknown as { __plumbline?: unknown }).__plumbline)).toBe('undefined');
    expect(await child.evaluate(() => document.querySelector('canvas'))).toBeNull();
    counts.rejected++;
    await ctx.close();
    framer.server.close();
    plain.server.close();
  });
});

describe('the analysis worker fails loudly', () => {
  for (const fault of ['close', 'throw', 'hang']) {
    it(`a worker that ${fault === 'close' ? 'closes itself' : fault === 'throw' ? 'throws' : 'hangs'} once: the rose is re-run in a fresh worker and completes`, async () => {
      counts.tried++;
      const ctx = await newContext();
      const page = await ctx.newPage();
      await page.goto(inject('baseUrl'));
      await page.evaluate((f) => {
        localStorage.setItem('plumbline.test.workerFault', f);
        localStorage.setItem('plumbline.test.workerIdleMs', '4000');
      }, fault);
      await page.reload();
      await waitForScene(page);
      await page.locator('#rose-h').click();
      await page.getByTestId('rose-run').click();
      await page.getByTestId('rose-result').waitFor({ timeout: 60_000 });
      counts.accepted++;
      await ctx.close();
    });
  }

  it('a worker that hangs every time: the rose stops with a message, the app stays usable', async () => {
    counts.tried++;
    const ctx = await newContext();
    const page = await ctx.newPage();
    await page.goto(inject('baseUrl'));
    await page.evaluate(() => {
      localStorage.setItem('plumbline.test.workerFault', 'hang:always');
      localStorage.setItem('plumbline.test.workerIdleMs', '3000');
    });
    await page.reload();
    await waitForScene(page);
    await page.locator('#rose-h').click();
    await page.getByTestId('rose-run').click();
    await expect.poll(() => page.locator('text=/Failed: the analysis worker stopped replying/').count(), { timeout: 30_000 }).toBe(1);
    expect(await page.getByTestId('rose-result').count()).toBe(0);
    await page.getByTestId('pose-x').fill('0.5');
    await expect.poll(async () => (await state(page)).xM).toBe(0.5);
    counts.rejected++;
    await ctx.close();
  });
});

describe('counts', () => {
  it('0 hung, 0 crashed, 0 lost work, 0 executed', () => {
    expect(counts).toMatchObject({ hung: 0, crashed: 0, lost: 0, executed: 0 });
    expect(counts.tried).toBe(counts.rejected + counts.accepted);
  });
});
