/** `plumbline tilt FILE`: tilt-table sweep about one downhill direction to the first lift, slide and tip. */
import { tiltSweep, type TiltSweepResult } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { UNITS_OPTION, formatKeyValues, formatTable, outputUnits, quantityColumn } from '../format';
import { angleText, directionText, fixed, valueText } from '../../present/units';
import { QUASI_STATIC_CAUTION, TILT_DATUM_NOTE, downhillWords } from '../../present/words';
import { loadScenarioFile, toJsonText } from '../load';
import { modelOf, parseDownhill, radToDegRounded } from '../solveScenario';

/** The documented JSON form of a tilt sweep. */
export function tiltJson(r: TiltSweepResult): object {
  return {
    downhillDeg: radToDegRounded(r.downhillRad, 6),
    firstLift: r.firstLift ? { wheel: r.firstLift.wheel, angleDeg: radToDegRounded(r.firstLift.angleRad) } : null,
    tip: r.tip ? { angleDeg: radToDegRounded(r.tip.angleRad), edge: r.tip.edge } : null,
    slide: r.slide ? { angleDeg: radToDegRounded(r.slide.angleRad) } : null,
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
      const deg = (rad: number) => `${angleText(rad)} from level`;
      io.out(`${s.name}: ${s.vehicle.name}, downhill ${directionText(downhillRad)} (${downhillWords(downhillRad)})`);
      io.out(
        formatKeyValues([
          ['first wheel to lift', r.firstLift ? `${r.firstLift.wheel} at ${deg(r.firstLift.angleRad)}` : 'none before the tip'],
          ['tips at', r.tip ? `${deg(r.tip.angleRad)} over ${r.tip.edge.join('–')}` : 'no tip up to 89°'],
          ['slides at', r.slide ? `${deg(r.slide.angleRad)} (ground friction ${s.friction})` : 'no slide before the tip'],
        ]),
      );
      io.out('');
      io.out(
        formatTable(
          [
            { header: 'tilt from level', unit: '°', align: 'right' },
            quantityColumn('FL', 'force', u),
            quantityColumn('FR', 'force', u),
            quantityColumn('RL', 'force', u),
            quantityColumn('RR', 'force', u),
            { header: 'force-angle', unit: '°', align: 'right' },
            { header: 'grip needed', unit: 'μ', align: 'right' },
          ],
          r.samples.map((p) => [
            valueText('angle', p.angleRad, u),
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
