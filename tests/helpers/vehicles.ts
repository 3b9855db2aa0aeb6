/** Invented test vehicles (no real brand's data). */
import type { AxleSuspension, Vehicle } from '../../src/core/model/types';

export const BODY = {
  frontOverhangM: 0.85,
  rearOverhangM: 1.0,
  widthM: 1.85,
  bellyClearanceM: 0.28,
  frontBumperClearanceM: 0.45,
  rearBumperClearanceM: 0.5,
  roofHeightM: 1.85,
};

export function independent(over: Partial<AxleSuspension> = {}): AxleSuspension {
  return {
    type: 'independent',
    wheelRateNPerM: 40_000,
    bumpM: 0.12,
    droopM: 0.15,
    antiRollNmPerRad: 0,
    rollCentreHeightM: 0,
    ...over,
  };
}

/** A generic invented 4×4: wheelbase 2.8 m, track 1.6 m, 2000 kg, CG 1.3 m behind the front axle, 0.75 m high. */
export function testVehicle(over: Partial<Vehicle> = {}): Vehicle {
  return {
    name: 'Test rig',
    wheelbaseM: 2.8,
    trackFrontM: 1.6,
    trackRearM: 1.6,
    massKg: 2000,
    cg: { behindFrontAxleM: 1.3, heightM: 0.75, leftOfCentreM: 0 },
    unsprungMassFrontKg: 0,
    unsprungMassRearKg: 0,
    tyreFront: { radiusM: 0.4, widthM: 0.25, stiffnessNPerM: 300_000 },
    tyreRear: { radiusM: 0.4, widthM: 0.25, stiffnessNPerM: 300_000 },
    suspensionFront: independent(),
    suspensionRear: independent(),
    payload: [],
    body: BODY,
    ...over,
  };
}

/** Very stiff springs and tyres, a narrow tyre: behaves as a rigid body pivoting on the tyre centre-lines. */
export function rigidVehicle(over: Partial<Vehicle> = {}): Vehicle {
  const stiff = independent({ wheelRateNPerM: 1e9, bumpM: 0.1, droopM: 0.1 });
  const tyre = { radiusM: 0.4, widthM: 0.001, stiffnessNPerM: 1e9 };
  return testVehicle({ suspensionFront: stiff, suspensionRear: stiff, tyreFront: tyre, tyreRear: tyre, ...over });
}
