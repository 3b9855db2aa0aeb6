/** `plumbline lines FILE --offset FROM:TO:STEP --heading FROM:TO:STEP`: sweep lines, rank by smallest margin. */
import { PATH_STEP_DEFAULT_M, makeLines, pathPoints, rangeCount, rankLines, savedCandidateSpecs, toSI, type LineSpec, type LineSummary } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_OK, type CommandSpec } from '../command';
import { UNITS_OPTION, formatKeyValues, formatTable, outputUnits, quantityColumn } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { LONG_JOB_S, capWorkers, estimateSweepSeconds, runLinesParallel } from '../parallel';
import { deg, formatCsv, parseRange, progressReporter, round } from '../analysisOutput';
import { NO_VALUE, RAD_PER_DEG, angleText, changeText, distanceText, valueText } from '../../present/units';
import { QUASI_STATIC_CAUTION, filledLinesWords } from '../../present/words';
/** Most lines in one sweep. */
const MAX_LINES = 5000;

function lineJson(l: LineSummary, rank: number, names: readonly string[] | null): object {
  return {
    rank,
    line: l.index,
    ...(names ? { name: names[l.index], pointsM: pathPoints(l.path).map((q) => [round(q[0]), round(q[1])]) } : {}),
    offsetM: round(l.offsetM),
    headingChangeDeg: deg(l.headingChangeRad),
    fromM: l.path.fromM.map((v) => round(v)),
    toM: l.path.toM.map((v) => round(v)),
    stationsSolved: l.stationsSolved,
    plannedStations: l.plannedStations,
    minForceAngleDeg: deg(l.minForceAngleRad),
    minMarginDistanceM: round(l.minMarginDistanceM),
    energyAtMinM: round(l.energyAtMinM),
    minClearanceM: round(l.minClearanceM),
    firstUnload: l.firstUnload ? { wheel: l.firstUnload.wheel, distanceM: round(l.firstUnload.distanceM) } : null,
    firstLift: l.firstLift ? { wheel: l.firstLift.wheel, distanceM: round(l.firstLift.distanceM) } : null,
    tip: l.tip ? { distanceM: round(l.tip.distanceM), reason: l.tip.reason } : null,
    onFilledGround: l.onFilledGround ?? false,
  };
}

