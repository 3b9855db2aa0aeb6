/** `plumbline compare FILE...`: builds side by side (one file's builds, or one vehicle per file). */
import {
  AS_GIVEN,
  MAX_BUILDS,
  applyBuild,
  compareVehicles,
  passOptionsOf,
  toSI,
  type AppliedBuild,
  type BuildRow,
  type MetricName,
  type Scenario,
} from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_OK, type CommandSpec } from '../command';
import { UNITS_OPTION, formatTable, outputUnits } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { deg, formatCsv, progressReporter, round } from '../analysisOutput';
import { BUILD_METRICS, METRICS_NOTE, PASS_END_LABEL, metricJsonKey, metricUnit, metricValue } from '../../present/metrics';
import { RAD_PER_DEG, angleText, lengthText, valueText } from '../../present/units';
import { QUASI_STATIC_CAUTION, buildChangeWords, passEndWords } from '../../present/words';

/** JSON value of one metric: degrees for angles, metres for lengths; key carries the unit. */
const jsonKey = metricJsonKey;
function jsonValue(name: MetricName, v: number | null): number | null {
  return name.endsWith('Rad') ? deg(v) : round(v, 5);
}

/**
 * How a build's pass ends, for JSON and CSV: the outcome (tips, hangs-up, slides, stands), where
 * (m along the path), on what (the underbody part for a hang-up, the wheel for a slide) and the
 * first slide when it came before; null without a path.
 */
export function passEndJson(r: BuildRow): {
  outcome: string;
  atM: number | null;
  on: string | null;
  depthM: number | null;
  frictionDemand: number | null;
  firstSlide: { wheel: string; atM: number; frictionDemand: number } | null;
} | null {
  const e = r.passEnd;
  if (!e) return null;
  const o = e.outcome;
  const slide = e.firstSlide ? { wheel: e.firstSlide.wheel, atM: e.firstSlide.distanceM, frictionDemand: e.firstSlide.frictionDemand } : null;
  switch (o.kind) {
    case 'tips':
      return { outcome: o.kind, atM: o.distanceM, on: null, depthM: null, frictionDemand: null, firstSlide: slide };
    case 'hangs-up':
      return { outcome: o.kind, atM: o.distanceM, on: o.part, depthM: o.depthM, frictionDemand: null, firstSlide: slide };
    case 'slides':
      return { outcome: o.kind, atM: o.distanceM, on: o.wheel, depthM: null, frictionDemand: o.frictionDemand, firstSlide: slide };
    default:
      return { outcome: o.kind, atM: null, on: null, depthM: null, frictionDemand: null, firstSlide: slide };
  }
}

export function compareJson(rows: readonly BuildRow[]): object {
  return {
    builds: rows.map((r) => ({
      name: r.name,
      // Words in the file's metric form (SI numbers are in the table); the human table uses --units.
      changes: r.changes.map((c) => buildChangeWords(c, 'metric')),
      values: Object.fromEntries(BUILD_METRICS.map(({ key: k }) => [jsonKey(k), jsonValue(k, r.metrics[k])])),
      changeFromFirst: Object.fromEntries(BUILD_METRICS.map(({ key: k }) => [jsonKey(k), jsonValue(k, r.change[k])])),
      passFirstUnloadWheel: r.passFirstUnloadWheel,
      passFirstLiftWheel: r.passFirstLiftWheel,
      passEnd: passEndJson(r),
      cgBand: r.band
        ? {
            toleranceM: r.band.toleranceM,
            heightsM: r.band.heightsM,
            directions: Object.fromEntries(
              Object.entries(r.band.directions).map(([d, b]) => [
                d,
                { liftDeg: [deg(b.liftRad[0]), deg(b.liftRad[1])], tipDeg: [deg(b.tipRad[0]), deg(b.tipRad[1])] },
              ]),
            ),
          }
        : null,
    })),
  };
}

