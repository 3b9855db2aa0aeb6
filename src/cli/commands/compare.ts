/** `plumbline compare FILE...`: builds side by side (one file's builds, or one vehicle per file). */
import {
  MAX_BUILDS,
  applyBuild,
  compareVehicles,
  toSI,
  type AppliedBuild,
  type BuildRow,
  type MetricName,
  type Scenario,
} from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_OK, type CommandSpec } from '../command';
import { formatTable } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { displayUnits } from '../solveScenario';
import { CAUTION, deg, formatCsv, progressReporter, round } from '../analysisOutput';

const RAD_PER_DEG = Math.PI / 180;

type Kind = 'ratio' | 'length' | 'angle' | 'direction';
/** Rows of the table: metric, label, kind. */
const METRICS: readonly (readonly [MetricName, string, Kind])[] = [
  ['ssf', 'SSF (T/2h)', 'ratio'],
  ['cgHeightM', 'CG height with payload', 'length'],
  ['trackMeanM', 'mean track', 'length'],
  ['noseDownLiftRad', 'nose down: first lift', 'angle'],
  ['noseDownTipRad', 'nose down: tip', 'angle'],
  ['tailDownLiftRad', 'tail down: first lift', 'angle'],
  ['tailDownTipRad', 'tail down: tip', 'angle'],
  ['leftDownLiftRad', 'left down: first lift', 'angle'],
  ['leftDownTipRad', 'left down: tip', 'angle'],
  ['rightDownLiftRad', 'right down: first lift', 'angle'],
  ['rightDownTipRad', 'right down: tip', 'angle'],
  ['weakestDownhillRad', 'weakest direction', 'direction'],
  ['weakestTipRad', 'weakest direction: tip', 'angle'],
  ['passFirstUnloadM', 'pass: first wheel light at', 'length'],
  ['passFirstLiftM', 'pass: first lift at', 'length'],
  ['passTipM', 'pass: tips at', 'length'],
  ['passMinForceAngleRad', 'pass: smallest force-angle', 'angle'],
  ['passMinEnergyM', 'pass: energy margin there', 'length'],
  ['passMinClearanceM', 'pass: least clearance', 'length'],
];

/** JSON value of one metric: degrees for angles, metres for lengths; key carries the unit. */
function jsonKey(name: MetricName): string {
  return name.endsWith('Rad') ? `${name.slice(0, -3)}Deg` : name;
}
function jsonValue(name: MetricName, v: number | null): number | null {
  return name.endsWith('Rad') ? deg(v) : round(v, 5);
}

export function compareJson(rows: readonly BuildRow[]): object {
  return {
    builds: rows.map((r) => ({
      name: r.name,
      changes: r.changes,
      values: Object.fromEntries(METRICS.map(([k]) => [jsonKey(k), jsonValue(k, r.metrics[k])])),
      changeFromFirst: Object.fromEntries(METRICS.map(([k]) => [jsonKey(k), jsonValue(k, r.change[k])])),
      passFirstUnloadWheel: r.passFirstUnloadWheel,
      passFirstLiftWheel: r.passFirstLiftWheel,
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
        ...(args.options['no-base'] ? [] : [{ name: 'as given', vehicle: first.vehicle, changes: ['as given'] }]),
        ...builds.map((b) => applyBuild(first.vehicle, b)),
      ];
      if (applied.length === 0) {
        io.err(`${args.positionals[0]}: builds: none to compare (add a "builds" list, or give several files)`);
        return EXIT_BAD_INPUT;
      }
    } else {
      applied = scenarios.map((s, i) => ({ name: `${args.positionals[i]}: ${s.vehicle.name}`, vehicle: s.vehicle, changes: ['as given'] }));
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
      for (const r of rows) for (const [k] of METRICS) out.push([r.name, jsonKey(k), jsonValue(k, r.metrics[k]), jsonValue(k, r.change[k])]);
      io.out(formatCsv(['build', 'metric', 'value', 'change_from_first'], out));
      return EXIT_OK;
    }
    const u = displayUnits(first.units);
    const cell = (kind: Kind, v: number | null, dv: number | null, isFirst: boolean): string => {
      if (v === null) return '–';
      const fmt = (x: number, sign: boolean) => {
        const s = kind === 'ratio' ? x.toFixed(3) : kind === 'length' ? u.lengthOf(x).toFixed(first.units === 'imperial' ? 1 : 3) : (x / RAD_PER_DEG).toFixed(1);
        return sign && x >= 0 ? `+${s}` : s;
      };
      if (kind === 'direction') return `${(v / RAD_PER_DEG).toFixed(0)}°`;
      return isFirst || dv === null ? fmt(v, false) : `${fmt(v, false)} (${fmt(dv, true)})`;
    };
    const unitOf = (k: Kind) => (k === 'length' ? u.length : k === 'angle' ? '°' : '');
    io.out(`${first.name}: ${rows.length} builds; change from "${rows[0].name}" in brackets`);
    io.out(
      formatTable(
        [{ header: 'quantity' }, { header: 'unit' }, ...rows.map((r, i) => ({ header: `[${i + 1}]`, align: 'right' as const }))],
        METRICS.map(([k, label, kind]) => [label, unitOf(kind), ...rows.map((r, i) => cell(kind, r.metrics[k], r.change[k], i === 0))]),
      ),
    );
    io.out('');
    rows.forEach((r, i) => {
      io.out(`[${i + 1}] ${r.name}`);
      for (const c of r.changes) io.out(`    ${c}`);
      if (r.band) {
        const b = r.band.directions;
        const span = (x: readonly [number, number]) => `${(x[0] / RAD_PER_DEG).toFixed(1)}–${(x[1] / RAD_PER_DEG).toFixed(1)}°`;
        io.out(
          `    CG height ±${u.lengthOf(r.band.toleranceM).toFixed(3)} ${u.length}: tip nose ${span(b.noseDown.tipRad)}, tail ${span(b.tailDown.tipRad)}, left ${span(b.leftDown.tipRad)}, right ${span(b.rightDown.tipRad)}`,
        );
      }
    });
    io.out('');
    io.out(CAUTION);
    return EXIT_OK;
  },
};
