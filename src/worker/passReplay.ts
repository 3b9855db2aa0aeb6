/**
 * An obstacle pass together with the full solve at every station, for drawing the vehicle there:
 * runPass keeps a summary per station and hands each station's solve to onStation.
 * Pure: plain core calls, usable in a worker or in Node.
 */
import { runPass, type PassOptions, type PassResult, type PathSpec, type SolveResult, type VehicleModel } from '../core';

export function runPassWithSolves(
  model: VehicleModel,
  path: PathSpec,
  opts: PassOptions,
): { readonly result: PassResult; readonly solved: SolveResult[] } {
  const solved: SolveResult[] = [];
  const result = runPass(model, path, { ...opts, onStation: (_station, r) => solved.push(r) });
  return { result, solved };
}
