/**
 * A vehicle's rigid tip angle over the tyre centre-line rectangle, with the total CG (payload
 * included): tan θ = reach(direction)/h, the reach to the first edge the plumb line meets (SSF = T/2h
 * sideways, NHTSA 2001; a/h and b/h fore-aft, Gillespie 1992 ch. 2). For the rose tests' allowance:
 * near the support's corners even a rigid vehicle's tip moves fast with the direction.
 */
import type { Vehicle } from '../../src/core/model/types';

export function rigidTipRad(v: Vehicle, downhillRad: number): number {
  let m = v.massKg;
  let ma = v.massKg * v.cg.behindFrontAxleM;
  let my = v.massKg * v.cg.leftOfCentreM;
  let mh = v.massKg * v.cg.heightM;
  for (const p of v.payload) {
    m += p.massKg;
    ma += p.massKg * p.behindFrontAxleM;
    my += p.massKg * p.leftOfCentreM;
    mh += p.massKg * p.heightM;
  }
  const a = ma / m;
  const b = v.wheelbaseM - a;
  const y = my / m;
  const T = 0.5 * (v.trackFrontM + v.trackRearM);
  const ux = Math.cos(downhillRad);
  const uy = Math.sin(downhillRad);
  let reach = Infinity;
  if (ux > 1e-12) reach = Math.min(reach, a / ux);
  if (ux < -1e-12) reach = Math.min(reach, b / -ux);
  if (uy > 1e-12) reach = Math.min(reach, (T / 2 - y) / uy);
  if (uy < -1e-12) reach = Math.min(reach, (T / 2 + y) / -uy);
  return Math.atan(reach / (mh / m));
}