export const linesCommand: CommandSpec = {
  name: 'lines',
  summary: 'Best line: sweep the path\'s sideways offset and heading, run each line as a pass, rank by smallest margin.',
  description:
    'A line is the scenario path moved to its left by an offset (in the file\'s length unit; negative: right)\n' +
    'and turned counter-clockwise by a heading change (degrees) about its midpoint. Lines are ranked by\n' +
    'their smallest force-angle margin; a line that tips ranks below every line that does not.\n' +
    'Runs on worker threads (one per core) and falls back to one thread if they cannot start.\n' +
    'With --saved, the lines are the scenario\'s saved candidate lines instead (the file\'s "candidates",\n' +
    'drawn and saved in the app), each run at the path\'s station spacing (5 cm without a path), ranked the\n' +
    'same way; --offset and --heading do not apply then.',
  args: [{ name: 'FILE', description: 'scenario file (JSON) with a path, or with saved lines for --saved' }],
  options: [
    { name: 'offset', kind: 'string', valueName: 'FROM:TO:STEP', description: 'sideways offsets (file length unit)', default: '0' },
    { name: 'heading', kind: 'string', valueName: 'FROM:TO:STEP', description: 'heading changes (degrees)', default: '0' },
    { name: 'saved', kind: 'flag', description: 'rank the scenario\'s saved candidate lines ("candidates") instead of a sweep' },
    { name: 'workers', kind: 'number', valueName: 'N', description: 'worker threads (default: one per core; 0 runs in-process)' },
    { name: 'json', kind: 'flag', description: 'print one JSON object (metres, degrees), lines best first' },
    { name: 'csv', kind: 'flag', description: 'print one CSV row per line, best first' },
    { name: 'quiet', kind: 'flag', description: 'no progress lines on stderr' },
    { name: 'yes', kind: 'flag', description: 'run a sweep estimated to take more than an hour' },
    UNITS_OPTION,
  ],
  async run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const saved = Boolean(args.options.saved);
    if (saved && (String(args.options.offset) !== '0' || String(args.options.heading) !== '0')) {
      io.err('lines: --saved ranks the saved lines as drawn; leave out --offset and --heading');
      return EXIT_BAD_INPUT;
    }
    if (saved && !(s.candidates && s.candidates.length > 0)) {
      io.err(`${file}: candidates: no saved lines in this file (draw and save them in the app, or add "candidates": [{ "name", "points" }])`);
      return EXIT_BAD_INPUT;
    }
    if (!saved && !s.path) {
      io.err(`${file}: path: required for a line sweep (its points, or from and to, and a step); or use --saved for the saved lines`);
      return EXIT_BAD_INPUT;
    }
    const names = saved ? s.candidates!.map((c) => c.name) : null;
    const off = parseRange('offset', String(args.options.offset));
    const hd = parseRange('heading', String(args.options.heading));
    // Offsets in the file's length unit, headings in degrees: converted here, at the edge.
    const m = (v: number) => toSI('length', v, s.units);
    const offsets = { from: m(off.from), to: m(off.to), step: m(off.step) };
    const headings = { from: hd.from * RAD_PER_DEG, to: hd.to * RAD_PER_DEG, step: hd.step * RAD_PER_DEG };
    // Count before building: two long ranges would otherwise build millions of lines first.
    const count = rangeCount(offsets) * rangeCount(headings);
    if (count === 0 || count > MAX_LINES) {
      io.err(`lines: the ranges give ${count} lines; must be 1 to ${MAX_LINES}`);
      return EXIT_BAD_INPUT;
    }
    const lines: LineSpec[] = saved ? savedCandidateSpecs(s.candidates!, s.path?.stepM ?? PATH_STEP_DEFAULT_M) : makeLines(s.path!, offsets, headings);
    const workersOpt = args.options.workers;
    if (workersOpt !== undefined && !(Number.isInteger(workersOpt) && (workersOpt as number) >= 0)) {
      io.err(`--workers: must be a whole number ≥ 0, got ${String(workersOpt)}`);
      return EXIT_BAD_INPUT;
    }
    const job = { vehicle: s.vehicle, terrain: s.terrain, options: { friction: s.friction, tilt: s.tilt.angleRad !== 0 ? s.tilt : undefined }, lines };
    const threads = workersOpt === 0 ? 1 : capWorkers(workersOpt === undefined ? undefined : Math.max(1, workersOpt as number), lines.length).workers;
    const estimateS = estimateSweepSeconds(job, threads);
    if (estimateS > LONG_JOB_S && !args.options.yes) {
      io.err(`lines: this sweep would take about ${(estimateS / 3600).toFixed(1)} hours on ${threads} thread(s) (${lines.length} lines); run again with --yes to start it, or narrow the ranges or the path`);
      return EXIT_BAD_INPUT;
    }
    const t0 = Date.now();
    const result = await runLinesParallel(
      job,
      {
        onNote: (note) => io.err(`lines: ${note}`),
        workers: workersOpt === undefined ? undefined : Math.max(1, workersOpt as number),
        inProcess: workersOpt === 0,
        onProgress: progressReporter(io, 'lines', !args.options.quiet),
      },
    );
    const seconds = (Date.now() - t0) / 1000;
    if (result.fallbackReason) io.err(`lines: ${result.fallbackReason}`);
    if (!args.options.quiet) io.err(`lines: ${lines.length} lines in ${seconds.toFixed(1)} s on ${result.workers || 1} thread(s)`);
    const ranking = rankLines(result.summaries);
    if (args.options.json) {
      io.out(
        toJsonText({
          lineCount: lines.length,
          best: lineJson(ranking.best, 1, names),
          worst: lineJson(ranking.worst, ranking.rank[ranking.rank.length - 1], names),
          rankResolutionDeg: deg(ranking.resolutionRad),
          lines: ranking.ranked.map((l, i) => ({ ...lineJson(l, ranking.rank[i], names), tiedWith: ranking.tiedWith[i] })),
        }),
      );
    } else if (args.options.csv) {
      io.out(
        formatCsv(
          ['rank', 'line', ...(names ? ['name'] : ['offset_m', 'heading_change_deg']), 'min_force_angle_deg', 'at_m', 'energy_at_min_m', 'min_clearance_m', 'first_unload', 'first_lift', 'tip_at_m', 'on_filled_ground'],
          ranking.ranked.map((l, i) => [
            ranking.rank[i],
            l.index,
            ...(names ? [names[l.index]] : [round(l.offsetM), deg(l.headingChangeRad)]),
            deg(l.minForceAngleRad),
            round(l.minMarginDistanceM),
            round(l.energyAtMinM),
            round(l.minClearanceM),
            l.firstUnload ? `${l.firstUnload.wheel}@${round(l.firstUnload.distanceM)}` : null,
            l.firstLift ? `${l.firstLift.wheel}@${round(l.firstLift.distanceM)}` : null,
            l.tip ? round(l.tip.distanceM) : null,
            l.onFilledGround ?? false,
          ]),
        ),
      );
    } else {
      const u = outputUnits(args.options, s.units);
      const describe = (l: LineSummary) =>
        `${names ? `"${names[l.index]}"` : `offset ${changeText('distance', l.offsetM, u)}, heading ${changeText('angle', l.headingChangeRad, u)}`}: smallest force-angle margin ${angleText(l.minForceAngleRad)}${l.tip ? `, tips at ${distanceText(l.tip.distanceM, u)}` : ''}`;
      io.out(`${s.name}: ${s.vehicle.name}, ${lines.length} ${names ? 'saved ' : ''}lines`);
      const anyFilled = ranking.ranked.some((l) => l.onFilledGround);
      const tie = (tied: boolean) => (tied ? ' (tied with others within 0.1°)' : '');
      io.out(formatKeyValues([['best line', describe(ranking.best) + tie(ranking.bestTied)], ['worst line', describe(ranking.worst) + tie(ranking.worstTied)]]));
      io.out('');
      io.out(
        formatTable(
          [
            { header: 'rank', digits: 0 },
            ...(names ? [{ header: 'saved line' }] : [quantityColumn('offset', 'distance', u), { header: 'heading', unit: '°', align: 'right' as const }]),
            { header: 'min force-angle', unit: '°', align: 'right' },
            quantityColumn('at', 'distance', u),
            quantityColumn('underbody gap', 'short', u),
            { header: 'goes light' },
            quantityColumn('tip at', 'distance', u),
            ...(anyFilled ? [{ header: 'ground' }] : []),
          ],
          ranking.ranked.map((l, i) => [
            ranking.rank[i],
            ...(names ? [names[l.index]] : [changeText('distance', l.offsetM, u, false), changeText('angle', l.headingChangeRad, u, false)]),
            valueText('angle', l.minForceAngleRad, u),
            valueText('distance', l.minMarginDistanceM, u),
            valueText('short', l.minClearanceM, u),
            l.firstUnload ? `${l.firstUnload.wheel} at ${distanceText(l.firstUnload.distanceM, u)}` : '',
            l.tip ? valueText('distance', l.tip.distanceM, u) : NO_VALUE,
            ...(anyFilled ? [l.onFilledGround ? 'filled' : ''] : []),
          ]),
        ),
      );
      const filledNote = filledLinesWords(ranking.ranked);
      if (filledNote) io.out(filledNote);
      io.out('');
      io.out(QUASI_STATIC_CAUTION);
    }
    return EXIT_OK;
  },
};
