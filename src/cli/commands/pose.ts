/** `plumbline pose FILE`: solve the scenario's pose (with its tilt) and print the tyre loads, travel and margins. */
import { solveEquilibrium, type Scenario, type SolveResult } from '../../core/index';
import { onFilledGround } from '../../core/ground/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { formatKeyValues, formatTable } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { displayUnits, modelOf, radToDegRounded } from '../solveScenario';

/** Whether a loaded tyre's contact lies on imported ground that was filled in (not measured). */
export function onFilled(s: Scenario, r: SolveResult): boolean {
  const pts = r.wheels.filter((w) => !w.lifted).map((w) => [w.contactPointWorld[0], w.contactPointWorld[1]] as const);
  return s.terrain.features.some((f) => onFilledGround(f, pts));
}

/** The documented JSON form of a pose result: SI, angles in degrees, units in the key names. */
export function poseJson(r: SolveResult): object {
  const wheels: Record<string, object> = {};
  for (const w of r.wheels) {
    wheels[w.name] = {
      loadN: w.loadN,
      verticalLoadN: w.verticalLoadN,
      loadShare: w.loadShare,
      staticLoadN: w.staticLoadN,
      lifted: w.lifted,
      travelM: w.travelM,
      travelFraction: w.travelFraction,
      tyreDeflectionM: w.tyreDeflectionM,
      frictionDemand: w.frictionDemand,
      tangentialN: w.tangentialN,
      contactPointM: w.contactPointWorld,
      contactNormal: w.contactNormalWorld,
      centreM: w.centreWorld,
    };
  }
  return {
    status: r.status,
    reason: r.reason,
    iterations: r.iterations,
    evaluations: r.evaluations,
    residualN: r.residualN,
    residualNm: r.residualNm,
    weightN: r.weightN,
    wheels,
    body: {
      heaveM: r.body.heaveM,
      rollDeg: radToDegRounded(r.body.rollRad, 6),
      pitchDeg: radToDegRounded(r.body.pitchRad, 6),
      rollToLevelDeg: radToDegRounded(r.body.rollToLevelRad, 6),
      pitchToLevelDeg: radToDegRounded(r.body.pitchToLevelRad, 6),
      cgM: r.body.cgWorld,
      plumbPointM: r.body.plumbPointWorld,
    },
    margins: {
      forceAngleDeg: radToDegRounded(r.margins.forceAngleRad, 6),
      forceAngleMeasurePerWeightM: r.margins.forceAngleMeasurePerWeightM,
      energyM: r.margins.energyM,
      staticM: r.margins.staticM,
      weakestEdge: r.margins.weakestEdgeWheels,
    },
    supportPolygonM: r.supportPolygonWorld,
  };
}

export const poseCommand: CommandSpec = {
  name: 'pose',
  summary: 'Solve how the vehicle stands at the scenario pose: load on each tyre, travel, margins.',
  description:
    'Quasi-static estimate: real margins are smaller (bounce, momentum, soft ground, driver input).\n' +
    'Exit 0 when it stands, 1 when it tips, loses contact or the solver does not converge (the result is still printed).',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [{ name: 'json', kind: 'flag', description: 'print one JSON object (SI units, angles in degrees)' }],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const model = modelOf(s);
    const r = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction });
    const filled = onFilled(s, r);
    if (args.options.json) io.out(toJsonText({ ...poseJson(r), onFilledGround: filled }));
    else {
      const u = displayUnits(s.units);
      io.out(`${s.name}: ${s.vehicle.name}`);
      io.out(
        formatTable(
          [
            { header: 'wheel' },
            { header: 'load', unit: u.force, digits: 0 },
            { header: 'of static', unit: '%', digits: 0 },
            { header: 'travel', unit: u.length, digits: 3 },
            { header: 'travel used', unit: '%', digits: 0 },
            { header: 'grip needed', unit: 'μ', digits: 2 },
            { header: 'state' },
          ],
          r.wheels.map((w) => [
            w.name,
            u.forceOf(w.loadN),
            100 * w.loadShare,
            u.lengthOf(w.travelM),
            100 * w.travelFraction,
            w.frictionDemand,
            w.lifted ? 'LIFTED' : w.frictionDemand > s.friction ? 'SLIDES' : w.loadShare < 0.25 ? 'light' : '',
          ]),
        ),
      );
      io.out('');
      io.out(
        formatKeyValues([
          ['status', `${r.status} (${r.reason})`],
          ['weight', `${u.forceOf(r.weightN).toFixed(0)} ${u.force}`],
          ['body roll / pitch to level', `${radToDegRounded(r.body.rollToLevelRad, 2)}° / ${radToDegRounded(r.body.pitchToLevelRad, 2)}°`],
          ['force-angle margin', `${radToDegRounded(r.margins.forceAngleRad, 2)}° (weakest edge ${r.margins.weakestEdgeWheels.join('–') || 'none'})`],
          ['energy margin', `${u.lengthOf(r.margins.energyM).toFixed(3)} ${u.length}`],
          ['static margin', `${u.lengthOf(r.margins.staticM).toFixed(3)} ${u.length}`],
        ]),
      );
      io.out('');
      if (filled) io.out('Caution: a tyre stands on ground that was filled in by the import (no data there): its load is a guess.');
      io.out('Caution: a quasi-static estimate on rigid ground. Real margins are smaller; follow the maker\'s limits, local rules and trained practice.');
    }
    if (r.status !== 'converged') {
      io.err(`plumbline: the vehicle does not stand at this pose: ${r.status} (${r.reason})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};
