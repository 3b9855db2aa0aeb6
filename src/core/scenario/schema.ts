/**
 * The scenario file schema (zod 4). Numbers are in the file's unit system (`units`); angles are
 * always degrees. Each field carries its own message builder so that every message names the bad
 * value and the expected unit or range ("must be > 0 m, got -1.6"); the parser adds the field path.
 *
 * Checks that involve more than one field (CG within the wheelbase, unsprung < total mass, grid
 * size against its heights, ...) are not here but in `crossChecks` (parse.ts): zod skips an
 * object's refinements once any of its fields fails, and we want every error in one pass.
 */
import * as z from 'zod';

// Never generate code: zod's compiled fast path (and its `new Function` probe) stays off, so the app
// runs under a Content-Security-Policy without 'unsafe-eval' (tests/e2e/hardening.test.ts).
z.config({ jitless: true });
import type { UnitSystem } from './types';
import { metricToFileUnits, unitLabel, type QuantityKind } from './units';
import { describeValue, withUnit } from './messages';
import { base64Length, decodeHeights } from '../ground/base64';

/** Current file format version. */
export const SCENARIO_VERSION = 1;

export const FEATURE_TYPES = ['plane', 'step', 'block', 'rock', 'ramp', 'profile', 'grid'] as const;
export const SUSPENSION_TYPES = ['solid', 'independent'] as const;
export const UNIT_SYSTEMS = ['metric', 'imperial'] as const;
/** Named tilt directions and their angle in degrees, counter-clockwise from the nose. */
export const DOWNHILL_NAMES = { front: 0, left: 90, rear: 180, right: 270 } as const;
export type DownhillName = keyof typeof DOWNHILL_NAMES;

/**
 * Size limits. They keep one scenario within what the solver and the browser handle in
 * interactive time, and turn a runaway file (a mistyped step, a generated grid) into a clear
 * message instead of an out-of-memory crash.
 */
export const SCENARIO_LIMITS = {
  /** Terrain features per scenario. */
  features: 200,
  /** Payload items per vehicle. */
  payloadItems: 50,
  /** Points per profile feature. */
  profilePoints: 100_000,
  /** Nodes per grid feature (2048 × 2048): 32 MiB of heights as Float64. */
  gridNodes: 4_194_304,
  /** Stations along a path (from, to, step). */
  pathStations: 100_000,
  /** Characters in a name or label. */
  nameChars: 200,
  /** Characters in the notes. */
  notesChars: 20_000,
  /** Characters in a scenario file (parseScenarioText): a full grid with 6-digit heights fits. */
  fileChars: 128 * 1024 * 1024,
} as const;

/**
 * Plausibility bounds, in metric file units (m, kg, deg). A value outside them is almost always a
 * unit mistake (millimetres typed into a metric file) rather than a real vehicle.
 */
export const PLAUSIBLE = {
  /** Wheelbase up to 20 m (the largest off-road trucks are well under 10 m). */
  wheelbaseMaxM: 20,
  /** Track up to 10 m. */
  trackMaxM: 10,
  /** Mass up to 200 t. */
  massMaxKg: 200_000,
  /** CG height up to 10 m. */
  cgHeightMaxM: 10,
  /** Tyre radius up to 3 m. */
  tyreRadiusMaxM: 3,
  /** Suspension travel, either way, up to 2 m. */
  travelMaxM: 2,
  /** Coordinates (terrain, pose, path, CG and payload positions) within ±100 km of the origin. */
  coordMaxM: 100_000,
  /** Feature heights within ±1 km. */
  heightMaxM: 1_000,
} as const;

type Op = '>' | '≥' | '<' | '≤';
/** A bound in metric file units (m, kg, N/m, N·m/deg, deg, or a plain number). */
type Bound = readonly [op: Op, metricValue: number];
/** The raw issue as zod hands it to a schema's error function. */
type RawIssue = { readonly code?: string; readonly input?: unknown };

