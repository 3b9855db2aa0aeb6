/**
 * End-to-end: the full report prints cleanly. The ledge demo (an invented crawler on a ledge and a
 * boulder, with its two builds compared) is collected in Node as `plumbline report` does, printed to
 * PDF by Chromium itself (page.pdf, A4 and Letter, the report's own 14 mm × 12 mm page margins),
 * and read back page by page with poppler's pdftotext (tests/e2e/printedPages.ts). Measured on the
 * printed text:
 * - no page but the last is filled less than 25 % of its printable height (no near-empty page);
 * - no heading (h1–h3) ends a page, or sits in the last 15 % of one with fewer than two lines of its
 *   content after it;
 * - the build comparison's heading is on the same page as its whole table, the hang-up row included.
 * The thresholds are the issue's; the measuring is checked on a document made to break them.
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { parseScenarioText } from '../../src/core';
import { collectReport, renderReportHtml } from '../../src/report';
import { launchChromium } from './browser';
import { headingPlaces, pageFill, pdfPageCount, printedPages, strandedHeadings, type PrintedPage } from './printedPages';

const MARGIN = { top: '14mm', bottom: '14mm', left: '12mm', right: '12mm' };
const TOP_MM = 14;
const BOTTOM_MM = 14;

let browser: Browser;
let html = '';

async function print(content: string, format: 'A4' | 'Letter'): Promise<{ pages: PrintedPage[]; count: number; headings: string[] }> {
  const page: Page = await browser.newPage();
  try {
    await page.setContent(content);
    const headings = await page.$$eval('h1, h2, h3', (els) => els.map((e) => (e.textContent ?? '').replace(/\s+/g, ' ').trim()));
    const pdf = await page.pdf({ format, printBackground: true, margin: MARGIN });
    return { pages: printedPages(pdf), count: pdfPageCount(pdf), headings };
  } finally {
    await page.close();
  }
}

beforeAll(async () => {
  browser = await launchChromium();
  const r = parseScenarioText(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  // As `plumbline report` runs it: every analysis, the file's builds compared with the vehicle as given.
  const data = collectReport(r.scenario, { builds: r.scenario.builds });
  expect(data.builds?.length).toBe(3);
  html = renderReportHtml(data, { toolVersion: '0.0.0-test', dateText: '2026-12-02', fileName: 'ledge-crawler.json' });
}, 900_000);

afterAll(async () => {
  await browser?.close();
});

describe('the measures can fail', () => {
  it('a heading left at a page foot and a near-empty page are found', async () => {
    const bad =
      '<!doctype html><html><head><style>@page { margin: 14mm 12mm; } body { margin: 0; font: 10pt sans-serif; }</style></head><body>' +
      '<p>First page, first line.</p><div style="height: 228mm"></div><h2>A stranded heading</h2>' +
      '<div style="break-before: page"><p>Second page: one line only.</p></div>' +
      '<div style="break-before: page"><p>Third page.</p></div></body></html>';
    const { pages, count } = await print(bad, 'A4');
    expect(count).toBe(3);
    expect(pages).toHaveLength(3);
    const stranded = strandedHeadings(pages, ['A stranded heading'], TOP_MM, BOTTOM_MM);
    expect(stranded.map((s) => [s.page, s.text])).toEqual([[1, 'A stranded heading']]);
    expect(pageFill(pages[1], TOP_MM, BOTTOM_MM)).toBeLessThan(0.25);
  });
});

describe('the report with its build comparison prints cleanly', () => {
  for (const format of ['A4', 'Letter'] as const) {
    it(`${format}: no near-empty page, no stranded heading, the comparison under its own title with its table`, async () => {
      const { pages, count, headings } = await print(html, format);
      expect(pages.length).toBe(count);
      const fills = pages.map((p) => pageFill(p, TOP_MM, BOTTOM_MM));
      console.log(`[report print] ${format}: ${count} pages, filled ${fills.map((f) => `${Math.round(100 * f)} %`).join(', ')}`);
      // Every page but the last at least a quarter full (the issue's threshold).
      for (let i = 0; i < fills.length - 1; i++) expect(fills[i], `${format} page ${i + 1}`).toBeGreaterThanOrEqual(0.25);
      // Every heading of the report found in the printed text, and none stranded.
      const places = headingPlaces(pages, headings);
      headings.forEach((h, i) => expect(places[i], `heading "${h}" printed on lines of its own`).not.toBeNull());
      expect(strandedHeadings(pages, headings, TOP_MM, BOTTOM_MM)).toEqual([]);
      // The comparison: its heading, its first and last metric rows and the hang-up row on one page.
      const pageOf = (pred: (t: string) => boolean) => pages.findIndex((p) => p.lines.some((l) => pred(l.text)));
      const title = pageOf((t) => t.startsWith('Build comparison:'));
      expect(title).toBeGreaterThanOrEqual(0);
      expect(pageOf((t) => t.includes('SSF (T/2h)'))).toBe(title);
      expect(pageOf((t) => t.includes('pass: least underbody gap'))).toBe(title);
      expect(pageOf((t) => t.includes('pass: hangs up'))).toBe(title);
      // The ledge demo as given hangs up on its belly at the boulder (tests/fieldkit/passEvents.test.ts): said in the comparison.
      expect(pages[title].lines.some((l) => l.text.includes('hangs up on the belly'))).toBe(true);
    });
  }
});
