/** `plumbline tilt FILE`: tilt-table sweep about one downhill direction to the first lift, slide and tip. */
import { tiltSweep, type TiltAngle, type TiltSweepDetail } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { UNITS_OPTION, formatKeyValues, formatTable, outputUnits, quantityColumn } from '../format';
import { directionText, fixed, valueText } from '../../present/units';
import { QUASI_STATIC_CAUTION, TILT_DATUM_NOTE, downhillWords } from '../../present/words';
import { loadScenarioFile, toJsonText } from '../load';
import { modelOf, parseDownhill, radToDegRounded } from '../solveScenario';

/** An angle's datums for JSON: the table tilt, the slope from level, the tilt beyond the ground here. */
function datumsJson(e: TiltAngle): object {
  return {
    angleDeg: radToDegRounded(e.angleRad),
    fromLevelDeg: radToDegRounded(e.fromLevelRad),
    beyondGroundDeg: radToDegRounded(e.beyondGroundRad),
  };
}

/** "38.9° from level (38.9° more than the ground here)": an angle with its datums, to 0.1°. */
export function angleWords(e: TiltAngle): string {
  const d = (rad: number) => `${radToDegRounded(rad, 1).toFixed(1)}°`;
  return `${d(e.fromLevelRad)} from level (${d(e.beyondGroundRad)} more than the ground here)`;
}

const REASON_WORDS = {
  fold: 'the stance loses its stiffness (a fold)',
  'plumb-line-at-edge': 'the plumb line reaches the edge of the support',
  'does-not-stand-at-start': 'it does not stand at the starting tilt',
} as const;

/** The documented JSON form of a tilt sweep. */
export function tiltJson(r: TiltSweepDetail): object {
  return {
    downhillDeg: radToDegRounded(r.downhillRad, 6),
    startFromLevelDeg: radToDegRounded(r.startFromLevelRad),
    firstLift: r.firstLift ? { wheel: r.firstLift.wheel, ...datumsJson(r.firstLift), atTip: r.firstLift.atTip } : null,
    tip: r.tip
      ? { ...datumsJson(r.tip), edge: r.tip.edge, reason: r.tip.reason, softFrom: r.tip.softFrom ? datumsJson(r.tip.softFrom) : null }
      : null,
    slide: r.slide ? datumsJson(r.slide) : null,
    firstLimit: r.firstLimit,
    evaluations: r.evaluations,
    samples: r.samples.map((s) => ({
      angleDeg: radToDegRounded(s.angleRad),
      status: s.status,
      loadsN: { FL: s.loadsN[0], FR: s.loadsN[1], RL: s.loadsN[2], RR: s.loadsN[3] },
      lifted: { FL: s.lifted[0], FR: s.lifted[1], RL: s.lifted[2], RR: s.lifted[3] },
      forceAngleDeg: radToDegRounded(s.forceAngleRad),
      energyM: s.energyM,
      frictionDemand: s.frictionDemand,
    })),
  };
}

export const tiltCommand: CommandSpec = {
  name: 'tilt',
  summary: 'Tilt-table sweep: the tilt at which a wheel first lifts, the vehicle slides and it tips.',
  description:
    'Starts at the scenario tilt and raises it about the downhill direction (0 nose down, 90 left side\n' +
    'down, 180 tail down, 270 right side down, or front|left|rear|right), to 0.01°.\n' +
    'Static limits only: operating limits are far lower (common practice: makers print about 15° for\n' +
    'utility vehicles and ATVs); follow the maker\'s limits, local rules and trained practice.',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [
    { name: 'downhill', kind: 'string', valueName: 'DIR', description: 'downhill direction, degrees or front|left|rear|right (default: the scenario tilt\'s)' },
    { name: 'json', kind: 'flag', description: 'print one JSON object (SI units, angles in degrees)' },
    UNITS_OPTION,
  ],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    let downhillRad = s.tilt.downhillRad;
    if (typeof args.options.downhill === 'string') {
      const d = parseDownhill(args.options.downhill);
      if (d === null) {
        io.err(`--downhill: must be degrees or front|left|rear|right, got ${JSON.stringify(args.options.downhill)}`);
        return EXIT_BAD_INPUT;
      }
      downhillRad = d;
    }
    const model = modelOf(s);
    const r = tiltSweep(model, s.pose, { downhillRad, startAngleRad: s.tilt.angleRad, friction: s.friction });
    if (args.options.json) io.out(toJsonText(tiltJson(r)));
    else {
      const u = outputUnits(args.options, s.units);
      io.out(`${s.name}: ${s.vehicle.name}, downhill ${directionText(downhillRad)} (${downhillWords(downhillRad)})`);
      io.out(
        formatKeyValues([
          ['first wheel to lift', r.firstLift ? `${r.firstLift.wheel} at ${angleWords(r.firstLift)}${r.firstLift.atTip ? ', as it goes over' : ''}` : 'none before the tip'],
          [
            'tips at',
            r.tip
              ? `${angleWords(r.tip)} over ${r.tip.edge.join('–')}: ${REASON_WORDS[r.tip.reason]}` +
                (r.tip.softFrom ? `; nearly neutral from ${angleWords(r.tip.softFrom)}: take that as the limit` : '')
              : 'no tip up to 89°',
          ],
          ['slides at', r.slide ? `${angleWords(r.slide)} (ground friction ${s.friction})` : 'no slide before the tip'],
        ]),
      );
      io.out('');
      io.out(
        formatTable(
          [
            { header: 'tilt beyond the ground here', unit: '°', align: 'right' },
            quantityColumn('FL', 'force', u),
            quantityColumn('FR', 'force', u),
            quantityColumn('RL', 'force', u),
            quantityColumn('RR', 'force', u),
            { header: 'force-angle', unit: '°', align: 'right' },
            { header: 'grip needed', unit: 'μ', align: 'right' },
          ],
          r.samples.map((p) => [
            valueText('angle', p.angleRad - r.startAngleRad, u),
            ...p.loadsN.map((n) => valueText('force', n as number | null, u)),
            valueText('angle', p.forceAngleRad, u),
            (p.frictionDemand as number | null) === null ? '—' : fixed(p.frictionDemand, 2),
          ]),
        ),
      );
      io.out('');
      io.out('Loads are normal loads (across the contact). ' + TILT_DATUM_NOTE);
      io.out(QUASI_STATIC_CAUTION);
    }
    if (r.samples.length === 0 || r.samples[0].status !== 'converged') {
      io.err(`plumbline: the vehicle does not stand at the starting tilt (${r.samples[0]?.status ?? 'no result'})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};
