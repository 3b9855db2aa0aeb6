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
import {
  AXLE_FIELDS,
  BODY_FIELDS,
  COORD,
  FEATURE_FIELDS,
  FEATURE_TYPES,
  GROUND_FIELDS,
  PATH_END_FIELDS,
  PATH_FIELDS,
  PATH_HEADING_FIELD,
  PATH_POINT_FIELDS,
  PAYLOAD_FIELDS,
  PLAUSIBLE,
  POSE_FIELDS,
  TILT_FIELDS,
  TRAVEL,
  TYRE_FIELDS,
  TYRE_RADIUS,
  TYRE_STIFFNESS,
  TYRE_WIDTH,
  VEHICLE_FIELDS,
  metricToFileUnits,
  unitLabel,
  type Bound,
  type FieldRow,
  type QuantityKind,
} from './fields';
import { boundMessage, controlCharProblem, describeValue, withUnit } from './messages';
import { base64Length, decodeHeights } from '../ground/base64';

export { FEATURE_TYPES, PLAUSIBLE };

/** Current file format version. */
export const SCENARIO_VERSION = 1;

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
  /**
   * Nodes per grid feature (4096 × 4096, so an imported 4000 × 4000 elevation model fits): 128 MiB of
   * heights as Float64 in memory; in a file, the compact float32 form is about 85 MiB of base64 (within
   * fileBytes), while a list of numbers that long meets the file limit first.
   */
  gridNodes: 16_777_216,
  /** Stations along a path (its length over its step). */
  pathStations: 100_000,
  /** Points in a path or in one saved candidate line (start and end included). */
  pathPoints: 200,
  /** Saved candidate lines per scenario. */
  candidates: 20,
  /** Characters in a name or label. */
  nameChars: 200,
  /** Characters in the notes. */
  notesChars: 20_000,
  /** Characters in a scenario file (parseScenarioText): a full grid with 6-digit heights fits. */
  fileChars: 128 * 1024 * 1024,
  /** Bytes in a scenario file, checked from the file's size before it is read (app and CLI). */
  fileBytes: 128 * 1024 * 1024,
} as const;

/** The raw issue as zod hands it to a schema's error function. */
type RawIssue = { readonly code?: string; readonly input?: unknown };

