/**
 * Any input size the scenario format allows: a 100 000-point profile (and 100 000-point chart
 * series and table rows) renders without "Maximum call stack size exceeded" — nothing spreads an
 * array into Math.min / Math.max (a call's arguments are limited, in V8 to about 120 000 on the
 * stack, less in a worker). tests/present/layers.test.ts keeps such spreads out of src.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, type Scenario } from '../../src/core';
import { collectReport, lineChart, renderReportHtml, type ReportData } from '../../src/report';
import { formatTable } from '../../src/cli/format';

const N = 100_000;
let data: ReportData;

beforeAll(() => {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  // A coarse rose keeps this quick; the profile is what is tested.
  data = collectReport(p.scenario, { roseStepRad: Math.PI / 2 });
});

describe('large inputs', () => {
  // 100 000 points overflowed the app's report worker; Node's main thread takes a spread of 100 000
  // but not of 300 000, so the larger one shows a spread here too.
  it.each([N, 3 * N])('a %i-point profile is described with its height range', (n) => {
    // Heights 0.001·sin(i/100) − 0.002: the range is the sine's, −0.003 m to −0.001 m.
    const points: [number, number][] = [];
    for (let i = 0; i < n; i++) points.push([i * 0.001, 0.001 * Math.sin(i / 100) - 0.002]);
    const s: Scenario = { ...data.scenario, terrain: { features: [{ type: 'profile', axis: 'x', points, acrossM: null }] } } as Scenario;
    const html = renderReportHtml({ ...data, scenario: s }, { toolVersion: 't', dateText: '2031-04-05' });
    expect(html).toContain(`${n} points along x from 0.000 m to ${((n - 1) * 0.001).toFixed(3)} m, heights -0.003 m to -0.001 m`);
  });

  it('a 100 000-point chart and a 100 000-row table', () => {
    const xs = Array.from({ length: N }, (_, i) => i);
    const ys = xs.map((x) => Math.sin(x / 1000) * 5);
    const svg = lineChart([{ label: 'y', xs, ys, colour: '#000', dash: '' }], { title: 't', xLabel: 'x', yLabel: 'y' });
    expect(svg.startsWith('<svg')).toBe(true);
    // The x axis ends at the data's last x (no rounding out for a path's length): a tick at 100000 would lie outside.
    expect(svg).toContain('>80,000<');
    const table = formatTable([{ header: 'i' }, { header: 'v', digits: 1 }], xs.map((x) => [String(x), ys[x]]));
    expect(table.split('\n').length).toBe(N + 2);
  });
});
