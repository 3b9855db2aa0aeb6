/**
 * End-to-end: the limit card prints as exactly one page per configuration on A4 and on Letter
 * (Chromium's own print to PDF, page.pdf), from the CLI's file and from the app's button (the
 * vehicle alone: 1 page; the stock vehicle beside the customer's build: 2 pages), none of it cut
 * off by the card's box; the card's figures, its worst heading on the ground included, are the
 * core's, run here in Node.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import buildsDemo from '../../assets/scenarios/side-hill-builds.json';
import { parseScenario } from '../../src/core';
import { cardFor, collectCards, groundLines } from '../../src/report/card';
import { isHarmless, launchChromium, waitForScene } from './browser';

const ROOT = resolve(import.meta.dirname, '../..');
let browser: Browser;
let page: Page;
const errors: string[] = [];

/** Pages in a PDF: the page objects ("/Type /Page", not "/Pages"). */
function pdfPages(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

async function pagesOf(html: string, format: 'A4' | 'Letter'): Promise<number> {
  const p = await browser.newPage();
  await p.setContent(html);
  const pdf = await p.pdf({ format, printBackground: true });
  await p.close();
  return pdfPages(pdf);
}

/**
 * Cards whose content does not fit their page box, in print media (the box hides what overflows, so
 * a card could print as one page with its foot cut off): each card's scrollHeight against its height.
 */
async function overflowingCards(html: string): Promise<string[]> {
  const p = await browser.newPage();
  await p.emulateMedia({ media: 'print' });
  await p.setContent(html);
  const over = await p.$$eval('[data-testid="limit-card"]', (els) => els.filter((e) => e.scrollHeight > e.clientHeight + 1).map((e) => `${e.getAttribute('data-config')}: ${e.scrollHeight} > ${e.clientHeight}`));
  await p.close();
  return over;
}

beforeAll(async () => {
  browser = await launchChromium();
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, serviceWorkers: 'block', acceptDownloads: true });
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

it('the page counter counts pages (a 3-page document of forced breaks)', async () => {
  const html = '<!doctype html><body>' + ['a', 'b', 'c'].map((t) => `<div style="break-after: page">${t}</div>`).join('') + '</body>';
  expect(await pagesOf(html, 'A4')).toBe(3);
});

it('CLI card: one page per configuration on A4 and Letter (the ledge demo and its two builds: 3 pages; as given: 1)', async () => {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-card-e2e-'));
  const all = join(dir, 'all.html');
  const one = join(dir, 'one.html');
  const cli = (args: string[]) => execFileSync('node', ['--import', 'tsx', 'src/cli/main.ts', ...args], { cwd: ROOT, stdio: 'pipe' });
  cli(['card', 'assets/scenarios/ledge-crawler.json', '-o', all, '--date', '2026-12-02']);
  cli(['card', 'assets/scenarios/expedition-roof-tent.json', '-o', one, '--as-given', '--date', '2026-12-02']);
  for (const format of ['A4', 'Letter'] as const) {
    expect(await pagesOf(readFileSync(all, 'utf8'), format), format).toBe(3);
    expect(await pagesOf(readFileSync(one, 'utf8'), format), format).toBe(1);
  }
  // The ledge builds' longer modification lines and the uneven ground's note still fit the card's box.
  expect(await overflowingCards(readFileSync(all, 'utf8'))).toEqual([]);
});

it('app: the card button downloads the card of the vehicle on screen; it prints as exactly one page; its figures are the core\'s', async () => {
  await page.locator('#card-h').scrollIntoViewIfNeeded();
  // The card's heading sweep runs in the app's workers first (72 headings).
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 240_000 }), page.getByTestId('card-download').click()]);
  const html = readFileSync((await download.path())!, 'utf8');
  expect(html.match(/data-testid="limit-card"/g)).toHaveLength(1);
  expect(await overflowingCards(html)).toEqual([]);
  expect(await pagesOf(html, 'A4')).toBe(1);
  expect(await pagesOf(html, 'Letter')).toBe(1);
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  const want = collectCards(p.scenario, { max: 1, grounds: [null] })[0];
  for (const d of want.directions) expect(html).toContain(`${(d.tip!.angleRad * 180 / Math.PI).toFixed(1)}°`);
  const shot = await browser.newPage({ viewport: { width: 900, height: 1200 } });
  await shot.setContent(html);
  await shot.locator('[data-testid="limit-card"]').screenshot({ path: resolve(ROOT, 'test-artifacts/limit-card.png') });
  await shot.close();
  expect(errors).toEqual([]);
}, 300_000);

it('app: the stock vehicle and the customer\'s build print as exactly two pages (A4 and Letter), each with its worst heading on this ground', async () => {
  // The builds demo with one build only: the stock vehicle and one customer build.
  const file = { ...buildsDemo, builds: buildsDemo.builds.slice(0, 1) };
  await page.getByTestId('scenario-import').setInputFiles({ name: 'customer.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(file)) });
  await page.locator('#card-h').scrollIntoViewIfNeeded();
  await expect.poll(() => page.getByTestId('card-download-all').textContent(), { timeout: 30_000 }).toContain('1 build beside it');
  const [download] = await Promise.all([page.waitForEvent('download', { timeout: 240_000 }), page.getByTestId('card-download-all').click()]);
  const html = readFileSync((await download.path())!, 'utf8');
  expect(html.match(/data-testid="limit-card"/g)).toHaveLength(2);
  expect(html.match(/data-testid="card-worst-heading"/g)).toHaveLength(2);
  for (const format of ['A4', 'Letter'] as const) expect(await pagesOf(html, format), format).toBe(2);
  expect(await overflowingCards(html)).toEqual([]);
  // The stock card's worst heading is the core's, swept in Node at the same step on the same ground.
  const p = parseScenario(file);
  if (!p.ok) throw new Error('customer file');
  const want = groundLines(cardFor(p.scenario, 'as given', p.scenario.vehicle, null, undefined, { units: 'metric' }))!;
  const esc = (t: string) => t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
  expect(html).toContain(esc(want[1]));
  expect(errors).toEqual([]);
}, 300_000);
