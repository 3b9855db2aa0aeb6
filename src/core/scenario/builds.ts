/**
 * The scenario file's optional `builds` block (analyses, issue 3) ↔ the core's `BuildSpec` (SI).
 * File form, per build (lengths in the file's units; wheel fitment as the trade states it, in every
 * file: rim width and backspacing in inches, offset in millimetres):
 *
 *   { "name": "2.5 in lift + 35s",
 *     "lift": { "suspension": 0.0635, "body": 0, "bodyMassShare": 0.35 },
 *     "tyre": { "radius": 0.445, "width": 0.32, "stiffness": 300000 },
 *     "wheels": { "rimWidth": 9, "offset": -12, "spacer": 0.0254, "axle": "both",
 *                 "stock": { "rimWidth": 8, "offset": 25 } },
 *     "payload": [ { "label": "rooftop tent", "mass": 60, "behindFrontAxle": 1.4, "height": 2.0 } ],
 *     "antiRoll": { "front": "disconnected" },
 *     "travel": { "front": { "bump": 0.12, "droop": 0.2 } } }
 *
 * `stock` is the wheel the vehicle's track was measured on; it is needed whenever a new wheel
 * (`rimWidth` with `offset` or `backspacing`) is given. A spacer alone needs none.
 */
import type { BuildSpec, WheelFitment } from '../analysis/builds';
import type { PayloadItem } from '../model/types';
import type { ScenarioError, UnitSystem } from './types';
import type { ScenarioFileData } from './schema';
import { M_PER_IN, M_PER_MM, PAYLOAD_FIELDS, fileNumber, fixedUnitNumber, rowsToFile, rowsToSI, toSI } from './fields';

/** Build names the comparison uses for its own columns (compared trimmed, in any case). */
export const RESERVED_BUILD_NAMES: readonly string[] = ['as given'];

type Plain = Record<string, unknown>;
const own = (o: unknown, k: string): unknown =>
  o !== null && typeof o === 'object' && !Array.isArray(o) && Object.prototype.hasOwnProperty.call(o, k) ? (o as Plain)[k] : undefined;

/** Checks across the fields of each build (the schema checks each field alone). */
export function buildsCrossChecks(data: unknown, errors: ScenarioError[]): void {
  const builds = own(data, 'builds');
  if (!Array.isArray(builds)) return;
  const names = new Map<string, number>();
  builds.forEach((b, i) => {
    const p = `builds[${i}]`;
    const name = own(b, 'name');
    if (typeof name === 'string' && RESERVED_BUILD_NAMES.includes(name.trim().toLowerCase())) {
      errors.push({ path: `${p}.name`, message: `${JSON.stringify(name)} is reserved for the vehicle without modifications (the first column of a comparison); choose another name` });
    } else if (typeof name === 'string') {
      if (names.has(name)) errors.push({ path: `${p}.name`, message: `must differ from builds[${names.get(name)}].name, got ${JSON.stringify(name)}` });
      else names.set(name, i);
    }
    const w = own(b, 'wheels');
    if (w === undefined) return;
    const hasOffset = own(w, 'offset') !== undefined;
    const hasBs = own(w, 'backspacing') !== undefined;
    const hasRim = own(w, 'rimWidth') !== undefined;
    if (hasOffset && hasBs) errors.push({ path: `${p}.wheels`, message: 'give offset (mm) or backspacing (in), not both' });
    if (hasRim && !hasOffset && !hasBs) errors.push({ path: `${p}.wheels`, message: 'a new wheel needs offset (mm) or backspacing (in) with its rimWidth (in)' });
    if (!hasRim && (hasOffset || hasBs)) errors.push({ path: `${p}.wheels.rimWidth`, message: 'required (in) with an offset or backspacing' });
    const stock = own(w, 'stock');
    if (hasRim && stock === undefined) {
      errors.push({ path: `${p}.wheels.stock`, message: 'required with a new wheel: the stock rimWidth (in) and offset (mm) or backspacing (in) the track was measured on' });
    }
    if (stock !== undefined) {
      const so = own(stock, 'offset') !== undefined;
      const sb = own(stock, 'backspacing') !== undefined;
      if (so === sb) errors.push({ path: `${p}.wheels.stock`, message: 'give offset (mm) or backspacing (in), one of the two' });
    }
  });
}

type FileBuild = NonNullable<ScenarioFileData['builds']>[number];

