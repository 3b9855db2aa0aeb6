/**
 * Generators of random, physically valid Plumbline cases (invented vehicles on random terrain),
 * shared by the hardening suites and by anyone replaying a failing case.
 */
import fc from 'fast-check';
import type { AxleSuspension, TerrainFeature, Vehicle } from '../../src/core/model/types';
import { BODY, testVehicle } from './vehicles';

const DEG = Math.PI / 180;

const axleArb = fc.record({
  solid: fc.boolean(),
  wheelRateNPerM: fc.double({ min: 10e3, max: 200e3, noNaN: true }),
  antiRollNmPerDeg: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 5000, noNaN: true })),
  bumpM: fc.double({ min: 0.03, max: 0.3, noNaN: true }),
  droopM: fc.double({ min: 0, max: 0.3, noNaN: true }),
  rollCentreHeightM: fc.double({ min: 0, max: 0.7, noNaN: true }),
  unsprungKg: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 250, noNaN: true })),
});

export const vehicleArb = fc
  .record({
    wheelbaseM: fc.double({ min: 1.6, max: 4.2, noNaN: true }),
    trackFrontM: fc.double({ min: 1.1, max: 2.0, noNaN: true }),
    trackRearM: fc.double({ min: 1.1, max: 2.0, noNaN: true }),
    massKg: fc.double({ min: 400, max: 6000, noNaN: true }),
    cgHeightM: fc.double({ min: 0.35, max: 1.4, noNaN: true }),
    aFraction: fc.double({ min: 0.25, max: 0.75, noNaN: true }),
    cgLateralFraction: fc.double({ min: -0.15, max: 0.15, noNaN: true }),
    radiusM: fc.double({ min: 0.25, max: 0.6, noNaN: true }),
    widthM: fc.double({ min: 0.12, max: 0.4, noNaN: true }),
    stiffnessNPerM: fc.double({ min: 80e3, max: 1.5e6, noNaN: true }),
    front: axleArb,
    rear: axleArb,
  })
  .map((r): Vehicle => {
    const axle = (a: typeof r.front): AxleSuspension => ({
      type: a.solid ? 'solid' : 'independent',
      wheelRateNPerM: a.wheelRateNPerM,
      bumpM: a.bumpM,
      droopM: a.droopM,
      antiRollNmPerRad: a.antiRollNmPerDeg / DEG,
      rollCentreHeightM: Math.min(a.rollCentreHeightM, r.cgHeightM),
    });
    const tyre = { radiusM: r.radiusM, widthM: r.widthM, stiffnessNPerM: r.stiffnessNPerM };
    const minTrack = Math.min(r.trackFrontM, r.trackRearM);
    return testVehicle({
      name: 'Fuzz rig (invented)',
      wheelbaseM: r.wheelbaseM,
      trackFrontM: r.trackFrontM,
      trackRearM: r.trackRearM,
      massKg: r.massKg,
      cg: {
        behindFrontAxleM: r.aFraction * r.wheelbaseM,
        heightM: Math.max(r.cgHeightM, r.radiusM * 0.9),
        leftOfCentreM: r.cgLateralFraction * minTrack,
      },
      unsprungMassFrontKg: Math.min(r.front.unsprungKg, 0.2 * r.massKg),
      unsprungMassRearKg: Math.min(r.rear.unsprungKg, 0.2 * r.massKg),
      tyreFront: tyre,
      tyreRear: tyre,
      suspensionFront: axle(r.front),
      suspensionRear: axle(r.rear),
      body: BODY,
    });
  });

