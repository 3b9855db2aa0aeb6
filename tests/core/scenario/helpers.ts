/** Scenario test helpers: a valid base file and a tolerance-aware deep comparison. */
import { expect } from 'vitest';

/** Relative tolerance of a round trip through the file form (a few ulps of float64 arithmetic). */
export const ROUND_TRIP_REL = 1e-12;
/** Relative tolerance between the imperial fixture (10 significant digits) and the metric demo. */
export const FIXTURE_REL = 1e-9;

/** A small valid metric scenario file (invented vehicle). */
export function baseFile(): Record<string, any> {
  return {
    version: 1,
    name: 'Test bench at Orrin Gap',
    units: 'metric',
    vehicle: {
      name: 'Test wagon',
      wheelbase: 2.8,
      track: { front: 1.6, rear: 1.6 },
      mass: 2000,
      cg: { behindFrontAxle: 1.3, height: 0.75 },
      unsprungMass: { front: 100, rear: 140 },
      tyre: { radius: 0.38, width: 0.25, stiffness: 300000 },
      suspension: {
        front: { type: 'independent', wheelRate: 40000, bump: 0.08, droop: 0.1, antiRoll: 800, rollCentreHeight: 0.3 },
        rear: { type: 'solid', wheelRate: 45000, bump: 0.1, droop: 0.12, rollCentreHeight: 0.5, springSpacing: 1.0 },
      },
    },
    terrain: {
      features: [
        { type: 'plane', grade: 0, crossSlope: 0, height: 0 },
        { type: 'step', x: 2, height: 0.3 },
      ],
    },
  };
}

/**
 * The same small scenario as an imperial file (in, lb, lbf/in, lbf·ft/deg): the base file's
 * chassis and tyres in inches (invented, rounded), everything else as in `baseFile`.
 */
export function imperialBaseFile(): Record<string, any> {
  const o = baseFile();
  o.units = 'imperial';
  Object.assign(o.vehicle, { wheelbase: 110, track: { front: 63, rear: 63 }, mass: 4400 });
  o.vehicle.cg = { behindFrontAxle: 51, height: 29.5 };
  o.vehicle.unsprungMass = { front: 220, rear: 310 };
  o.vehicle.tyre = { radius: 15, width: 10, stiffness: 1700 };
  o.vehicle.suspension.front = { type: 'independent', wheelRate: 230, bump: 3, droop: 4, antiRoll: 600, rollCentreHeight: 12 };
  o.vehicle.suspension.rear = { type: 'solid', wheelRate: 260, bump: 4, droop: 5, rollCentreHeight: 20, springSpacing: 40 };
  o.terrain.features = [
    { type: 'plane', grade: 0, crossSlope: 0, height: 0 },
    { type: 'step', x: 80, height: 12 },
  ];
  return o;
}

/** A copy of `o` with the value at a dotted path set (or deleted when `value` is the DELETE marker). */
export const DELETE = Symbol('delete');
export function edit(o: Record<string, any>, path: string, value: unknown): Record<string, any> {
  const copy = structuredClone(o);
  const keys = path.split('.');
  let cur: any = copy;
  for (let i = 0; i < keys.length - 1; i++) cur = cur[keys[i]];
  const last = keys[keys.length - 1];
  if (value === DELETE) delete cur[last];
  else cur[last] = value;
  return copy;
}

/** Deep equality with numbers compared to a relative tolerance (values below 1e-9 compare absolutely to rel·1e-9). */
export function expectClose(actual: unknown, expected: unknown, rel: number, path = '$'): void {
  if (typeof expected === 'number') {
    expect(typeof actual, path).toBe('number');
    const a = actual as number;
    const tol = rel * Math.max(Math.abs(expected), 1e-9);
    if (!(Math.abs(a - expected) <= tol)) expect.fail(`${path}: ${a} differs from ${expected} by more than ${tol}`);
    return;
  }
  if (ArrayBuffer.isView(expected) || Array.isArray(expected)) {
    const e = Array.from(expected as ArrayLike<unknown>);
    expect(ArrayBuffer.isView(actual) || Array.isArray(actual), path).toBe(true);
    const a = Array.from(actual as ArrayLike<unknown>);
    expect(a.length, `${path}.length`).toBe(e.length);
    for (let i = 0; i < e.length; i++) expectClose(a[i], e[i], rel, `${path}[${i}]`);
    return;
  }
  if (expected !== null && typeof expected === 'object') {
    expect(actual !== null && typeof actual === 'object', path).toBe(true);
    const ka = Object.keys(actual as object).sort();
    const ke = Object.keys(expected as object).sort();
    expect(ka, `${path} keys`).toEqual(ke);
    for (const k of ke) expectClose((actual as any)[k], (expected as any)[k], rel, `${path}.${k}`);
    return;
  }
  expect(actual, path).toEqual(expected);
}