/** Builds the schema for one unit system. Use `scenarioFileSchema(units)`, which caches it. */
export function buildScenarioSchema(u: UnitSystem) {
  const L = SCENARIO_LIMITS;

  /** A finite number of one kind, with bounds; one message per field (checks abort in turn). */
  const num = (kind: QuantityKind, ...bounds: readonly Bound[]) => {
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
        error: (iss: RawIssue) => boundMessage(op, v, unit, iss.input),
      };
      if (op === '>') s = s.gt(v, params);
      else if (op === '≥') s = s.gte(v, params);
      else if (op === '<') s = s.lt(v, params);
      else s = s.lte(v, params);
    }
    return s;
  };
  const len = (...bounds: readonly Bound[]) => num('length', ...bounds);
  const coord = () => len(...COORD);

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

  /** Text; control characters are refused (a name is printed in terminals and reports). */
  const text = (maxChars: number, nonEmpty: boolean, multiline = false) => {
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
    return s.superRefine((v, ctx) => {
      const problem = controlCharProblem(v, multiline);
      if (problem) ctx.addIssue({ code: 'custom', message: problem, input: v });
    });
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
      // Heights decoded from the compact form are already a fresh Float64Array: checked and kept as they
      // are, not copied again (at the node limit each copy is 128 MiB).
      let decoded: Float64Array | null = null;
      if (typeof v === 'string') {
        // The compact form of imported ground (docs/scenario-format.md): float32 little-endian, base64.
        const d = decodeHeights(v);
        if (typeof d === 'string') {
          ctx.addIssue({ code: 'custom', message: d });
          return z.NEVER;
        }
        v = decoded = d;
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
      const maxH = metricToFileUnits('length', PLAUSIBLE.heightMaxM, u);
      const out = decoded ?? new Float64Array(v.length);
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

  /** The zod type of one row of the field table (fields.ts), optional when the row is. */
  const rowType = (row: FieldRow): z.ZodType => {
    let t: z.ZodType;
    switch (row.type) {
      case 'number': {
        // The JSON Schema's description of the field: its words and unit (from the table).
        const unit = unitLabel(row.kind, u);
        const words = row.label === row.file ? '' : `${row.label[0].toUpperCase()}${row.label.slice(1)}`;
        const description = [words, unit ? `in ${unit}` : ''].filter(Boolean).join(', ');
        t = num(row.kind, ...row.bounds);
        if (description) t = t.describe(`${description}.`);
        break;
      }
      case 'range':
        t = range();
        break;
      case 'pair':
        t = pair(row.names, 'length', coord);
        break;
      case 'int':
        t = int(row.min);
        break;
      case 'choice':
        t = oneOf(row.values);
        break;
      case 'points':
        t = profilePoints();
        break;
      case 'heights':
        t = gridHeights();
        break;
    }
    return row.optional ? t.optional() : t;
  };
  /** A strict-object shape from rows; dotted file keys (`track.front`) become nested objects. */
  const shapeOf = (rows: readonly FieldRow[]): Record<string, z.ZodType> => {
    const shape: Record<string, z.ZodType> = {};
    const nested = new Map<string, FieldRow[]>();
    const order: string[] = [];
    for (const row of rows) {
      const dot = row.file.indexOf('.');
      const key = dot < 0 ? row.file : row.file.slice(0, dot);
      if (!order.includes(key)) order.push(key);
      if (dot < 0) shape[key] = rowType(row);
      else {
        const list = nested.get(key) ?? [];
        list.push({ ...row, file: row.file.slice(dot + 1) });
        nested.set(key, list);
      }
    }
    const out: Record<string, z.ZodType> = {};
    for (const key of order) out[key] = shape[key] ?? obj(shapeOf(nested.get(key)!));
    return out;
  };
  /** Points of a path or a saved line: `[{ "x": …, "y": … }, …]`, 2 to SCENARIO_LIMITS.pathPoints. */
  const pathPoints = () => list(obj(shapeOf(PATH_POINT_FIELDS)), 2, L.pathPoints, 'points ({ "x", "y" })');


  // Imported ground (a grid) may also carry its filled-cell mask and where it came from.
  const featureVariant = (t: (typeof FEATURE_TYPES)[number]) =>
    t === 'grid'
      ? obj({ type: z.literal(t), ...shapeOf(FEATURE_FIELDS[t]), filled: gridFilled().optional(), source: gridSource().optional() })
      : obj({ type: z.literal(t), ...shapeOf(FEATURE_FIELDS[t]) });
  const feature = z.discriminatedUnion(
    'type',
    [
      featureVariant('plane'),
      featureVariant('step'),
      featureVariant('block'),
      featureVariant('rock'),
      featureVariant('ramp'),
      featureVariant('profile'),
      featureVariant('grid'),
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

  const tyre = obj(shapeOf(TYRE_FIELDS));
  const axle = obj({ type: oneOf(SUSPENSION_TYPES), ...shapeOf(AXLE_FIELDS) });
  const payloadItem = obj({ label: text(L.nameChars, true), ...shapeOf(PAYLOAD_FIELDS) });

  const vehicle = obj({
    name: text(L.nameChars, true),
    ...shapeOf(VEHICLE_FIELDS),
    tyre,
    tyreRear: tyre.optional(),
    suspension: obj({ front: axle, rear: axle }),
    payload: list(payloadItem, 0, L.payloadItems, 'payload items').optional(),
    body: obj(shapeOf(BODY_FIELDS)).optional(),
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
    bump: len(...TRAVEL).optional(),
    droop: len(...TRAVEL).optional(),
  });
  const build = obj({
    name: text(L.nameChars, true),
    lift: obj({
      suspension: len(['≥', 0], ['≤', B.liftMaxM]).optional(),
      body: len(['≥', 0], ['≤', B.liftMaxM]).optional(),
      bodyMassShare: num('ratio', ['>', 0], ['≤', 1]).optional(),
    }).optional(),
    tyre: obj({
      radius: len(...TYRE_RADIUS),
      width: len(...TYRE_WIDTH).optional(),
      stiffness: num('stiffness', ...TYRE_STIFFNESS).optional(),
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
    notes: text(L.notesChars, false, true).optional(),
    vehicle,
    terrain: obj({ features: list(feature, 0, L.features, 'features') }),
    pose: obj(shapeOf(POSE_FIELDS)).optional(),
    tilt: obj({ ...shapeOf(TILT_FIELDS), downhill: downhill.optional() }).optional(),
    // Either `points` or the first form `from` + `to` (checked in crossChecks, parse.ts).
    path: obj({
      points: pathPoints().optional(),
      from: rowType(PATH_END_FIELDS[0]).optional(),
      to: rowType(PATH_END_FIELDS[1]).optional(),
      ...shapeOf(PATH_FIELDS),
      heading: rowType(PATH_HEADING_FIELD),
    })
      .nullable()
      .optional(),
    candidates: list(obj({ name: text(L.nameChars, true), points: pathPoints() }), 0, L.candidates, 'candidate lines').optional(),
    builds: list(build, 0, B.builds, 'builds').optional(),
    ground: obj(shapeOf(GROUND_FIELDS)).optional(),
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
