/**
 * `plumbline report FILE --units metric|imperial`: the report in the units asked for (default the
 * file's). Exact factors: 1 in = 0.0254 m, 1 lbf = 4.4482216152605 N (1959 agreement; 3rd CGPM).
 */
import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';

const DEMO = 'assets/scenarios/side-hill-stock.json';
const IMPERIAL = 'tests/fixtures/side-hill-stock-imperial.json';

async function report(...args: string[]): Promise<{ code: number; html: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  const code = await runCli(['report', ...args, '--date', '2031-04-05'], io);
  return { code, html: out.join('\n'), err: err.join('\n') };
}

/** The text of the report's tables and chart labels (the CSS, with its mm page margins, left out). */
function tablesOf(html: string): string {
  return [...(html.match(/<table[\s\S]*?<\/table>/g) ?? []), ...(html.match(/<text[^>]*>[^<]*<\/text>/g) ?? [])].join('\n');
}

let metric: string;
let imperial: string;
beforeAll(async () => {
  const m = await report(DEMO);
  const i = await report(DEMO, '--units', 'imperial');
  expect(m.code, m.err).toBe(0);
  expect(i.code, i.err).toBe(0);
  metric = m.html;
  imperial = i.html;
}, 120_000);

describe('report --units', () => {
  it('imperial: in, lb, lbf; no mm, kg or N in the tables and charts', () => {
    const t = tablesOf(imperial);
    expect(t).toMatch(/\d in\b/);
    expect(t).toMatch(/\d lb\b/);
    expect(t).toContain('(lbf)');
    expect(/.{0,30}\b(mm|kg)\b.{0,30}/.exec(t)?.[0] ?? null).toBeNull();
    expect(/.{0,30}(\d N\b|\(N\)|\bN\/m\b).{0,30}/.exec(t)?.[0] ?? null).toBeNull();
    // The demo's wheelbase, 3.100 m = 122.04 in (3.1 / 0.0254), shown to 0.1 in.
    expect(imperial).toContain('<th>wheelbase</th><td>122.0 in</td>');
  });

  it('metric by default for a metric file: m, mm, kg, kN', () => {
    const t = tablesOf(metric);
    expect(metric).toContain('<th>wheelbase</th><td>3.100 m</td>');
    expect(t).toMatch(/\d mm\b/);
    expect(t).toMatch(/\d kg\b/);
    expect(t).toContain('(kN)');
    expect(/\b(lbf|lb)\b/.exec(t)?.[0] ?? null).toBeNull();
  });

  it('an imperial file reports in imperial unless told otherwise', async () => {
    const r = await report(IMPERIAL);
    expect(r.code, r.err).toBe(0);
    expect(r.html).toContain('Units: imperial');
    const m = await report(IMPERIAL, '--units', 'metric');
    expect(m.html).toContain('Units: metric');
    expect(m.html).toContain('(the scenario file is in imperial units)');
  }, 120_000);

  it('refuses a unit system it does not know', async () => {
    const r = await report(DEMO, '--units', 'furlongs');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--units/);
  });
});
