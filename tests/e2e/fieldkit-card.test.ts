/**
 * End-to-end: the limit card prints as exactly one page per configuration on A4 and on Letter
 * (Chromium's own print to PDF, page.pdf), from the CLI's file and from the app's button; the
 * card's figures are the core's, run here in Node.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, expect, inject, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario } from '../../src/core';
import { collectCards } from '../../src/report/card';
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
});

it('app: the card button downloads the card of the vehicle on screen; it prints as exactly one page; its figures are the core\'s', async () => {
  await page.locator('#card-h').scrollIntoViewIfNeeded();
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('card-download').click()]);
  const html = readFileSync((await download.path())!, 'utf8');
  expect(html.match(/data-testid="limit-card"/g)).toHaveLength(1);
  expect(await pagesOf(html, 'A4')).toBe(1);
  expect(await pagesOf(html, 'Letter')).toBe(1);
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  const want = collectCards(p.scenario, { max: 1 })[0];
  for (const d of want.directions) expect(html).toContain(`${(d.tip!.angleRad * 180 / Math.PI).toFixed(1)}°`);
  const shot = await browser.newPage({ viewport: { width: 900, height: 1200 } });
  await shot.setContent(html);
  await shot.locator('[data-testid="limit-card"]').screenshot({ path: resolve(ROOT, 'test-artifacts/limit-card.png') });
  await shot.close();
  expect(errors).toEqual([]);
});
