/**
 * The full solve at every station of a pass, for drawing the vehicle there. runPass keeps a
 * summary per station only; this re-runs the same sequence of solves (each station warm-started
 * from the last accepted one, the same retries with 4× the iteration cap, warm then cold), so the
 * result at each station is the one the pass found (the test compares the loads bit for bit).
 * Pure: plain core calls, usable in a worker or in Node.
 */
import { DEFAULT_MAX_ITERATIONS, solveEquilibrium, type PassResult, type SolveResult, type Tilt, type VehicleModel } from '../core';

/** The same factor runPass retries with (src/core/analysis/pass.ts, RETRY_ITERATION_FACTOR). */
const RETRY_ITERATION_FACTOR = 4;

const standing = (r: SolveResult): boolean => r.status === 'converged' && r.margins.forceAngleRad >= 0;

export function solvePassStations(
  model: VehicleModel,
  pass: PassResult,
  opts: { readonly friction: number; readonly tilt?: Tilt },
  onProgress?: (done: number, total: number) => void,
): SolveResult[] {
  const out: SolveResult[] = [];
  let warm: Float64Array | null = null;
  const retry = RETRY_ITERATION_FACTOR * DEFAULT_MAX_ITERATIONS;
  const n = pass.stations.length;
  for (let i = 0; i < n; i++) {
    const pose = pass.stations[i].pose;
    let r = solveEquilibrium(model, pose, { tilt: opts.tilt, friction: opts.friction, warmStart: warm });
    if (!standing(r)) {
      for (let attempt = 0; attempt < 2 && !standing(r); attempt++) {
        if (attempt === 0 && warm === null) continue;
        const again = solveEquilibrium(model, pose, { tilt: opts.tilt, friction: opts.friction, maxIterations: retry, warmStart: attempt === 0 ? warm : null });
        if (standing(again)) r = again;
      }
    }
    out.push(r);
    warm = r.state;
    onProgress?.(i + 1, n);
  }
  return out;
}
