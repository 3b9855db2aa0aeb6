/** `plumbline cg ...`: CG from scale readings (level corners; height by raising one axle). */
import {
  GRAVITY_MPS2,
  KG_PER_LB,
  M_PER_IN,
  PLAUSIBLE,
  parseScenario,
  cgFromLevelReadings,
  cgHeightFromAxleLift,
  scenarioToFile,
  withMeasuredCg,
} from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_OK, UsageError, type CommandSpec } from '../command';
import { formatKeyValues } from '../format';
import type { CliIO } from '../command';
import { loadScenarioFile, toJsonText } from '../load';
import { parseNumberList, round } from '../analysisOutput';

/**
 * Refuses readings no scale can show and sizes no vehicle has, in the user's units, before any
 * arithmetic: a non-finite or negative reading, one past the scenario format's mass bound, a
 * raised reading that is more than the whole vehicle weighs, lengths outside the format's bounds.
 * Returns the messages (empty when all is well).
 */
function absurdReadings(
  o: Record<string, unknown>,
  corners: readonly number[],
  raised: readonly number[] | null,
  imperial: boolean,
): string[] {
  const M = imperial ? 'lb' : 'kg';
  const L = imperial ? 'in' : 'm';
  const massMax = imperial ? PLAUSIBLE.massMaxKg / KG_PER_LB : PLAUSIBLE.massMaxKg;
  const lenMax = (m: number) => (imperial ? m / M_PER_IN : m);
  const fmt = (v: number) => (Number.isFinite(v) ? String(Number(v.toPrecision(6))) : String(v));
  const bad: string[] = [];
  for (const [i, c] of corners.entries()) {
    if (!(Number.isFinite(c) && c >= 0 && c <= massMax)) bad.push(`--level: reading ${i + 1} must be between 0 and ${fmt(massMax)} ${M}, got ${fmt(c)}`);
  }
  const total = corners.reduce((a, b) => a + b, 0);
  if (bad.length === 0 && !(total > 0 && total <= massMax)) bad.push(`--level: the four readings must add up to more than 0 and at most ${fmt(massMax)} ${M}, got ${fmt(total)}`);
  const length = (name: string, max: number, exclusiveMax = false) => {
    const v = o[name];
    if (v === undefined) return;
    const n = v as number;
    if (!(Number.isFinite(n) && n > 0 && (exclusiveMax ? n < max : n <= max))) bad.push(`--${name}: must be more than 0 and ${exclusiveMax ? 'less than' : 'at most'} ${fmt(max)} ${L}, got ${fmt(n)}`);
  };
  length('wheelbase', lenMax(PLAUSIBLE.wheelbaseMaxM));
  length('track-front', lenMax(PLAUSIBLE.trackMaxM));
  length('track-rear', lenMax(PLAUSIBLE.trackMaxM));
  length('radius', lenMax(PLAUSIBLE.tyreRadiusMaxM));
  if (typeof o.wheelbase === 'number') length('raise', o.wheelbase, true);
  if (raised) {
    for (const [i, r] of raised.entries()) {
      if (!(Number.isFinite(r) && r >= 0)) bad.push(`--raised-loads: reading ${i + 1} must be 0 or more, got ${fmt(r)}`);
    }
    const sum = raised[0] + raised[1];
    // The axle left on the scales cannot carry more than the whole vehicle (the level readings' total).
    if (Number.isFinite(sum) && Number.isFinite(total) && sum > total * (1 + 1e-9)) {
      bad.push(`--raised-loads: the two readings add up to ${fmt(sum)} ${M}, more than the whole vehicle weighs on --level (${fmt(total)} ${M}); check the readings`);
    }
  }
  return bad;
}

/** Prints the messages as bad input; true when there were any. */
function refuse(io: CliIO, messages: readonly string[]): boolean {
  for (const m of messages) io.err(`cg: ${m}`);
  return messages.length > 0;
}

