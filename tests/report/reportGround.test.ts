/**
 * The report on imported ground and on a drawn line: the pass section says where a tyre stands on
 * ground the import filled in (the same rule and words as the pass command: filledGround.ts), and
 * the scenario section lists every corner of a drawn path. The filled patch and the slab are
 * invented (tests/helpers/filledGrid.ts); where the tyres cross the patch follows from the geometry:
 * the left tyres run along y = +0.8 m (half the 1.6 m track), the patch spans x 2.0–3.0 m there.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenarioText, type Scenario } from '../../src/core/index';
import { collectReport, renderReportHtml } from '../../src/report/index';
import { filledScenario, patchOf } from '../helpers/filledGrid';

const META = { toolVersion: '9.8.7-test', dateText: '2031-04-05' };
const DEG = Math.PI / 180;

function base(): Scenario {
  const r = parseScenarioText(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

function passFilledText(html: string): string | null {
  const m = /<p class="warn" id="pass-filled">([^<]*)<\/p>/.exec(html);
  return m ? m[1] : null;
}

describe('report on imported ground', { timeout: 300_000 }, () => {
  it('names the wheels on filled ground along the pass, and says nothing when the patch is off the tracks', () => {
    const s = base();
    const on = renderReportHtml(collectReport(filledScenario(s, patchOf(2.0, 3.0, 0.6, 1.0)), { roseStepRad: 45 * DEG }), META);
    const text = passFilledText(on);
    expect(text).not.toBeNull();
    expect(text).toMatch(/FL stands on filled ground from/);
    expect(text).toMatch(/RL stands on filled ground from/);
    expect(text).not.toMatch(/FR|RR/);
    // The same slab with the patch beside the path, clear of both tracks (y 2.0–2.5 m).
    const off = renderReportHtml(collectReport(filledScenario(s, patchOf(2.0, 3.0, 2.0, 2.5)), { roseStepRad: 45 * DEG }), META);
    expect(passFilledText(off)).toBeNull();
    expect(off).toContain('id="pass-headline"');
  });

  it('lists every corner of a drawn line in the scenario section, in the report units', () => {
    const s = base();
    const drawn: Scenario = {
      ...filledScenario(s, patchOf(2.0, 3.0, 2.0, 2.5)),
      path: { fromM: [-3, 0], viaM: [[1, 0.5]], toM: [4, 0], stepM: 0.25, headingRad: null },
    };
    const html = renderReportHtml(collectReport(drawn, { roseStepRad: 45 * DEG }), { ...META, units: 'metric' });
    const row = /<th>obstacle pass path<\/th><td>([^<]*)<\/td>/.exec(html);
    expect(row, 'the path row').not.toBeNull();
    expect(row![1]).toBe('through (-3.000 m, 0.000 m), (1.000 m, 0.500 m), (4.000 m, 0.000 m) every 0.25 m, heading along the path');
  });
});
