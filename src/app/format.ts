/**
 * Display formatting. Conversion happens here, at the edge; the store keeps SI values and the
 * display never writes rounded numbers back.
 */
import { KG_PER_LB, N_PER_LBF, STANDARD_GRAVITY_M_PER_S2, fromSI, unitLabel, type QuantityKind, type UnitSystem } from '../core';

export const DEG_PER_RAD = 180 / Math.PI;

/**
 * A tyre load as a corner scale reads it: force / standard gravity, in kg or lb (common practice
 * for corner weights). Integer.
 */
export function scaleReading(loadN: number, units: UnitSystem): number {
  const kg = loadN / STANDARD_GRAVITY_M_PER_S2;
  return units === 'metric' ? kg : kg / KG_PER_LB;
}

export function scaleUnit(units: UnitSystem): string {
  return units === 'metric' ? 'kg' : 'lb';
}

export function scaleText(loadN: number, units: UnitSystem): string {
  return `${Math.round(scaleReading(loadN, units))} ${scaleUnit(units)}`;
}

/** A force in kN or lbf. */
export function forceText(loadN: number, units: UnitSystem): string {
  return units === 'metric' ? `${(loadN / 1000).toFixed(2)} kN` : `${Math.round(loadN / N_PER_LBF)} lbf`;
}

export function forceValue(loadN: number, units: UnitSystem): number {
  return units === 'metric' ? loadN / 1000 : loadN / N_PER_LBF;
}

export function forceUnit(units: UnitSystem): string {
  return units === 'metric' ? 'kN' : 'lbf';
}

/** Decimals shown per unit for lengths: mm in metric, tenths of an inch in imperial. */
export function lengthText(m: number, units: UnitSystem): string {
  return units === 'metric' ? `${m.toFixed(3)} m` : `${(m / 0.0254).toFixed(1)} in`;
}

export function angleText(rad: number, decimals = 1): string {
  return `${(rad * DEG_PER_RAD).toFixed(decimals)}°`;
}

export function percentText(share: number): string {
  return `${Math.round(share * 100)} %`;
}

/** Field display: the SI value in the chosen unit, with enough digits that nothing visible is lost. */
export function fieldValue(kind: QuantityKind, valueSI: number, units: UnitSystem): string {
  const v = fromSI(kind, valueSI, units);
  if (!Number.isFinite(v)) return '';
  return String(Number(v.toPrecision(7)));
}

export function fieldUnit(kind: QuantityKind, units: UnitSystem): string {
  return unitLabel(kind, units);
}

/** Downhill direction in words (vehicle frame, counter-clockwise from the nose). */
export function downhillWords(downhillRad: number): string {
  const d = (((downhillRad * DEG_PER_RAD) % 360) + 360) % 360;
  const near = (a: number) => Math.abs(((d - a + 540) % 360) - 180) < 1e-6;
  if (near(0)) return 'nose down';
  if (near(90)) return 'left side down';
  if (near(180)) return 'tail down';
  if (near(270)) return 'right side down';
  return `${d.toFixed(0)}° from the nose, counter-clockwise`;
}

/** Suspension travel, short: whole mm in metric, tenths of an inch in imperial. */
export function travelText(m: number, units: UnitSystem): string {
  return units === 'metric' ? `${Math.round(m * 1000)} mm` : `${(m / 0.0254).toFixed(1)} in`;
}

/** Distance along a path: m with 2 decimals in metric, ft with 2 decimals in imperial. */
export function distanceValue(m: number, units: UnitSystem): number {
  return units === 'metric' ? m : m / 0.3048;
}

export function distanceUnit(units: UnitSystem): string {
  return units === 'metric' ? 'm' : 'ft';
}

export function distanceText(m: number, units: UnitSystem): string {
  return `${distanceValue(m, units).toFixed(2)} ${distanceUnit(units)}`;
}

/** A length in the display unit (m or in), as a number. */
export function fromSILength(m: number, units: UnitSystem): number {
  return units === 'metric' ? m : m / 0.0254;
}

export function lengthUnit(units: UnitSystem): string {
  return units === 'metric' ? 'm' : 'in';
}
