/**
 * The report (src/report): a pure HTML string from collected results. Checks: the SSF
 * against its formula, the drawing's geometry against the vehicle, the optional sections, the
 * cautions, the methods named, determinism (the core reads no clock), and self-containment.
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { parseScenarioText, type Scenario } from '../../src/core/index';
import {
  COMMON_PRACTICE_MAX_SLOPE_DEG,
  REPORT_CAUTIONS,
  collectReport,
  esc,
  renderReportHtml,
  vehicleDrawing,
  type ReportData,
} from '../../src/report/index';
import { PASS_END_LABEL, passEndWords } from '../../src/present/index';

function load(file: string): Scenario {
  const r = parseScenarioText(readFileSync(file, 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

const META = { toolVersion: '9.8.7-test', dateText: '2031-04-05' };
let stock: Scenario;
let data: ReportData;
let html: string;

beforeAll(() => {
  stock = load('assets/scenarios/side-hill-stock.json');
  data = collectReport(stock, { cgToleranceM: 0.05 });
  html = renderReportHtml(data, META);
});

describe('report content', () => {
  it('gives the SSF as T/(2h) with the payload in the CG height (NHTSA; NRC/TRB SR 265)', () => {
    // Derived here from the demo file: T = 1.58 m; h = Σ m·z / Σ m over the vehicle and its payload.
    const h = (2150 * 0.78 + 85 * 0.95 + 45 * 0.88) / (2150 + 85 + 45);
    const ssf = 1.58 / (2 * h);
    expect(data.ssf).toBeCloseTo(ssf, 12);
    expect(html).toContain(`${ssf.toFixed(3)} (mean track 1.580 m, CG height with payload ${h.toFixed(3)} m)`);
  });

  it('states the tool version and the date it was given, and is the same string for the same input', () => {
    expect(html).toContain('Plumbline 9.8.7-test');
    expect(html).toContain('2031-04-05');
    expect(renderReportHtml(data, META)).toBe(html);
    expect(renderReportHtml(data, { ...META, dateText: '2031-04-06' })).not.toBe(html);
  });

  it('puts the cautions at the top and the bottom, with the common-practice operating line marked as such', () => {
    for (const c of REPORT_CAUTIONS) expect(html.split(esc(c)).length - 1).toBe(2);
    expect(REPORT_CAUTIONS.join(' ')).toMatch(/quasi-static/);
    expect(REPORT_CAUTIONS.join(' ')).toMatch(/Real margins are smaller: rough, soft/);
    expect(REPORT_CAUTIONS.join(' ')).toMatch(/maker’s limits, local regulations and licensed or trained practice/);
    expect(REPORT_CAUTIONS.join(' ')).toContain(`Common practice: makers of utility vehicles, ATVs and ride-on mowers commonly print ${COMMON_PRACTICE_MAX_SLOPE_DEG}°`);
    const top = html.indexOf('id="caution-top"');
    const bottom = html.indexOf('id="caution-bottom"');
    expect(top).toBeGreaterThan(0);
    expect(top).toBeLessThan(html.indexOf('id="scenario"'));
    expect(bottom).toBeGreaterThan(html.indexOf('id="methods"'));
  });

  it('names the methods and their sources', () => {
    for (const s of ['Davis 1975', 'Papadopoulos &amp; Rey 1996', 'Messuri &amp; Klein 1985', 'SAE J874 / ISO 10392', 'SAE J2180', 'ISO 16333']) {
      expect(html).toContain(s);
    }
  });

  it('has the scenario tables with units, the rose, the pass charts, the drawing and the CG band', () => {
    for (const id of ['summary', 'scenario', 'rose', 'pass', 'drawing', 'cg-band', 'methods']) expect(html).toContain(`id="${id}"`);
    expect(html).not.toContain('id="builds"');
    expect(html).toContain('<th>wheelbase</th><td>3.100 m</td>');
    expect(html).toContain('wheel rate (N/mm)');
    expect(html).toContain('Normal load per tyre (kN) along the path');
    expect(html).toContain('Force-angle margin along the path');
    expect(html).toContain('Energy margin along the path');
    // Rose, three pass charts, drawing: at least five inline charts.
    expect(html.match(/<svg /g)?.length ?? 0).toBeGreaterThanOrEqual(5);
    // The band: ± 0.05 m about the CG as weighed (0.78 m).
    expect(html).toContain('known to ± 0.050 m: from 0.730 m to 0.830 m');
  });

  it('prints: page margins, no forced page break, headings kept with what follows, figures and tables kept whole', () => {
    // How it lays out on paper is measured in tests/e2e/reportPrint.test.ts (Chromium's PDF, read back by pdftotext).
    expect(html).toContain('@page');
    expect(html).not.toMatch(/break-before: page|page-break-before: always/);
    expect(html).toMatch(/h1, h2, h3 \{ break-after: avoid; page-break-after: avoid; \}/);
    expect(html).toMatch(/\.keep \{ break-inside: avoid/);
    expect(html).toMatch(/figure \{[^}]*break-inside: avoid/);
    expect(html).toMatch(/table \{[^}]*break-inside: avoid/);
    // Every h2 opens a kept box with the block after it, or is a table's caption (the comparison), or the caution's.
    const h2s = html.match(/<h2>/g)?.length ?? 0;
    const kept = html.match(/<div class="keep"><h2>|<caption><h2>|class="caution" id="caution-\w+"><h2>/g)?.length ?? 0;
    expect(h2s).toBeGreaterThan(4);
    expect(kept).toBe(h2s);
  });

  it('is self-contained: no address of any kind, no script', () => {
    expect(html).not.toMatch(/https?:|\/\/[a-z]/i);
    expect(html).not.toMatch(/\b(src|href)\s*=/i);
    expect(html).not.toMatch(/<script|<link|<img|<iframe|@import|url\(/i);
  });

  it('escapes text from the file', () => {
    const s = { ...stock, name: '<b>Rig & "Co"</b>', notes: '<script>x</script>' };
    const h = renderReportHtml({ ...data, scenario: s }, META);
    expect(h).not.toContain('<script>x');
    expect(h).toContain('&lt;b&gt;Rig &amp; &quot;Co&quot;&lt;/b&gt;');
  });
});

describe('vehicle drawing', () => {
  it('draws the wheels a wheelbase apart at their radius, on the scale of its 1 m bar', () => {
    const d = data.drawing;
    const svg = vehicleDrawing({ vehicle: stock.vehicle, field: data.field, pose: d.pose, result: d.result, caption: 'x' });
    const bar = /<line x1="4" x2="([\d.]+)" y1="(\d+)"/.exec(svg);
    expect(bar).not.toBeNull();
    const scale = Number(bar![1]) - 4; // pixels per metre
    // Side view circles in order FL, RL, FR, RR and the CG dot; then the rear view's CG dot.
    const circles = [...svg.matchAll(/<circle cx="([-\d.]+)" cy="([-\d.]+)" r="([\d.]+)"/g)].map((m) => m.slice(1, 4).map(Number));
    expect(circles.length).toBe(6);
    const [fl, rl, fr, rr] = circles;
    const pitch = d.result.body.pitchRad;
    // Along the heading the axles are a wheelbase apart (× cos pitch); 0.1 px rounding on each end.
    const L = stock.vehicle.wheelbaseM * Math.cos(pitch);
    expect((fr[0] - rr[0]) / scale).toBeCloseTo(L, 1);
    expect(Math.abs((fl[0] - rl[0]) / scale - L)).toBeLessThan(0.02);
    expect(fr[2] / scale).toBeCloseTo(stock.vehicle.tyreFront.radiusM, 1);
    // On this side hill the ground falls to the left: the left (far-side) wheels sit lower.
    expect(fl[1]).toBeGreaterThan(fr[1]);
    // The plumb line leaves the CG straight down (gravity is −z in the terrain frame here).
    expect(svg).toContain('stroke="#b00020"');
  });
});

describe('report with builds', () => {
  it('adds the build comparison with the vehicle as given as the reference', () => {
    const s = load('assets/scenarios/side-hill-builds.json');
    const d = collectReport(s, { builds: s.builds, roseStepRad: Math.PI / 6 });
    expect(d.builds?.length).toBe((s.builds?.length ?? 0) + 1);
    const h = renderReportHtml(d, META);
    expect(h).toContain('id="builds"');
    expect(h).toContain('as given (reference)');
    for (const b of s.builds ?? []) expect(h).toContain(esc(b.name));
    // A taller build tips earlier to the side than the vehicle as given: the change is negative.
    const ref = d.builds![0].metrics.leftDownTipRad!;
    const last = d.builds![d.builds!.length - 1].metrics.leftDownTipRad!;
    expect(last).toBeLessThan(ref);
    expect(d.builds![d.builds!.length - 1].change.leftDownTipRad).toBeCloseTo(last - ref, 12);
    // Its own section under its own title, right after the headline; the hang-up row says how each build's pass ends.
    expect(h).toMatch(/<section id="builds"><table class="compare" id="builds-table"><caption><h2>Build comparison: [^<]+, 3 configurations<\/h2>/);
    expect(h.indexOf('id="builds"')).toBeGreaterThan(h.indexOf('id="summary"'));
    expect(h.indexOf('id="builds"')).toBeLessThan(h.indexOf('id="rose"'));
    expect(h).toContain(esc(PASS_END_LABEL));
    for (const r of d.builds!) {
      expect(r.passEnd).not.toBeNull();
      expect(h).toContain(`<td class="words">${esc(passEndWords(r.passEnd, 'metric'))}</td>`);
    }
    // Three builds, each a 72-direction rose and a pass: minutes on a shared two-core machine.
  }, 300_000);
});
