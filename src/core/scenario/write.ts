/**
 * Core `Scenario` (SI) → scenario file data, in metric or imperial units. Every field is written
 * out (no defaults left implicit), so `parseScenario(scenarioToFile(s))` gives back `s`.
 */
import type { AxleSuspension, TerrainFeature, TyreSpec } from '../model/types';
import type { Scenario, UnitSystem } from './types';
import { DOWNHILL_NAMES, type DownhillName } from './schema';
import { RAD_PER_DEG, fromSI } from './units';
import { buildsToFile } from './builds';
import { encodeHeights, encodeMask } from '../ground/base64';

/** JSON-ready scenario file data. */
export type ScenarioFileObject = Record<string, unknown>;

/** Write a scenario in its file form. @default units the scenario's own `units` */
export function scenarioToFile(s: Scenario, units: UnitSystem = s.units): ScenarioFileObject {
  const m = (v: number) => fromSI('length', v, units);
  const kg = (v: number) => fromSI('mass', v, units);
  const deg = (v: number) => fromSI('angle', v, units);
  const range = (r: readonly [number, number]) => [m(r[0]), m(r[1])];
  const v = s.vehicle;
  const tyre = (t: TyreSpec) => ({ radius: m(t.radiusM), width: m(t.widthM), stiffness: fromSI('stiffness', t.stiffnessNPerM, units) });
  const axle = (a: AxleSuspension) => ({
    type: a.type,
    wheelRate: fromSI('stiffness', a.wheelRateNPerM, units),
    bump: m(a.bumpM),
    droop: m(a.droopM),
    antiRoll: fromSI('rollStiffness', a.antiRollNmPerRad, units),
    rollCentreHeight: m(a.rollCentreHeightM),
    ...(a.springSpacingM === undefined ? {} : { springSpacing: m(a.springSpacingM) }),
  });
  const feature = (f: TerrainFeature): Record<string, unknown> => {
    switch (f.type) {
      case 'plane':
        return { type: 'plane', grade: deg(f.gradeRad), crossSlope: deg(f.crossSlopeRad), height: m(f.heightM) };
      case 'step':
        return {
          type: 'step',
          x: m(f.xM),
          height: m(f.heightM),
          ...(f.yRangeM ? { y: range(f.yRangeM) } : {}),
          edgeRadius: m(f.edgeRadiusM),
        };
      case 'block':
        return { type: 'block', x: range(f.xRangeM), y: range(f.yRangeM), height: m(f.heightM), edgeRadius: m(f.edgeRadiusM) };
      case 'rock':
        return { type: 'rock', x: m(f.xM), y: m(f.yM), height: m(f.heightM), radius: m(f.radiusM) };
      case 'ramp':
        return { type: 'ramp', x: m(f.xM), angle: deg(f.angleRad), length: m(f.lengthM), ...(f.yRangeM ? { y: range(f.yRangeM) } : {}) };
      case 'profile':
        return {
          type: 'profile',
          axis: f.axis,
          points: f.points.map((p) => [m(p[0]), m(p[1])]),
          ...(f.acrossM ? { across: range(f.acrossM) } : {}),
        };
      case 'grid': {
        const base = { type: 'grid', origin: [m(f.originM[0]), m(f.originM[1])], spacing: m(f.spacingM), cols: f.cols, rows: f.rows };
        if (f.source) {
          // Imported ground: heights as base64 float32 (compact, fast to read back), the filled mask one bit per node.
          return {
            ...base,
            heights: encodeHeights(f.heightsM, m(1)),
            ...(f.filledMask ? { filled: encodeMask(f.filledMask) } : {}),
            source: { file: f.source.file, format: f.source.format, crs: f.source.crs, origin: [...f.source.originSource], unit: f.source.sourceUnitM },
          };
        }
        const heights: number[] = new Array(f.heightsM.length);
        for (let i = 0; i < heights.length; i++) heights[i] = m(f.heightsM[i]);
        return { ...base, heights };
      }
    }
  };
  // A downhill direction that is exactly one of the named ones is written by name.
  let downhill: number | DownhillName = deg(s.tilt.downhillRad);
  for (const name of Object.keys(DOWNHILL_NAMES) as DownhillName[]) {
    if (s.tilt.downhillRad === DOWNHILL_NAMES[name] * RAD_PER_DEG) downhill = name;
  }
  const out: ScenarioFileObject = {
    version: s.version,
    name: s.name,
    units,
    notes: s.notes,
    vehicle: {
      name: v.name,
      wheelbase: m(v.wheelbaseM),
      track: { front: m(v.trackFrontM), rear: m(v.trackRearM) },
      mass: kg(v.massKg),
      cg: { behindFrontAxle: m(v.cg.behindFrontAxleM), height: m(v.cg.heightM), leftOfCentre: m(v.cg.leftOfCentreM) },
      unsprungMass: { front: kg(v.unsprungMassFrontKg), rear: kg(v.unsprungMassRearKg) },
      tyre: tyre(v.tyreFront),
      tyreRear: tyre(v.tyreRear),
      suspension: { front: axle(v.suspensionFront), rear: axle(v.suspensionRear) },
      payload: v.payload.map((p) => ({
        label: p.label,
        mass: kg(p.massKg),
        behindFrontAxle: m(p.behindFrontAxleM),
        height: m(p.heightM),
        leftOfCentre: m(p.leftOfCentreM),
      })),
      body: {
        frontOverhang: m(v.body.frontOverhangM),
        rearOverhang: m(v.body.rearOverhangM),
        width: m(v.body.widthM),
        bellyClearance: m(v.body.bellyClearanceM),
        frontBumperClearance: m(v.body.frontBumperClearanceM),
        rearBumperClearance: m(v.body.rearBumperClearanceM),
        roofHeight: m(v.body.roofHeightM),
      },
    },
    terrain: { features: s.terrain.features.map(feature) },
    pose: { x: m(s.pose.xM), y: m(s.pose.yM), heading: deg(s.pose.headingRad) },
    tilt: { angle: deg(s.tilt.angleRad), downhill },
  };
  if (s.path) {
    out.path = {
      from: [m(s.path.fromM[0]), m(s.path.fromM[1])],
      to: [m(s.path.toM[0]), m(s.path.toM[1])],
      step: m(s.path.stepM),
      ...(s.path.headingRad === null ? {} : { heading: deg(s.path.headingRad) }),
    };
  }
  out.ground = { friction: s.friction };
  if (s.builds && s.builds.length > 0) out.builds = buildsToFile(s.builds, units);
  return out;
}