/** A feature placed near the vehicle (the pose is at the origin facing +x, wheels at ±L/2, ±T/2). */
export const featureArb: fc.Arbitrary<TerrainFeature> = fc.oneof(
  fc.record({
    type: fc.constant('plane' as const),
    gradeRad: fc.double({ min: -25 * DEG, max: 25 * DEG, noNaN: true }),
    crossSlopeRad: fc.double({ min: -25 * DEG, max: 25 * DEG, noNaN: true }),
    heightM: fc.double({ min: -1, max: 1, noNaN: true }),
  }),
  fc.record({
    type: fc.constant('step' as const),
    xM: fc.double({ min: -2.5, max: 2.5, noNaN: true }),
    heightM: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
    yRangeM: fc.option(fc.tuple(fc.double({ min: -2, max: 0, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true })), { nil: null }),
    edgeRadiusM: fc.double({ min: 0, max: 0.1, noNaN: true }),
  }),
  fc
    .record({
      x0: fc.double({ min: -2.5, max: 2.5, noNaN: true }),
      y0: fc.double({ min: -1.5, max: 1.5, noNaN: true }),
      dx: fc.double({ min: 0.05, max: 2, noNaN: true }),
      dy: fc.double({ min: 0.05, max: 2, noNaN: true }),
      heightM: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
      edgeRadiusM: fc.double({ min: 0, max: 0.1, noNaN: true }),
    })
    .map((b): TerrainFeature => ({
      type: 'block',
      xRangeM: [b.x0, b.x0 + b.dx],
      yRangeM: [b.y0, b.y0 + b.dy],
      heightM: b.heightM,
      edgeRadiusM: b.edgeRadiusM,
    })),
  fc.record({
    type: fc.constant('rock' as const),
    xM: fc.double({ min: -2.5, max: 2.5, noNaN: true }),
    yM: fc.double({ min: -1.5, max: 1.5, noNaN: true }),
    heightM: fc.double({ min: 0.01, max: 0.6, noNaN: true }),
    radiusM: fc.double({ min: 0.03, max: 1.2, noNaN: true }),
  }),
  fc.record({
    type: fc.constant('ramp' as const),
    xM: fc.double({ min: -3, max: 2, noNaN: true }),
    angleRad: fc.double({ min: 1 * DEG, max: 35 * DEG, noNaN: true }),
    lengthM: fc.double({ min: 0.2, max: 4, noNaN: true }),
    yRangeM: fc.option(fc.tuple(fc.double({ min: -2, max: 0, noNaN: true }), fc.double({ min: 0.05, max: 2, noNaN: true })), { nil: null }),
  }),
  fc
    .record({
      axis: fc.constantFrom('x' as const, 'y' as const),
      start: fc.double({ min: -4, max: 0, noNaN: true }),
      steps: fc.array(fc.tuple(fc.double({ min: 0.05, max: 1, noNaN: true }), fc.double({ min: -0.3, max: 0.3, noNaN: true })), { minLength: 1, maxLength: 12 }),
    })
    .map((p): TerrainFeature => {
      const points: [number, number][] = [[p.start, 0]];
      let s = p.start;
      for (const [ds, z] of p.steps) {
        s += ds;
        points.push([s, z]);
      }
      return { type: 'profile', axis: p.axis, points, acrossM: null };
    }),
  fc
    .record({
      cols: fc.integer({ min: 2, max: 24 }),
      rows: fc.integer({ min: 2, max: 24 }),
      spacingM: fc.double({ min: 0.1, max: 0.6, noNaN: true }),
      amplitudeM: fc.double({ min: 0, max: 0.4, noNaN: true }),
      seed: fc.integer({ min: 0, max: 1_000_000 }),
    })
    .map((g): TerrainFeature => {
      // A deterministic bumpy field from the seed (no Math.random: the case must replay).
      const heights: number[] = [];
      let s = g.seed;
      for (let k = 0; k < g.cols * g.rows; k++) {
        s = (s * 1103515245 + 12345) % 2147483648;
        heights.push(((s / 2147483648) * 2 - 1) * g.amplitudeM);
      }
      return {
        type: 'grid',
        originM: [-(g.cols - 1) * g.spacingM * 0.5, -(g.rows - 1) * g.spacingM * 0.5],
        spacingM: g.spacingM,
        cols: g.cols,
        rows: g.rows,
        heightsM: heights,
      };
    }),
);

export const caseArb = fc.record({
  vehicle: vehicleArb,
  features: fc.array(featureArb, { minLength: 0, maxLength: 4 }),
  pose: fc.record({
    xM: fc.double({ min: -1, max: 1, noNaN: true }),
    yM: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
    headingRad: fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }),
  }),
  tilt: fc.record({
    angleRad: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 100 * DEG, noNaN: true })),
    downhillRad: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }),
  }),
});

