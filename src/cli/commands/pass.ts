/** `plumbline pass FILE`: crawl the scenario's path station by station; events and the headline. */
import { WHEEL_NAMES, passOutcome, runPass, stationCount, type PassResult, type Scenario } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CliIO, type CommandSpec } from '../command';
import { UNITS_OPTION, formatKeyValues, formatTable, outputUnits, quantityColumn } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { modelOf } from '../solveScenario';
import { deg, formatCsv, progressReporter, round } from '../analysisOutput';
import { NO_VALUE, angleText, distanceText, fixed, percentText, shortText, valueText, type UnitSystem } from '../../present/units';
import { FILLED_GROUND_NOTE, QUASI_STATIC_CAUTION, eventWhat, filledSpanWords, partWords, passHeadline } from '../../present/words';

/** Stations from which a pass reports progress on stderr. */
const PROGRESS_FROM_STATIONS = 500;

/** The documented JSON form of a pass (metres, newtons, degrees; units in the key names). */
export function passJson(r: PassResult): object {
  return {
    outcome: passOutcome(r),
    headline: passHeadline(r, 'metric'),
    plannedStations: r.plannedStations,
    stepM: r.path.stepM,
    lightShare: r.lightShare,
    friction: r.friction,
    approximateStations: r.approximateStations,
    firstUnload: r.firstUnload ? { wheel: r.firstUnload.wheel, station: r.firstUnload.station, distanceM: round(r.firstUnload.distanceM) } : null,
    firstLift: r.firstLift ? { wheel: r.firstLift.wheel, station: r.firstLift.station, distanceM: round(r.firstLift.distanceM) } : null,
    hangUp: r.hangUp ? { station: r.hangUp.station, distanceM: round(r.hangUp.distanceM), part: r.hangUp.part, depthM: round(r.hangUp.depthM) } : null,
    firstSlide: r.firstSlide
      ? { wheel: r.firstSlide.wheel, station: r.firstSlide.station, distanceM: round(r.firstSlide.distanceM), frictionDemand: round(r.firstSlide.frictionDemand) }
      : null,
    tip: r.tip ? { station: r.tip.station, distanceM: round(r.tip.distanceM), status: r.tip.status, reason: r.tip.reason } : null,
    minMargin: r.minMargin
      ? { station: r.minMargin.station, distanceM: round(r.minMargin.distanceM), forceAngleDeg: deg(r.minMargin.forceAngleRad), energyM: round(r.minMargin.energyM) }
      : null,
    minClearance: r.minClearance
      ? { station: r.minClearance.station, distanceM: round(r.minClearance.distanceM), clearanceM: round(r.minClearance.clearanceM), part: r.minClearance.part }
      : null,
    events: r.events.map((e) => ({
      kind: e.kind,
      wheel: e.wheel,
      part: e.part,
      startStation: e.startStation,
      startDistanceM: round(e.startDistanceM),
      endStation: e.endStation,
      endDistanceM: round(e.endDistanceM),
    })),
    // Where a loaded wheel stands on imported ground that was filled in (no data there), per wheel.
    filledGround: (r.filledGround ?? []).map((f) => ({
      wheel: f.wheel,
      startStation: f.startStation,
      startDistanceM: round(f.startDistanceM),
      endStation: f.endStation,
      endDistanceM: round(f.endDistanceM),
    })),
    stations: r.stations.map((s) => ({
      station: s.index,
      distanceM: round(s.distanceM),
      xM: round(s.pose.xM),
      yM: round(s.pose.yM),
      headingDeg: deg(s.pose.headingRad),
      status: s.status,
      approximate: s.approximate,
      hungUp: s.hungUp,
      filledWheels: s.filledWheels ?? [],
      wheels: Object.fromEntries(
        s.wheels.map((w, i) => [
          WHEEL_NAMES[i],
          // A hung-up station's loads are of a pose the body cannot take: null, never shown as standing.
          { loadN: s.hungUp ? null : round(w.loadN, 1), loadShare: round(w.loadShare), travelFraction: round(w.travelFraction), lifted: w.lifted, frictionDemand: round(w.frictionDemand) },
        ]),
      ),
      rollDeg: deg(s.rollRad),
      pitchDeg: deg(s.pitchRad),
      forceAngleDeg: deg(s.forceAngleRad),
      energyM: round(s.energyM),
      clearanceM: round(s.clearanceM),
      clearancePart: s.clearancePart,
      clearancePointM: s.clearancePointWorld.map((v) => round(v)),
    })),
  };
}