/** File builds (validated, in the file's units) → core BuildSpec (SI). */
export function buildsToSI(builds: readonly FileBuild[] | undefined, u: UnitSystem): BuildSpec[] {
  if (!builds) return [];
  const m = (v: number) => toSI('length', v, u);
  const fit = (rimIn: number, offsetMm: number | undefined, bsIn: number | undefined): WheelFitment => ({
    rimWidthM: rimIn * M_PER_IN,
    ...(offsetMm === undefined ? {} : { offsetM: offsetMm * M_PER_MM }),
    ...(bsIn === undefined ? {} : { backspacingM: bsIn * M_PER_IN }),
  });
  const anti = (x: number | 'disconnected' | undefined) => (x === undefined || x === 'disconnected' ? x : toSI('rollStiffness', x, u));
  const travel = (t: { bump?: number; droop?: number } | undefined) =>
    t === undefined ? undefined : { ...(t.bump === undefined ? {} : { bumpM: m(t.bump) }), ...(t.droop === undefined ? {} : { droopM: m(t.droop) }) };
  return builds.map((b): BuildSpec => {
    const payload: PayloadItem[] | undefined = b.payload?.map((p) => rowsToSI(PAYLOAD_FIELDS, p, u, { label: p.label }) as unknown as PayloadItem);
    const w = b.wheels;
    return {
      name: b.name,
      ...(b.lift
        ? {
            lift: {
              ...(b.lift.suspension === undefined ? {} : { suspensionM: m(b.lift.suspension) }),
              ...(b.lift.body === undefined ? {} : { bodyM: m(b.lift.body) }),
              ...(b.lift.bodyMassShare === undefined ? {} : { bodyMassShare: b.lift.bodyMassShare }),
            },
          }
        : {}),
      ...(b.tyre
        ? {
            tyre: {
              radiusM: m(b.tyre.radius),
              ...(b.tyre.width === undefined ? {} : { widthM: m(b.tyre.width) }),
              ...(b.tyre.stiffness === undefined ? {} : { stiffnessNPerM: toSI('stiffness', b.tyre.stiffness, u) }),
            },
          }
        : {}),
      ...(w
        ? {
            wheels: {
              axle: w.axle ?? 'both',
              ...(w.rimWidth === undefined ? {} : { fitted: fit(w.rimWidth, w.offset, w.backspacing) }),
              ...(w.stock ? { stock: fit(w.stock.rimWidth, w.stock.offset, w.stock.backspacing) } : {}),
              spacerM: w.spacer === undefined ? 0 : m(w.spacer),
            },
          }
        : {}),
      ...(payload ? { payload } : {}),
      ...(b.antiRoll ? { antiRoll: { front: anti(b.antiRoll.front), rear: anti(b.antiRoll.rear) } } : {}),
      ...(b.travel ? { travel: { front: travel(b.travel.front), rear: travel(b.travel.rear) } } : {}),
    };
  });
}

/** Core BuildSpec (SI) → file form in `units` (wheel fitment in in and mm). */
export function buildsToFile(builds: readonly BuildSpec[], units: UnitSystem): Record<string, unknown>[] {
  const m = (v: number) => fileNumber('length', v, units);
  const fit = (f: WheelFitment) => ({
    rimWidth: fixedUnitNumber(f.rimWidthM, M_PER_IN),
    ...(f.offsetM === undefined ? {} : { offset: fixedUnitNumber(f.offsetM, M_PER_MM) }),
    ...(f.backspacingM === undefined ? {} : { backspacing: fixedUnitNumber(f.backspacingM, M_PER_IN) }),
  });
  const anti = (x: number | 'disconnected' | undefined) => (x === undefined || x === 'disconnected' ? x : fileNumber('rollStiffness', x, units));
  const travel = (t: { bumpM?: number; droopM?: number } | undefined) =>
    t === undefined ? undefined : { ...(t.bumpM === undefined ? {} : { bump: m(t.bumpM) }), ...(t.droopM === undefined ? {} : { droop: m(t.droopM) }) };
  return builds.map((b) => {
    const out: Record<string, unknown> = { name: b.name };
    if (b.lift) {
      out.lift = {
        ...(b.lift.suspensionM === undefined ? {} : { suspension: m(b.lift.suspensionM) }),
        ...(b.lift.bodyM === undefined ? {} : { body: m(b.lift.bodyM) }),
        ...(b.lift.bodyMassShare === undefined ? {} : { bodyMassShare: b.lift.bodyMassShare }),
      };
    }
    if (b.tyre) {
      out.tyre = {
        radius: m(b.tyre.radiusM),
        ...(b.tyre.widthM === undefined ? {} : { width: m(b.tyre.widthM) }),
        ...(b.tyre.stiffnessNPerM === undefined ? {} : { stiffness: fileNumber('stiffness', b.tyre.stiffnessNPerM, units) }),
      };
    }
    if (b.wheels) {
      const w = b.wheels;
      out.wheels = {
        axle: w.axle ?? 'both',
        ...(w.fitted ? fit(w.fitted) : {}),
        ...(w.spacerM ? { spacer: m(w.spacerM) } : {}),
        ...(w.stock ? { stock: fit(w.stock) } : {}),
      };
    }
    if (b.payload) {
      out.payload = b.payload.map((p) => rowsToFile(PAYLOAD_FIELDS, p, units, { label: p.label }));
    }
    if (b.antiRoll) {
      const a: Record<string, unknown> = {};
      if (b.antiRoll.front !== undefined) a.front = anti(b.antiRoll.front);
      if (b.antiRoll.rear !== undefined) a.rear = anti(b.antiRoll.rear);
      out.antiRoll = a;
    }
    if (b.travel) {
      const t: Record<string, unknown> = {};
      if (b.travel.front) t.front = travel(b.travel.front);
      if (b.travel.rear) t.rear = travel(b.travel.rear);
      out.travel = t;
    }
    return out;
  });
}