export const cgCommand: CommandSpec = {
  name: 'cg',
  summary: 'CG from scale readings: mass and position from four level corners, height by raising one axle.',
  description:
    'Readings are what the scales show, in kg (metric) or lb (imperial); lengths in m or in.\n' +
    '--level: the four corner readings on level ground. --raised-loads: the two readings under the axle\n' +
    'that stays on the scales while the other (--raised-axle) is lifted by HEIGHT. Height by the axle-lift\n' +
    'method (ISO 10392 road-vehicle practice; SAE J874 / ISO 5005 for machines): h = r + L·ΔW/(W·tan θ),\n' +
    'sin θ = HEIGHT/L, r the loaded tyre radius. Lock the suspension; raise 10–15° or more (common practice).\n' +
    '--into FILE prints that scenario with the measured mass and CG written into its vehicle.',
  args: [],
  options: [
    { name: 'level', kind: 'string', valueName: 'FL,FR,RL,RR', description: 'corner readings on level ground' },
    { name: 'wheelbase', kind: 'number', valueName: 'L', description: 'wheelbase' },
    { name: 'track-front', kind: 'number', valueName: 'T', description: 'front track (for the lateral position)' },
    { name: 'track-rear', kind: 'number', valueName: 'T', description: 'rear track' },
    { name: 'raised-axle', kind: 'string', choices: ['front', 'rear'], valueName: 'front|rear', description: 'the axle lifted off the scales' },
    { name: 'raise', kind: 'number', valueName: 'HEIGHT', description: 'height the raised axle was lifted by' },
    { name: 'raised-loads', kind: 'string', valueName: 'A,B', description: 'readings under the staying axle, raised (left,right)' },
    { name: 'radius', kind: 'number', valueName: 'R', description: 'loaded tyre radius (axle height above the ground)' },
    { name: 'locked', kind: 'flag', description: 'the suspension was locked for the raised reading' },
    { name: 'units', kind: 'string', choices: ['metric', 'imperial'], valueName: 'metric|imperial', description: 'kg and m, or lb and in', default: 'metric' },
    { name: 'into', kind: 'string', valueName: 'FILE', description: 'print FILE with the measured CG written into its vehicle' },
    { name: 'json', kind: 'flag', description: 'print one JSON object, in the chosen units' },
  ],
  run(args, io) {
    const o = args.options;
    const imperial = o.units === 'imperial';
    // Display units → SI at the edge: scale readings are masses (kg or lb), shown as weight / g.
    const toN = (reading: number) => (imperial ? reading * KG_PER_LB : reading) * GRAVITY_MPS2;
    const toM = (v: number) => (imperial ? v * M_PER_IN : v);
    const fromM = (v: number) => (imperial ? v / M_PER_IN : v);
    const fromKg = (v: number) => (imperial ? v / KG_PER_LB : v);
    if (typeof o.level !== 'string') throw new UsageError('cg: --level FL,FR,RL,RR is required');
    if (typeof o.wheelbase !== 'number') throw new UsageError('cg: --wheelbase is required');
    const wheelbase: number = o.wheelbase;
    const corners = parseNumberList('level', o.level, 4);
    const hasTracks = typeof o['track-front'] === 'number' || typeof o['track-rear'] === 'number';
    if (hasTracks && (typeof o['track-front'] !== 'number' || typeof o['track-rear'] !== 'number')) {
      throw new UsageError('cg: give both --track-front and --track-rear, or neither');
    }
    const heightParts = ['raised-axle', 'raise', 'raised-loads', 'radius'].filter((k) => o[k] !== undefined);
    if (heightParts.length > 0 && heightParts.length < 4) {
      throw new UsageError('cg: the height needs all of --raised-axle, --raise, --raised-loads and --radius');
    }
    const raised = heightParts.length === 4 ? parseNumberList('raised-loads', String(o['raised-loads']), 2) : null;
    if (refuse(io, absurdReadings(o, corners, raised, imperial))) return EXIT_BAD_INPUT;
    try {
      return measure();
    } catch (e) {
      // The core's own checks (a CG below the ground, …): bad readings, not a failure of the tool.
      io.err(`cg: ${e instanceof Error ? e.message : String(e)}`);
      return EXIT_BAD_INPUT;
    }
    function measure(): number {
      const level = cgFromLevelReadings({
        cornersN: [toN(corners[0]), toN(corners[1]), toN(corners[2]), toN(corners[3])],
        wheelbaseM: toM(wheelbase),
        ...(hasTracks ? { trackFrontM: toM(o['track-front'] as number), trackRearM: toM(o['track-rear'] as number) } : {}),
      });
      let height: ReturnType<typeof cgHeightFromAxleLift> | null = null;
      if (raised) {
        const raisedAxle = o['raised-axle'] as 'front' | 'rear';
        height = cgHeightFromAxleLift({
          wheelbaseM: toM(wheelbase),
          weightN: level.weightN,
          raisedAxle,
          raiseM: toM(o.raise as number),
          levelStayingAxleN: raisedAxle === 'rear' ? level.frontAxleN : level.rearAxleN,
          raisedStayingAxleN: toN(raised[0]) + toN(raised[1]),
          loadedRadiusM: toM(o.radius as number),
          suspensionLocked: Boolean(o.locked),
        });
      }
      const warnings = height ? height.warnings : [];
      for (const w of warnings) io.err(`cg: warning: ${w}`);
      // Height change per newton of error in the raised reading (m/N): shown per kg or lb of reading.
      const perReading = height ? height.heightPerReadingErrorM : null;
      if (typeof o.into === 'string') {
        const loaded = loadScenarioFile(o.into, io);
        if (!loaded.ok) return EXIT_BAD_INPUT;
        const s = loaded.scenario;
        const v = withMeasuredCg(s.vehicle, {
          massKg: level.massKg,
          behindFrontAxleM: level.behindFrontAxleM,
          leftOfCentreM: level.leftOfCentreM,
          heightM: height?.heightM,
        });
        // Never print a scenario that `check` would refuse (e.g. a mass below the unsprung masses):
        // the printed file goes through the same validation first.
        const file = scenarioToFile({ ...s, vehicle: v });
        const checked = parseScenario(JSON.parse(JSON.stringify(file)));
        if (!checked.ok) {
          io.err(`cg: the measured values do not make a valid scenario with ${o.into}; nothing printed:`);
          for (const e of checked.errors) io.err(`  ${e.path}: ${e.message}`);
          return EXIT_BAD_INPUT;
        }
        io.out(toJsonText(file));
        return EXIT_OK;
      }
      const L = imperial ? 'in' : 'm';
      const M = imperial ? 'lb' : 'kg';
      if (o.json) {
        io.out(
          toJsonText({
            units: { mass: M, length: L, angle: 'deg' },
            mass: round(fromKg(level.massKg), 3),
            frontAxle: round(fromKg(level.frontAxleN / GRAVITY_MPS2), 3),
            rearAxle: round(fromKg(level.rearAxleN / GRAVITY_MPS2), 3),
            behindFrontAxle: round(fromM(level.behindFrontAxleM), 5),
            leftOfCentre: level.leftOfCentreM === null ? null : round(fromM(level.leftOfCentreM), 5),
            height: height ? round(fromM(height.heightM), 5) : null,
            raiseAngleDeg: height ? round((height.raiseAngleRad * 180) / Math.PI, 4) : null,
            heightPerReading: perReading === null ? null : round(fromM(perReading) * GRAVITY_MPS2 * (imperial ? KG_PER_LB : 1), 7),
            warnings,
          }),
        );
        return EXIT_OK;
      }
      const f = (v: number, d = 3) => v.toFixed(d);
      io.out(
        formatKeyValues([
          ['mass', `${f(fromKg(level.massKg), 1)} ${M} (front axle ${f(fromKg(level.frontAxleN / GRAVITY_MPS2), 1)}, rear ${f(fromKg(level.rearAxleN / GRAVITY_MPS2), 1)})`],
          ['CG behind the front axle', `${f(fromM(level.behindFrontAxleM))} ${L}`],
          ['CG left of centre', level.leftOfCentreM === null ? 'give --track-front and --track-rear' : `${f(fromM(level.leftOfCentreM))} ${L}`],
          [
            'CG height',
            height
              ? `${f(fromM(height.heightM))} ${L} (raised ${f((height.raiseAngleRad * 180) / Math.PI, 1)}°; each ${M} of reading error moves it ${f(fromM(perReading!) * GRAVITY_MPS2 * (imperial ? KG_PER_LB : 1), 4)} ${L})`
              : 'give --raised-axle, --raise, --raised-loads and --radius',
          ],
        ]),
      );
      io.out('');
      io.out('Labs measuring the same vehicle have disagreed markedly (SAE 920050): treat the height as a band, e.g. compare --cg-tolerance.');
      return EXIT_OK;
    }
  },
};
