/**
 * Scenario fields as the app's forms show them: in the scenario file's own units (what the user
 * types and what is saved), with enough digits that nothing visible is lost.
 */
import { fromSI, unitLabel, type QuantityKind } from '../core/scenario/units';
import type { UnitSystem } from './units';

/** Field display: the SI value in the file unit, to 7 significant figures, no trailing zeros. */
export function fieldValue(kind: QuantityKind, valueSI: number, units: UnitSystem): string {
  const v = fromSI(kind, valueSI, units);
  if (!Number.isFinite(v)) return '';
  return String(Number(v.toPrecision(7)));
}

export function fieldUnit(kind: QuantityKind, units: UnitSystem): string {
  return unitLabel(kind, units);
}
