/** Shared by the CLI commands: a scenario's model, pose and tilt, and display units. */
import { buildModel, type Scenario, type VehicleModel } from '../core/index';

const DEG = Math.PI / 180;

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

// 1 lbf = 4.4482216152605 N; 1 in = 0.0254 m (international yard and pound, 1959).
export function displayUnits(units: Scenario['units']): DisplayUnits {
  return units === 'imperial'
    ? { force: 'lbf', length: 'in', forceOf: (n) => n / 4.4482216152605, lengthOf: (m) => m / 0.0254 }
    : { force: 'N', length: 'm', forceOf: (n) => n, lengthOf: (m) => m };
}

/** --downhill value: degrees (0 nose down, 90 left side down, 180 tail down, 270 right side down) or a word. */
export function parseDownhill(v: string): number | null {
  const words: Record<string, number> = { front: 0, nose: 0, left: 90, rear: 180, tail: 180, right: 270 };
  const key = v.trim().toLowerCase();
  if (key in words) return words[key] * DEG;
  const n = Number(key);
  return Number.isFinite(n) && key !== '' ? n * DEG : null;
}

export const radToDegRounded = (rad: number, digits = 4): number => Number(((rad * 180) / Math.PI).toFixed(digits));