export function passCsv(r: PassResult): string {
  const header = ['station', 'distance_m', 'x_m', 'y_m', 'status', 'approximate'];
  for (const w of WHEEL_NAMES) header.push(`${w}_load_n`, `${w}_share`, `${w}_travel_fraction`, `${w}_lifted`, `${w}_friction_demand`);
  header.push('roll_deg', 'pitch_deg', 'force_angle_deg', 'energy_m', 'clearance_m', 'clearance_part', 'filled_wheels');
  const rows = r.stations.map((s) => {
    const row: (string | number | boolean | null)[] = [s.index, round(s.distanceM), round(s.pose.xM), round(s.pose.yM), s.status, s.approximate];
    for (const w of s.wheels) row.push(round(w.loadN, 1), round(w.loadShare), round(w.travelFraction), w.lifted, round(w.frictionDemand));
    row.push(deg(s.rollRad), deg(s.pitchRad), deg(s.forceAngleRad), round(s.energyM), round(s.clearanceM), s.clearancePart, (s.filledWheels ?? []).join(' '));
    return row;
  });
  return formatCsv(header, rows);
}

function printText(s: Scenario, r: PassResult, io: CliIO, withStations: boolean, u: UnitSystem): void {
  const at = (x: { distanceM: number; station: number }) => `at ${distanceText(x.distanceM, u)} (station ${x.station})`;
  io.out(`${s.name}: ${s.vehicle.name}, ${r.stations.length} of ${r.plannedStations} stations every ${distanceText(r.path.stepM, u)}`);
  io.out(passHeadline(r, u));
  io.out('');
  io.out(
    formatKeyValues([
      ['first wheel to go light', r.firstUnload ? `${r.firstUnload.wheel} ${at(r.firstUnload)} (below ${percentText(r.lightShare)} of static)` : 'none'],
      ['first wheel to lift', r.firstLift ? `${r.firstLift.wheel} ${at(r.firstLift)}` : 'none'],
      ['tip', r.tip ? `${at(r.tip)}: ${r.tip.reason}; the pass stops there` : 'none'],
      ['hangs up', r.hangUp ? `on the ${partWords(r.hangUp.part)} ${at(r.hangUp)}, ${shortText(r.hangUp.depthM, u)} inside the ground; the pass stops there` : 'none'],
      ['slides', r.firstSlide ? `${r.firstSlide.wheel} ${at(r.firstSlide)}: needs grip ${fixed(r.firstSlide.frictionDemand, 2)} on ground of ${fixed(r.friction, 2)}` : 'none'],
      [
        'smallest margin',
        r.minMargin ? `force-angle ${angleText(r.minMargin.forceAngleRad)}, energy (CG rise to tip) ${shortText(r.minMargin.energyM, u)} ${at(r.minMargin)}` : NO_VALUE,
      ],
      [
        'least underbody gap',
        r.minClearance ? `${shortText(r.minClearance.clearanceM, u)} under the ${partWords(r.minClearance.part)} ${at(r.minClearance)}${r.minClearance.clearanceM <= 0 ? ' (contact)' : ''}` : NO_VALUE,
      ],
    ]),
  );
  if (r.approximateStations > 0) {
    io.out(`${r.approximateStations} station(s) solved only to within 0.1 % of the weight (a tyre on an edge); flagged "approximate" in --json and --csv.`);
  }
  io.out('');
  if (r.events.length === 0) io.out('events: none');
  else {
    io.out(
      formatTable(
        [{ header: 'event' }, quantityColumn('from', 'distance', u), quantityColumn('to', 'distance', u)],
        r.events.map((e) => [eventWhat(e), valueText('distance', e.startDistanceM, u), e.endDistanceM === null ? (e.kind === 'tip' ? NO_VALUE : 'end') : valueText('distance', e.endDistanceM, u)]),
      ),
    );
  }
  const filled = r.filledGround ?? [];
  if (filled.length > 0) {
    io.out('');
    for (const f of filled) io.out(`${filledSpanWords(f, u)}.`);
    io.out(FILLED_GROUND_NOTE);
  }
  if (withStations) {
    io.out('');
    io.out(
      formatTable(
        [
          quantityColumn('at', 'distance', u),
          ...WHEEL_NAMES.map((w) => quantityColumn(w, 'force', u)),
          { header: 'roll', unit: '°', align: 'right' as const },
          { header: 'pitch', unit: '°', align: 'right' as const },
          { header: 'force-angle', unit: '°', align: 'right' as const },
          quantityColumn('gap', 'short', u),
        ],
        r.stations.map((st) => [
          valueText('distance', st.distanceM, u),
          ...st.wheels.map((w) => (st.hungUp ? 'hung up' : valueText('force', w.loadN as number | null, u))),
          valueText('angle', st.rollRad, u),
          valueText('angle', st.pitchRad, u),
          valueText('angle', st.forceAngleRad, u),
          valueText('short', st.clearanceM, u),
        ]),
      ),
    );
    io.out('Loads are normal loads (across the contact); roll and pitch from level.');
  }
  io.out('');
  io.out('Underbody gap: the body is a box (belly, overhangs) and the axles their centre-lines; the solver does not rest the body on the ground.');
  io.out(QUASI_STATIC_CAUTION);
}

