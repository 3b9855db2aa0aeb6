/** Shared by the CLI commands: a scenario's model, pose and tilt, and display units. */
import { buildModel, type Scenario, type VehicleModel } from '../core/index';
import { DEG_PER_RAD, RAD_PER_DEG as DEG, toDisplay, unitSymbol } from '../present/units';

export function modelOf(s: Scenario): VehicleModel {
  return buildModel(s.vehicle, s.terrain);
}

/** Display units for human output (the JSON output is always SI with degrees for angles). */
export interface DisplayUnits {
  readonly force: string;
  readonly length: string;
  /** N → display force. */
  readonly forceOf: (n: number) => number;
  /** m → display length. */
  readonly lengthOf: (m: number) => number;
}

/** The force and length units of src/present for one unit system (kN or lbf; m or in). */
export function displayUnits(units: Scenario['units']): DisplayUnits {
  return {
    force: unitSymbol('force', units),
    length: unitSymbol('length', units),
    forceOf: (n) => toDisplay('force', n, units),
    lengthOf: (m) => toDisplay('length', m, units),
  };
}

/** --downhill value: degrees (0 nose down, 90 left side down, 180 tail down, 270 right side down) or a word. */
export function parseDownhill(v: string): number | null {
  const words: Record<string, number> = { front: 0, nose: 0, left: 90, rear: 180, tail: 180, right: 270 };
  const key = v.trim().toLowerCase();
  if (key in words) return words[key] * DEG;
  const n = Number(key);
  return Number.isFinite(n) && key !== '' ? n * DEG : null;
}

export const radToDegRounded = (rad: number, digits = 4): number => Number((rad * DEG_PER_RAD).toFixed(digits));
