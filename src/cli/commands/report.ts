/** `plumbline report FILE -o report.html`: one self-contained HTML report of every analysis of a scenario. */
import { readFileSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { toSI } from '../../core/index';
import { collectReport, renderReportHtml } from '../../report/index';
import { parseUnits } from '../../present/units';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { loadScenarioFile } from '../load';

/** The tool version from package.json (the report states it). */
export function toolVersion(): string {
  try {
    const pkg = JSON.parse(readFileSync(join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'package.json'), 'utf8')) as { version?: unknown };
    return typeof pkg.version === 'string' ? pkg.version : 'unknown';
  } catch {
    return 'unknown';
  }
}

/** Today's date as YYYY-MM-DD in local time (the CLI reads the clock; the core never does). */
export function todayText(now: Date = new Date()): string {
  const p = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${p(now.getMonth() + 1)}-${p(now.getDate())}`;
}

export const reportCommand: CommandSpec = {
  name: 'report',
  summary: 'Write one self-contained HTML report (prints to PDF): scenario, limits, rose, pass, drawing, cautions.',
  description:
    'Runs the pose, the tilt table nose-, tail-, left- and right-down, the stability rose, the obstacle pass\n' +
    '(when the scenario has a path), the build comparison (when it has builds) and the CG-height band\n' +
    '(with --cg-tolerance), and writes them as one HTML file with inline charts: no network needed to\n' +
    'open it; print it from a browser to PDF (A4 or Letter). Quasi-static estimates: real margins are smaller.',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [
    { name: 'output', short: 'o', kind: 'string', valueName: 'FILE', description: 'where to write the HTML (default: stdout)' },
    { name: 'cg-tolerance', kind: 'number', valueName: 'M', description: 'CG-height uncertainty (m, or in for an imperial file) for the band of lift and tip angles' },
    { name: 'units', kind: 'string', choices: ['metric', 'imperial'], valueName: 'metric|imperial', description: 'units the report is written in (default: the scenario file\'s)' },
    { name: 'date', kind: 'string', valueName: 'YYYY-MM-DD', description: 'date printed on the report (default: today)' },
  ],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const tol = args.options['cg-tolerance'];
    let cgToleranceM: number | undefined;
    if (typeof tol === 'number') {
      if (!(tol > 0)) {
        io.err(`plumbline: --cg-tolerance: must be > 0, got ${tol}`);
        return EXIT_BAD_INPUT;
      }
      // In the file's length unit.
      cgToleranceM = toSI('length', tol, s.units);
    }
    const data = collectReport(s, { cgToleranceM, builds: s.builds });
    const html = renderReportHtml(data, {
      toolVersion: toolVersion(),
      dateText: typeof args.options.date === 'string' ? args.options.date : todayText(),
      fileName: basename(file),
      units: parseUnits(args.options.units as string | undefined) ?? s.units,
    });
    const out = args.options.output;
    if (typeof out === 'string' && out !== '-') {
      try {
        writeFileSync(out, html);
      } catch (e) {
        io.err(`plumbline: cannot write ${out}: ${e instanceof Error ? e.message : String(e)}`);
        return EXIT_FAILURE;
      }
      io.err(`wrote ${out}`);
    } else io.out(html);
    return EXIT_OK;
  },
};