export const compareCommand: CommandSpec = {
  name: 'compare',
  summary: 'Builds side by side: SSF, lift and tip each way, weakest direction, pass headline, CG height.',
  description:
    'One FILE: the vehicle as given, then each of the file\'s builds. Several FILEs: each file\'s vehicle as\n' +
    `given (the first file's terrain and path for the pass). At most ${MAX_BUILDS} columns. Tilt angles are on a\n` +
    'level tilt table; change is from the first column. See the builds block of the scenario format for how\n' +
    'each modification is turned into a physical change (printed under the table).',
  args: [{ name: 'FILE', description: 'scenario file(s) (JSON)', variadic: true }],
  options: [
    { name: 'no-base', kind: 'flag', description: 'one FILE: leave out the vehicle as given (the first build becomes the reference)' },
    { name: 'cg-tolerance', kind: 'number', valueName: 'LENGTH', description: 'CG-height uncertainty ± (file length unit): band of lift and tip angles' },
    { name: 'rose-step', kind: 'number', valueName: 'DEG', description: 'direction spacing for the weakest direction', default: 5 },
    { name: 'json', kind: 'flag', description: 'print one JSON object (metres, degrees)' },
    { name: 'csv', kind: 'flag', description: 'print one CSV row per build and metric' },
    { name: 'quiet', kind: 'flag', description: 'no progress lines on stderr' },
    UNITS_OPTION,
  ],
  run(args, io) {
    const scenarios: Scenario[] = [];
    for (const f of args.positionals) {
      const loaded = loadScenarioFile(f, io);
      if (!loaded.ok) return EXIT_BAD_INPUT;
      scenarios.push(loaded.scenario);
    }
    const first = scenarios[0];
    let applied: AppliedBuild[];
    if (scenarios.length === 1) {
      const builds = first.builds ?? [];
      applied = [
        ...(args.options['no-base'] ? [] : [{ name: 'as given', vehicle: first.vehicle, changes: AS_GIVEN }]),
        ...builds.map((b) => applyBuild(first.vehicle, b)),
      ];
      if (applied.length === 0) {
        io.err(`${args.positionals[0]}: builds: none to compare (add a "builds" list, or give several files)`);
        return EXIT_BAD_INPUT;
      }
    } else {
      applied = scenarios.map((s, i) => ({ name: `${args.positionals[i]}: ${s.vehicle.name}`, vehicle: s.vehicle, changes: AS_GIVEN }));
    }
    if (applied.length > MAX_BUILDS) {
      io.err(`compare: at most ${MAX_BUILDS} columns, got ${applied.length}${scenarios.length === 1 && !args.options['no-base'] ? ' (the vehicle as given counts; --no-base leaves it out)' : ''}`);
      return EXIT_BAD_INPUT;
    }
    const tol = args.options['cg-tolerance'];
    if (tol !== undefined && !((tol as number) > 0)) {
      io.err(`--cg-tolerance: must be > 0, got ${String(tol)}`);
      return EXIT_BAD_INPUT;
    }
    const roseStep = args.options['rose-step'] as number;
    if (!(roseStep >= 1 && roseStep <= 90)) {
      io.err(`--rose-step: must be between 1 and 90 degrees, got ${roseStep}`);
      return EXIT_BAD_INPUT;
    }
    const rows = compareVehicles(applied, {
      terrain: first.terrain,
      path: first.path,
      friction: first.friction,
      tilt: passOptionsOf(first).tilt,
      roseStepRad: roseStep * RAD_PER_DEG,
      cgToleranceM: tol === undefined ? undefined : toSI('length', tol as number, first.units),
      onProgress: progressReporter(io, 'compare', !args.options.quiet, 1),
    });
    if (args.options.json) {
      io.out(toJsonText(compareJson(rows)));
      return EXIT_OK;
    }
    if (args.options.csv) {
      const out: (string | number | null)[][] = [];
      for (const r of rows) {
        for (const { key: k } of BUILD_METRICS) out.push([r.name, jsonKey(k), jsonValue(k, r.metrics[k]), jsonValue(k, r.change[k])]);
        // How the pass ends: its outcome, where (m) and on what (underbody part or wheel); no change column (not numbers to subtract, or only with the outcome).
        const e = passEndJson(r);
        if (e) out.push([r.name, 'passEnd', e.outcome, null], [r.name, 'passEndAtM', e.atM, null], [r.name, 'passEndOn', e.on, null]);
      }
      io.out(formatCsv(['build', 'metric', 'value', 'change_from_first'], out));
      return EXIT_OK;
    }
    const u = outputUnits(args.options, first.units);
    io.out(`${first.name}: ${rows.length} builds; change from "${rows[0].name}" in brackets`);
    io.out(
      formatTable(
        [{ header: 'quantity' }, { header: 'unit' }, ...rows.map((_, i) => ({ header: `[${i + 1}]`, align: 'right' as const }))],
        BUILD_METRICS.map((m) => [
          m.label,
          metricUnit(m.kind, u),
          ...rows.map((r, i) =>
            i === 0 || r.change[m.key] === null || m.kind === 'direction'
              ? metricValue(m.kind, r.metrics[m.key], u)
              : `${metricValue(m.kind, r.metrics[m.key], u)} (${metricValue(m.kind, r.change[m.key], u, true)})`,
          ),
        ]),
      ),
    );
    // The hang-up column in words: too wide for the table, so one line per build under it.
    if (rows.some((r) => r.passEnd)) {
      io.out(`${PASS_END_LABEL}:`);
      rows.forEach((r, i) => io.out(`  [${i + 1}] ${passEndWords(r.passEnd, u)}`));
    }
    io.out(METRICS_NOTE);
    io.out('');
    rows.forEach((r, i) => {
      io.out(`[${i + 1}] ${r.name}`);
      for (const c of r.changes) io.out(`    ${buildChangeWords(c, u)}`);
      if (r.band) {
        const b = r.band.directions;
        const span = (x: readonly [number, number]) => `${valueText('angle', x[0], u)}–${angleText(x[1])}`;
        io.out(
          `    CG height ±${lengthText(r.band.toleranceM, u)}: tip (from level) nose ${span(b.noseDown.tipRad)}, tail ${span(b.tailDown.tipRad)}, left ${span(b.leftDown.tipRad)}, right ${span(b.rightDown.tipRad)}`,
        );
      }
    });
    io.out('');
    io.out(QUASI_STATIC_CAUTION);
    return EXIT_OK;
  },
};
