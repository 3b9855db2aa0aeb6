/**
 * The report's optional picture of the 3D view (ReportMeta.sceneImageDataUrl): a PNG or JPEG
 * data: URL is shown in its own section; anything else is left out, so the file never names an
 * outside address.
 */
import { describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario } from '../../src/core';
import { collectReport, renderReportHtml } from '../../src/report';

const p = parseScenario(demo);
if (!p.ok) throw new Error('demo');
// A coarse rose keeps this quick; the picture does not depend on it.
const data = collectReport(p.scenario, { roseStepRad: Math.PI / 4 });
const meta = { toolVersion: '0.0.0', dateText: '2025-01-01' };
// A 1×1 PNG (the smallest valid image, written out by hand in base64).
const PNG = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==';

describe('report: picture of the 3D view', () => {
  it('is left out when none is given', () => {
    expect(renderReportHtml(data, meta)).not.toContain('id="scene-view"');
  });
  it('shows a PNG data: URL in its own section', () => {
    const html = renderReportHtml(data, { ...meta, sceneImageDataUrl: PNG });
    expect(html).toContain('<section id="scene-view">');
    expect(html).toContain(`<img src="${PNG}"`);
  });
  it('leaves out anything that is not a base64 PNG or JPEG data: URL', () => {
    for (const bad of ['https://example.invalid/a.png', 'data:image/svg+xml;base64,PHN2Zz4=', `${PNG}" onerror="x`, 'data:text/html;base64,PGI+']) {
      const html = renderReportHtml(data, { ...meta, sceneImageDataUrl: bad });
      expect(html).not.toContain('id="scene-view"');
      expect(html).not.toMatch(/https?:|onerror/);
    }
  });
});
