/**
 * Reading a printed PDF back, page by page, for the print tests: the page count, and each page's
 * text lines with where they sit, from poppler's `pdftotext -bbox-layout` (Debian's poppler-utils,
 * installed by scripts/ensure-os-packages.sh). The measures of a clean print are taken from that
 * text: how much of each page's printable area is filled, and whether a heading is the last thing
 * on its page.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** PDF points per millimetre (1 pt = 1/72 in; 1 in = 25.4 mm, exact). */
export const PT_PER_MM = 72 / 25.4;

export interface PrintedLine {
  readonly text: string;
  /** Top and bottom of the line, points from the top of the page. */
  readonly yMin: number;
  readonly yMax: number;
}

export interface PrintedPage {
  readonly widthPt: number;
  readonly heightPt: number;
  /** Text lines in reading order. */
  readonly lines: readonly PrintedLine[];
}

/** Pages in a PDF: the page objects ("/Type /Page", not "/Pages"). */
export function pdfPageCount(pdf: Buffer): number {
  return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

const decode = (s: string) => s.replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;/g, "'").replace(/&amp;/g, '&');

/** Each page's text lines, by pdftotext -bbox-layout (fails, naming the package, when poppler-utils is missing). */
export function printedPages(pdf: Buffer): PrintedPage[] {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-print-'));
  const file = join(dir, 'print.pdf');
  writeFileSync(file, pdf);
  let xml: string;
  try {
    xml = execFileSync('pdftotext', ['-bbox-layout', file, '-'], { encoding: 'utf8', maxBuffer: 64 << 20 });
  } catch (e) {
    throw new Error(`pdftotext failed (install Debian's poppler-utils: scripts/ensure-os-packages.sh does): ${(e as Error).message}`, { cause: e });
  }
  const pages: PrintedPage[] = [];
  for (const pm of xml.matchAll(/<page width="([\d.]+)" height="([\d.]+)">([\s\S]*?)<\/page>/g)) {
    const lines: PrintedLine[] = [];
    for (const lm of pm[3].matchAll(/<line xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">([\s\S]*?)<\/line>/g)) {
      const words = [...lm[3].matchAll(/<word[^>]*>([\s\S]*?)<\/word>/g)].map((w) => decode(w[1]));
      lines.push({ text: words.join(' '), yMin: Number(lm[1]), yMax: Number(lm[2]) });
    }
    pages.push({ widthPt: Number(pm[1]), heightPt: Number(pm[2]), lines });
  }
  return pages;
}

/**
 * How much of a page's printable area (between the top and bottom page margins) its text fills:
 * from the top of that area to the bottom of the lowest line, as a share of its height.
 */
export function pageFill(p: PrintedPage, marginTopMm: number, marginBottomMm: number): number {
  const top = marginTopMm * PT_PER_MM;
  const height = p.heightPt - (marginTopMm + marginBottomMm) * PT_PER_MM;
  let bottom = top;
  for (const l of p.lines) bottom = Math.max(bottom, l.yMax);
  return (bottom - top) / height;
}

export interface StrandedHeading {
  readonly page: number;
  readonly text: string;
  /** Where the heading's (last) line ends, as a share of the printable height. */
  readonly at: number;
}

const norm = (s: string) => s.replace(/\s+/g, ' ').trim();

/** A page's lines top to bottom (reading order may list a table's columns apart). */
const sorted = (p: PrintedPage) => [...p.lines].sort((a, b) => a.yMin - b.yMin);

/**
 * Where each heading (by its text) is printed: page (1-based) and the index of its last line among
 * the page's lines top to bottom; a heading may wrap onto two lines. Null where it is not found.
 */
export function headingPlaces(pages: readonly PrintedPage[], headings: readonly string[]): ({ page: number; line: number } | null)[] {
  return headings.map((h) => {
    const want = norm(h);
    for (let k = 0; k < pages.length; k++) {
      const lines = sorted(pages[k]);
      for (let i = 0; i < lines.length; i++) {
        if (norm(lines[i].text) === want) return { page: k + 1, line: i };
        if (i + 1 < lines.length && norm(`${lines[i].text} ${lines[i + 1].text}`) === want) return { page: k + 1, line: i + 1 };
      }
    }
    return null;
  });
}

/**
 * Headings (given by their text) that end a page, or whose last line sits in the last `footShare`
 * of the printable area with fewer than `minAfter` lines of their own content after them there.
 */
export function strandedHeadings(pages: readonly PrintedPage[], headings: readonly string[], marginTopMm: number, marginBottomMm: number, footShare = 0.15, minAfter = 2): StrandedHeading[] {
  const out: StrandedHeading[] = [];
  const places = headingPlaces(pages, headings);
  places.forEach((pl, j) => {
    if (!pl) return;
    const p = pages[pl.page - 1];
    const top = marginTopMm * PT_PER_MM;
    const height = p.heightPt - (marginTopMm + marginBottomMm) * PT_PER_MM;
    const lines = sorted(p);
    const at = (lines[pl.line].yMax - top) / height;
    const after = lines.length - 1 - pl.line;
    if (after === 0 || (at > 1 - footShare && after < minAfter)) out.push({ page: pl.page, text: headings[j], at });
  });
  return out;
}