export const passCommand: CommandSpec = {
  name: 'pass',
  summary: 'Obstacle pass: crawl the path station by station; which wheel goes light first, lifts, margins, clearance.',
  description:
    'Steps the vehicle along the scenario\'s path (its points, or from and to, at its step) and solves each\n' +
    'station from the last. The heading follows each leg unless the path sets one; at a corner it turns over\n' +
    'one wheelbase centred on the corner. Events: a wheel light (below --light of its level load), lifted,\n' +
    'at full bump or droop, sliding (needing more grip than the ground has); the body touching the ground;\n' +
    'hanging up (the body inside the ground: the pass stops); the tip (the pass stops).',
  args: [{ name: 'FILE', description: 'scenario file (JSON) with a path' }],
  options: [
    { name: 'light', kind: 'number', valueName: 'SHARE', description: 'a wheel is light below this share of its level-ground load', default: 0.25 },
    { name: 'stations', kind: 'flag', description: 'also print the table of every station' },
    { name: 'json', kind: 'flag', description: 'print one JSON object (metres, newtons, degrees)' },
    { name: 'csv', kind: 'flag', description: 'print the stations as CSV' },
    { name: 'quiet', kind: 'flag', description: 'no progress lines on stderr' },
    UNITS_OPTION,
  ],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    if (!s.path) {
      io.err(`${file}: path: required for a pass (its points, or from and to, and a step)`);
      return EXIT_BAD_INPUT;
    }
    const light = args.options.light as number;
    if (!(light >= 0 && light <= 1)) {
      io.err(`--light: must be between 0 and 1, got ${light}`);
      return EXIT_BAD_INPUT;
    }
    const model = modelOf(s);
    const r = runPass(model, s.path, {
      friction: s.friction,
      lightShare: light,
      tilt: s.tilt.angleRad !== 0 ? s.tilt : undefined,
      onProgress: progressReporter(io, 'pass', !args.options.quiet && s.path && stationsOf(s) >= PROGRESS_FROM_STATIONS),
    });
    if (args.options.json) io.out(toJsonText(passJson(r)));
    else if (args.options.csv) io.out(passCsv(r));
    else printText(s, r, io, Boolean(args.options.stations), outputUnits(args.options, s.units));
    if (r.stations.length > 0 && r.stations[0].status !== 'converged' && !r.stations[0].approximate) {
      io.err(`plumbline: the vehicle does not stand at the start of the path (${r.stations[0].status})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};

function stationsOf(s: Scenario): number {
  return stationCount(s.path!);
}
