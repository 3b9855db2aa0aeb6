/** `plumbline tilt FILE`: tilt-table sweep about one downhill direction to the first lift, slide and tip. */
import { tiltSweep, type TiltSweepResult } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { formatKeyValues, formatTable } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { displayUnits, modelOf, parseDownhill, radToDegRounded } from '../solveScenario';

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
      const u = displayUnits(s.units);
      const deg = (rad: number) => `${radToDegRounded(rad, 2).toFixed(2)}°`;
      io.out(`${s.name}: ${s.vehicle.name}, downhill ${radToDegRounded(downhillRad, 1)}°`);
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
            { header: 'tilt', unit: '°', digits: 2 },
            { header: 'FL', unit: u.force, digits: 0 },
            { header: 'FR', unit: u.force, digits: 0 },
            { header: 'RL', unit: u.force, digits: 0 },
            { header: 'RR', unit: u.force, digits: 0 },
            { header: 'force-angle', unit: '°', digits: 2 },
            { header: 'grip needed', unit: 'μ', digits: 2 },
          ],
          r.samples.map((p) => [
            (p.angleRad * 180) / Math.PI,
            ...p.loadsN.map((n) => u.forceOf(n)),
            (p.forceAngleRad * 180) / Math.PI,
            p.frictionDemand,
          ]),
        ),
      );
      io.out('');
      io.out('Caution: quasi-static estimate on a rigid table. Real margins are smaller; keep well inside these limits.');
    }
    if (r.samples.length === 0 || r.samples[0].status !== 'converged') {
      io.err(`plumbline: the vehicle does not stand at the starting tilt (${r.samples[0]?.status ?? 'no result'})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};