/** Builds the schema for one unit system. Use `scenarioFileSchema(units)`, which caches it. */
export function buildScenarioSchema(u: UnitSystem) {
  const L = SCENARIO_LIMITS;
  const P = PLAUSIBLE;

  /** A finite number of one kind, with bounds; one message per field (checks abort in turn). */
  const num = (kind: QuantityKind, ...bounds: Bound[]) => {
    const unit = unitLabel(kind, u);
    let s = z.number({
      error: (iss: RawIssue) =>
        iss.input === undefined
          ? `required${unit ? ` (${unit})` : ''}`
          : `must be a finite number${unit ? ` in ${unit}` : ''}, got ${describeValue(iss.input)}`,
    });
    for (const [op, metricValue] of bounds) {
      const v = metricToFileUnits(kind, metricValue, u);
      const params = {
        abort: true,
        error: (iss: RawIssue) => `must be ${op} ${withUnit(v, unit)}, got ${describeValue(iss.input)}`,
      };
      if (op === '>') s = s.gt(v, params);
      else if (op === '≥') s = s.gte(v, params);
      else if (op === '<') s = s.lt(v, params);
      else s = s.lte(v, params);
    }
    return s;
  };
  const len = (...bounds: Bound[]) => num('length', ...bounds);
  const coord = () => len(['≥', -P.coordMaxM], ['≤', P.coordMaxM]);
  const featureHeight = () => len(['≥', -P.heightMaxM], ['≤', P.heightMaxM]);
  const mass = (...bounds: Bound[]) => num('mass', ...bounds);
  const deg = (...bounds: Bound[]) => num('angle', ...bounds);
  const heading = () => deg(['≥', -360], ['≤', 360]);

  /** A whole number (grid cols, rows; the version is a literal). */
  const int = (min: number) =>
    z
      .number({
        error: (iss: RawIssue) =>
          iss.input === undefined ? 'required (a whole number)' : `must be a whole number, got ${describeValue(iss.input)}`,
      })
      .refine(Number.isInteger, {
        abort: true,
        error: (iss: RawIssue) => `must be a whole number, got ${describeValue(iss.input)}`,
      })
      .gte(min, { abort: true, error: (iss: RawIssue) => `must be ≥ ${min}, got ${describeValue(iss.input)}` });

  const text = (maxChars: number, nonEmpty: boolean) => {
    let s = z
      .string({
        error: (iss: RawIssue) =>
          iss.input === undefined ? 'required (text)' : `must be text, got ${describeValue(iss.input)}`,
      })
      .max(maxChars, {
        abort: true,
        error: (iss: RawIssue) =>
          `must be at most ${maxChars} characters, got ${typeof iss.input === 'string' ? iss.input.length : '?'}`,
      });
    if (nonEmpty) s = s.min(1, { abort: true, error: 'must not be empty' });
    return s;
  };

  const oneOf = <const T extends readonly [string, ...string[]]>(values: T) => {
    const list = values.map((v) => `"${v}"`);
    const words = list.length === 2 ? `${list[0]} or ${list[1]}` : `one of ${list.join(', ')}`;
    return z.enum(values, {
      error: (iss: RawIssue) =>
        iss.input === undefined ? `required (${words})` : `must be ${words}, got ${describeValue(iss.input)}`,
    });
  };

  /** An object that rejects unknown keys (the parser reports each as "unknown key"). */
  const obj = <S extends z.core.$ZodLooseShape>(shape: S) =>
    z.strictObject(shape, {
      error: (iss: RawIssue) =>
        iss.code === 'unrecognized_keys'
          ? 'unknown key'
          : iss.input === undefined
            ? 'required'
            : `must be an object, got ${describeValue(iss.input)}`,
    });

  /** Two numbers `[a, b]`, named in the message. */
  const pair = (names: string, kind: QuantityKind, element: () => z.ZodNumber) => {
    const unit = unitLabel(kind, u);
    return z.tuple([element(), element()], {
      error: (iss: RawIssue) =>
        iss.input === undefined
          ? `required ([${names}] in ${unit})`
          : `must be [${names}] in ${unit}, got ${describeValue(iss.input)}`,
    });
  };
  /** An interval `[from, to]` with from < to. */
  const range = () =>
    pair('from, to', 'length', coord).refine((r) => r[0] < r[1], {
      abort: true,
      error: (iss: RawIssue) => `must have from < to, got ${describeValue(iss.input)}`,
    });

  /** A list with a size limit, checked before the elements so a runaway list costs nothing. */
  const list = <T extends z.ZodType>(element: T, min: number, max: number, noun: string) =>
    z
      .array(z.unknown(), {
        error: (iss: RawIssue) =>
          iss.input === undefined ? `required (a list of ${noun})` : `must be a list of ${noun}, got ${describeValue(iss.input)}`,
      })
      .min(min, {
        abort: true,
        error: (iss: RawIssue) => `must have at least ${min} ${noun}, got ${Array.isArray(iss.input) ? iss.input.length : '?'}`,
      })
      .max(max, {
        abort: true,
        error: (iss: RawIssue) => `must have at most ${max} ${noun}, got ${Array.isArray(iss.input) ? iss.input.length : '?'}`,
      })
      .pipe(z.array(element));

  /** Grid heights: checked by hand, so that a bad 4-million-node grid yields a few messages, not millions. */
  const gridHeights = () =>
    z.unknown().transform((v: unknown, ctx) => {
      const unit = unitLabel('length', u);
      if (typeof v === 'string') {
        // The compact form of imported ground (docs/scenario-format.md): float32 little-endian, base64.
        const d = decodeHeights(v);
        if (typeof d === 'string') {
          ctx.addIssue({ code: 'custom', message: d });
          return z.NEVER;
        }
        v = d;
      }
      if (!Array.isArray(v) && !(v instanceof Float64Array)) {
        ctx.addIssue({
          code: 'custom',
          message: v === undefined ? `required (a list of heights in ${unit})` : `must be a list of heights in ${unit}, got ${describeValue(v)}`,
        });
        return z.NEVER;
      }
      if (v.length > L.gridNodes) {
        ctx.addIssue({ code: 'custom', message: `must have at most ${L.gridNodes} values, got ${v.length}` });
        return z.NEVER;
      }
      const maxH = metricToFileUnits('length', P.heightMaxM, u);
      const out = new Float64Array(v.length);
      let bad = 0;
      for (let i = 0; i < v.length; i++) {
        const h = v[i];
        if (typeof h === 'number' && Number.isFinite(h) && Math.abs(h) <= maxH) {
          out[i] = h;
          continue;
        }
        bad++;
        if (bad <= MAX_ELEMENT_MESSAGES) {
          const message =
            typeof h === 'number' && Number.isFinite(h)
              ? `must be ${h < 0 ? '≥' : '≤'} ${withUnit(h < 0 ? -maxH : maxH, unit)}, got ${describeValue(h)}`
              : `must be a finite number in ${unit}, got ${describeValue(h)}`;
          ctx.addIssue({ code: 'custom', message, path: [i] });
        }
      }
      if (bad > MAX_ELEMENT_MESSAGES) {
        ctx.addIssue({ code: 'custom', message: `${bad - MAX_ELEMENT_MESSAGES} more bad heights not listed` });
      }
      return bad > 0 ? z.NEVER : out;
    });

  /** Imported ground's filled mask: base64 of one bit per node (its length is checked against the grid in parse.ts). */
  const gridFilled = () =>
    z.string({ error: (iss: RawIssue) => `must be base64 text (one bit per node), got ${describeValue(iss.input)}` }).refine((s) => base64Length(s) >= 0 && /^[A-Za-z0-9+/]*={0,2}$/.test(s), {
      abort: true,
      error: 'must be base64 text (one bit per node)',
    });
  /** Imported ground's record of where it came from. */
  const gridSource = () =>
    obj({
      file: text(L.nameChars, false),
      format: text(40, true),
      crs: z.union([text(80, true), z.null()], { error: (iss: RawIssue) => `must be a CRS code or null, got ${describeValue(iss.input)}` }),
      origin: z.tuple([z.number().refine(Number.isFinite), z.number().refine(Number.isFinite), z.number().refine(Number.isFinite)], {
        error: (iss: RawIssue) => `must be [x, y, z] in the source's units, got ${describeValue(iss.input)}`,
      }),
      unit: z.number({ error: 'must be metres per source unit' }).gt(0, { error: (iss: RawIssue) => `must be > 0 m, got ${describeValue(iss.input)}` }),
    });

  /** Profile points [s, z], s strictly increasing. */
  const profilePoints = () =>
    list(pair('s, z', 'length', coord), 2, L.profilePoints, 'points').check((ctx) => {
      const pts = ctx.value;
      const unit = unitLabel('length', u);
      let bad = 0;
      for (let i = 1; i < pts.length; i++) {
        if (pts[i][0] > pts[i - 1][0]) continue;
        bad++;
        if (bad <= MAX_ELEMENT_MESSAGES) {
          ctx.issues.push({
            code: 'custom',
            input: pts[i][0],
            path: [i, 0],
            message: `must be > the previous point's s (${withUnit(pts[i - 1][0], unit)}), got ${describeValue(pts[i][0])}`,
          });
        }
      }
      if (bad > MAX_ELEMENT_MESSAGES) {
        ctx.issues.push({ code: 'custom', input: pts, message: `${bad - MAX_ELEMENT_MESSAGES} more out-of-order points not listed` });
      }
    });

  const featureTag = <T extends string>(t: T) => z.literal(t);

  const feature = z.discriminatedUnion(
    'type',
    [
      obj({
        type: featureTag('plane'),
        // A plane steeper than vertical has no height function; tan must stay finite.
        grade: deg(['>', -90], ['<', 90]).optional(),
        crossSlope: deg(['>', -90], ['<', 90]).optional(),
        height: featureHeight().optional(),
      }),
      obj({
        type: featureTag('step'),
        x: coord(),
        height: featureHeight(),
        y: range().optional(),
        edgeRadius: len(['≥', 0]).optional(),
      }),
      obj({
        type: featureTag('block'),
        x: range(),
        y: range(),
        height: featureHeight(),
        edgeRadius: len(['≥', 0]).optional(),
      }),
      obj({
        type: featureTag('rock'),
        x: coord(),
        y: coord(),
        height: len(['>', 0], ['≤', P.heightMaxM]),
        radius: len(['>', 0], ['≤', P.coordMaxM]),
      }),
      obj({
        type: featureTag('ramp'),
        x: coord(),
        angle: deg(['>', -90], ['<', 90]),
        length: len(['>', 0], ['≤', P.coordMaxM]),
        y: range().optional(),
      }),
      obj({
        type: featureTag('profile'),
        axis: oneOf(['x', 'y'] as const),
        points: profilePoints(),
        across: range().optional(),
      }),
      obj({
        type: featureTag('grid'),
        origin: pair('x, y', 'length', coord),
        spacing: len(['>', 0], ['≤', P.coordMaxM]),
        cols: int(2),
        rows: int(2),
        heights: gridHeights(),
        filled: gridFilled().optional(),
        source: gridSource().optional(),
      }),
    ],
    {
      error: (iss: RawIssue) => {
        if (iss.code !== 'invalid_union') {
          return iss.input === undefined ? 'required' : `must be an object with a "type" key, got ${describeValue(iss.input)}`;
        }
        const t = (iss.input as { type?: unknown } | undefined)?.type;
        const expected = `one of ${FEATURE_TYPES.join(', ')}`;
        if (t === undefined) return `required (${expected})`;
        if (typeof t === 'string') return `unknown feature type ${describeValue(t)}; expected ${expected}`;
        return `must be ${expected}, got ${describeValue(t)}`;
      },
    },
  );

  const tyre = obj({
    radius: len(['>', 0], ['≤', P.tyreRadiusMaxM]),
    width: len(['>', 0]),
    stiffness: num('stiffness', ['>', 0]),
  });

  const axle = obj({
    type: oneOf(SUSPENSION_TYPES),
    wheelRate: num('stiffness', ['>', 0]),
    // Travel from ride height; 0 is allowed (a locked corner, a bump stop at rest).
    bump: len(['≥', 0], ['≤', P.travelMaxM]),
    droop: len(['≥', 0], ['≤', P.travelMaxM]),
    antiRoll: num('rollStiffness', ['≥', 0]).optional(),
    // A roll centre may sit below the ground (some independent layouts), so only plausibility bounds apply.
    rollCentreHeight: len(['≥', -P.cgHeightMaxM], ['≤', P.cgHeightMaxM]),
    springSpacing: len(['>', 0], ['≤', P.trackMaxM]).optional(),
  });

  const payloadItem = obj({
    label: text(L.nameChars, true),
    mass: mass(['>', 0], ['≤', P.massMaxKg]),
    behindFrontAxle: coord(),
    height: len(['≥', 0], ['≤', P.cgHeightMaxM]),
    leftOfCentre: coord().optional(),
  });

  const body = obj({
    frontOverhang: len(['≥', 0], ['≤', P.wheelbaseMaxM]).optional(),
    rearOverhang: len(['≥', 0], ['≤', P.wheelbaseMaxM]).optional(),
    width: len(['>', 0], ['≤', P.trackMaxM]).optional(),
    bellyClearance: len(['>', 0], ['≤', P.cgHeightMaxM]).optional(),
    frontBumperClearance: len(['>', 0], ['≤', P.cgHeightMaxM]).optional(),
    rearBumperClearance: len(['>', 0], ['≤', P.cgHeightMaxM]).optional(),
    roofHeight: len(['>', 0], ['≤', P.cgHeightMaxM]).optional(),
  });

  const vehicle = obj({
    name: text(L.nameChars, true),
    wheelbase: len(['>', 0], ['≤', P.wheelbaseMaxM]),
    track: obj({ front: len(['>', 0], ['≤', P.trackMaxM]), rear: len(['>', 0], ['≤', P.trackMaxM]) }),
    mass: mass(['>', 0], ['≤', P.massMaxKg]),
    cg: obj({
      // Within the wheelbase: checked against wheelbase in crossChecks.
      behindFrontAxle: coord(),
      height: len(['>', 0], ['≤', P.cgHeightMaxM]),
      // Within half the narrower track: checked in crossChecks.
      leftOfCentre: coord().optional(),
    }),
    // Per axle; a wheel always weighs something, and the sum must stay below the mass (crossChecks).
    unsprungMass: obj({ front: mass(['>', 0]), rear: mass(['>', 0]) }),
    tyre,
    tyreRear: tyre.optional(),
    suspension: obj({ front: axle, rear: axle }),
    payload: list(payloadItem, 0, L.payloadItems, 'payload items').optional(),
    body: body.optional(),
  });

  const downhill = z.unknown().transform((v, ctx): number | DownhillName => {
    const names = Object.keys(DOWNHILL_NAMES).map((n) => `"${n}"`).join(', ');
    if (typeof v === 'string' && Object.prototype.hasOwnProperty.call(DOWNHILL_NAMES, v)) return v as DownhillName;
    if (typeof v === 'number' && Number.isFinite(v)) {
      if (v >= -360 && v <= 360) return v;
      ctx.addIssue({ code: 'custom', message: `must be ${v < 0 ? '≥ -360' : '≤ 360'} deg, got ${describeValue(v)}` });
      return z.NEVER;
    }
    ctx.addIssue({ code: 'custom', message: `must be an angle in deg or one of ${names}, got ${describeValue(v)}` });
    return z.NEVER;
  });

  // --- Builds (analyses, issue 3): modifications of the vehicle compared side by side by
  // `compare`. Lengths are in the file's units, except the wheel fitment, which is written as the
  // trade states it in every file: rim width and backspacing in inches, offset in millimetres.
  const B = BUILD_LIMITS;
  /** A number in a fixed unit whatever the file's units (wheel fitment). */
  const fixed = (unit: string, min: number, max: number) =>
    z
      .number({
        error: (iss: RawIssue) =>
          iss.input === undefined ? `required (${unit})` : `must be a finite number in ${unit}, got ${describeValue(iss.input)}`,
      })
      .gte(min, { abort: true, error: (iss: RawIssue) => `must be ≥ ${min} ${unit}, got ${describeValue(iss.input)}` })
      .lte(max, { abort: true, error: (iss: RawIssue) => `must be ≤ ${max} ${unit}, got ${describeValue(iss.input)}` });
  const fitment = obj({
    rimWidth: fixed('in', B.rimWidthMinIn, B.rimWidthMaxIn),
    offset: fixed('mm', -B.offsetMaxMm, B.offsetMaxMm).optional(),
    backspacing: fixed('in', 0, B.rimWidthMaxIn + 1).optional(),
  });
  const antiRollSetting = z.unknown().transform((v, ctx): number | 'disconnected' => {
    if (v === 'disconnected') return v;
    const unit = unitLabel('rollStiffness', u);
    if (typeof v === 'number' && Number.isFinite(v) && v >= 0) return v;
    ctx.addIssue({ code: 'custom', message: `must be "disconnected" or a stiffness ≥ 0 ${unit}, got ${describeValue(v)}` });
    return z.NEVER;
  });
  const axleTravel = obj({
    bump: len(['≥', 0], ['≤', P.travelMaxM]).optional(),
    droop: len(['≥', 0], ['≤', P.travelMaxM]).optional(),
  });
  const build = obj({
    name: text(L.nameChars, true),
    lift: obj({
      suspension: len(['≥', 0], ['≤', B.liftMaxM]).optional(),
      body: len(['≥', 0], ['≤', B.liftMaxM]).optional(),
      bodyMassShare: num('ratio', ['>', 0], ['≤', 1]).optional(),
    }).optional(),
    tyre: obj({
      radius: len(['>', 0], ['≤', P.tyreRadiusMaxM]),
      width: len(['>', 0]).optional(),
      stiffness: num('stiffness', ['>', 0]).optional(),
    }).optional(),
    wheels: obj({
      axle: oneOf(['front', 'rear', 'both'] as const).optional(),
      rimWidth: fixed('in', B.rimWidthMinIn, B.rimWidthMaxIn).optional(),
      offset: fixed('mm', -B.offsetMaxMm, B.offsetMaxMm).optional(),
      backspacing: fixed('in', 0, B.rimWidthMaxIn + 1).optional(),
      spacer: len(['≥', 0], ['≤', B.spacerMaxM]).optional(),
      stock: fitment.optional(),
    }).optional(),
    payload: list(payloadItem, 0, L.payloadItems, 'payload items').optional(),
    antiRoll: obj({ front: antiRollSetting.optional(), rear: antiRollSetting.optional() }).optional(),
    travel: obj({ front: axleTravel.optional(), rear: axleTravel.optional() }).optional(),
  });
  // --- end of builds ---

  return obj({
    $schema: z.string({ error: (iss: RawIssue) => `must be text, got ${describeValue(iss.input)}` }).optional(),
    version: z.literal(SCENARIO_VERSION, {
      error: (iss: RawIssue) =>
        iss.input === undefined ? `required (${SCENARIO_VERSION})` : `must be ${SCENARIO_VERSION}, got ${describeValue(iss.input)}`,
    }),
    name: text(L.nameChars, true),
    units: oneOf(UNIT_SYSTEMS),
    notes: text(L.notesChars, false).optional(),
    vehicle,
    terrain: obj({ features: list(feature, 0, L.features, 'features') }),
    pose: obj({ x: coord().optional(), y: coord().optional(), heading: heading().optional() }).optional(),
    tilt: obj({
      // Past ±180° the table would come round again; 180° is upside down.
      angle: deg(['≥', -180], ['≤', 180]).optional(),
      downhill: downhill.optional(),
    }).optional(),
    path: obj({
      from: pair('x, y', 'length', coord),
      to: pair('x, y', 'length', coord),
      step: len(['>', 0]).optional(),
      heading: heading().optional(),
    })
      .nullable()
      .optional(),
    builds: list(build, 0, B.builds, 'builds').optional(),
    ground: obj({
      // A friction coefficient above 3 is no tyre on any ground (Noon 1994 lists 0.1 to 0.75 on roads).
      friction: num('ratio', ['>', 0], ['≤', 3]).optional(),
    }).optional(),
  });
}

/**
 * Bounds of the `builds` block (analyses): metric file units, except the wheel fitment (in, mm).
 * Rims from 4 to 20 in wide and offsets within ±150 mm cover road and off-road wheels; a lift or a
 * spacer beyond these is almost always a unit mistake.
 */
export const BUILD_LIMITS = {
  /** Builds per scenario (compared side by side). */
  builds: 6,
  liftMaxM: 0.5,
  spacerMaxM: 0.15,
  rimWidthMinIn: 4,
  rimWidthMaxIn: 20,
  offsetMaxMm: 150,
} as const;

/** Most messages listed for one list's elements (grid heights, profile points); the rest are counted. */
export const MAX_ELEMENT_MESSAGES = 10;

export type ScenarioFileSchema = ReturnType<typeof buildScenarioSchema>;
/** A validated scenario file, numbers still in the file's units. */
export type ScenarioFileData = z.output<ScenarioFileSchema>;

const cache: Partial<Record<UnitSystem, ScenarioFileSchema>> = {};

/** The scenario file schema for one unit system (built once). */
export function scenarioFileSchema(units: UnitSystem): ScenarioFileSchema {
  return (cache[units] ??= buildScenarioSchema(units));
}
