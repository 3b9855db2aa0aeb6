/**
 * Filled ground in every analysis: the rule (a height that takes a share from a filled node) checked
 * against the terrain field itself, then pass, rose, heading sweep and line sweep on an invented flat
 * grid with a filled patch under the front-left tyre's path.
 */
import { describe, expect, it } from 'vitest';
import {
  FilledGround,
  TerrainField,
  WHEEL_NAMES,
  buildModel,
  filledGroundSpans,
  footprintRadiusM,
  groundPlaneAt,
  makeLines,
  runHeadingJob,
  runLineSweepJob,
  runPass,
  stabilityRose,
  type PathSpec,
  type WheelName,
} from '../../../src/core/index';
import { onFilledGround } from '../../../src/core/ground/index';
import { testVehicle } from '../../helpers/vehicles';
import { GRID, filledGrid, patchOf, patchReach } from '../../helpers/filledGrid';

const vehicle = testVehicle();
const L = vehicle.wheelbaseM; // 2.8 m
const T = vehicle.trackFrontM; // 1.6 m, front and rear

/** A small deterministic generator (tests only: the core never draws random numbers). */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (1664525 * s + 1013904223) >>> 0) / 2 ** 32);
}

describe('the rule: a height that takes a share from a filled node', () => {
  it('agrees with the terrain field: the height at a point moves with the filled nodes exactly where the rule says', () => {
    // Independent of the rule's code: raise every filled node by 1 m and see where the field's height
    // changes. Bilinear interpolation (Numerical Recipes §3.6, eq. 3.6.5) weighs a node in over the four
    // cells around it, and the field holds the edge values outside the grid; a change of the height is
    // the definition of "rests on a filled node". Points on nodes, on cell edges, inside cells and
    // outside the grid are all tried.
    const patch = patchOf(1.0, 1.5, 0.5, 1.0);
    const edgePatch = patchOf(9.5, 10, -3, -2.5); // at the grid's corner: held outside it
    const flat = filledGrid(patch);
    const mask = flat.filledMask!;
    for (let r = edgePatch.r0; r <= edgePatch.r1; r++) for (let c = edgePatch.c0; c <= edgePatch.c1; c++) mask[r * GRID.cols + c] = 1;
    const raised = new Float64Array(GRID.cols * GRID.rows);
    for (let k = 0; k < raised.length; k++) raised[k] = mask[k] ? 1 : 0;
    const base = new TerrainField({ features: [flat] });
    const moved = new TerrainField({ features: [{ ...flat, heightsM: raised }] });
    const fg = FilledGround.of({ features: [flat] })!;
    const rnd = lcg(7);
    const pts: [number, number][] = [];
    for (let i = 0; i < 4000; i++) pts.push([0.5 + 1.5 * rnd(), 0 + 1.5 * rnd()]); // around the patch
    for (let i = 0; i < 1000; i++) pts.push([9 + 2 * rnd(), -3.6 + 1.4 * rnd()]); // around the corner, partly outside
    for (let c = 5; c <= 20; c++) for (let r = 30; r <= 45; r++) pts.push([GRID.x0 + c * 0.1 + 0.0, GRID.y0 + r * 0.1]); // on nodes
    for (let c = 5; c <= 20; c++) pts.push([GRID.x0 + c * 0.1, 0.77]); // on cell edges
    let on = 0;
    for (const [x, y] of pts) {
      const expected = moved.height(x, y) !== base.height(x, y);
      if (fg.at(x, y) !== expected) throw new Error(`at (${x}, ${y}): rule says ${fg.at(x, y)}, the field's height ${expected ? 'moves' : 'does not move'}`);
      if (expected) on++;
    }
    // Both answers occur often (a check that cannot fail one way is no check).
    expect(on).toBeGreaterThan(500);
    expect(pts.length - on).toBeGreaterThan(500);
  });

  it('a grid with no mask, or a terrain with no grid, has no filled ground; pose uses the same rule', () => {
    expect(FilledGround.of({ features: [filledGrid(null)] })).toBeNull();
    expect(FilledGround.of({ features: [{ type: 'rock', xM: 0, yM: 0, heightM: 0.2, radiusM: 0.5 }] })).toBeNull();
    const g = filledGrid(patchOf(1.0, 1.5, 0.5, 1.0));
    // 1.55 m is inside the cell next to the last filled column (1.5 m): the nearest node (1.6 m) is
    // measured, but the height there takes 50 % from the filled node at 1.5 m.
    expect(onFilledGround(g, [[1.55, 0.75]])).toBe(true);
    expect(onFilledGround(g, [[1.65, 0.75]])).toBe(false);
  });

  it('spans per wheel from per-station bits: start and end stations, distances, ordered by start', () => {
    // FL (bit 0) on stations 2–3, RR (bit 3) on 1 and again on 4 (to the last station).
    const bits = [0, 8, 1, 1, 8];
    const d = [0, 0.5, 1, 1.5, 2];
    expect(filledGroundSpans(bits, d)).toEqual([
      { wheel: 'RR', startStation: 1, startDistanceM: 0.5, endStation: 1, endDistanceM: 0.5 },
      { wheel: 'FL', startStation: 2, startDistanceM: 1, endStation: 3, endDistanceM: 1.5 },
      { wheel: 'RR', startStation: 4, startDistanceM: 2, endStation: 4, endDistanceM: 2 },
    ]);
  });
});

describe('pass over a filled patch under the left wheels', () => {
  // Filled nodes from x 2.0 to 3.0 m along the left track (y 0.6 to 1.0 m, the track at 0.8 m).
  const patch = patchOf(2.0, 3.0, 0.6, 1.0);
  const reach = patchReach(patch); // x in (1.9, 3.1), y in (0.5, 1.1)
  const path: PathSpec = { fromM: [-3.05, 0], toM: [5.05, 0], stepM: 0.1, headingRad: 0 };

  it('FL and RL stand on filled ground exactly where their contacts cross the patch; FR and RR never', () => {
    const model = buildModel(vehicle, { features: [filledGrid(patch)] });
    const r = runPass(model, path);
    expect(r.tip).toBeNull();
    // Where each tyre stands (derived, not read from the result): on level flat ground with the
    // heading along +x, the contact lies under the hub, L/2 ahead of or behind the reference point
    // (midway between the axles) and T/2 to the side. The path starts 0.05 m off the station grid,
    // so no contact lands within 5 cm of the patch's reach: the compliance shifts it by millimetres.
    const ahead: Record<WheelName, [number, number]> = { FL: [L / 2, T / 2], FR: [L / 2, -T / 2], RL: [-L / 2, T / 2], RR: [-L / 2, -T / 2] };
    const expected = WHEEL_NAMES.flatMap((w) => {
      const on = r.stations.filter((st) => {
        const x = st.pose.xM + ahead[w][0];
        const y = st.pose.yM + ahead[w][1];
        return x > reach.x[0] && x < reach.x[1] && y > reach.y[0] && y < reach.y[1];
      });
      return on.length ? [{ wheel: w, startStation: on[0].index, endStation: on[on.length - 1].index }] : [];
    });
    const got = (r.filledGround ?? []).map((s) => ({ wheel: s.wheel, startStation: s.startStation, endStation: s.endStation }));
    expect(got).toEqual(expected.sort((a, b) => a.startStation - b.startStation));
    expect(got.map((s) => s.wheel)).toEqual(['FL', 'RL']);
    // FL from x 1.9 to 3.1 m: pose x from 0.5 to 1.7 m, i.e. 3.55 to 4.75 m along the path: stations 36–47.
    const fl = r.filledGround!.find((s) => s.wheel === 'FL')!;
    expect([fl.startStation, fl.endStation]).toEqual([36, 47]);
    expect(fl.startDistanceM).toBeCloseTo(3.6, 9);
    expect(fl.endDistanceM).toBeCloseTo(4.7, 9);
    // RL crosses the same patch one wheelbase (28 stations of 0.1 m) later.
    const rl = r.filledGround!.find((s) => s.wheel === 'RL')!;
    expect([rl.startStation - fl.startStation, rl.endStation - fl.endStation]).toEqual([28, 28]);
    // Per station, the same wheels.
    for (const st of r.stations) {
      const inFl = st.index >= fl.startStation && st.index <= fl.endStation;
      const inRl = st.index >= rl.startStation && st.index <= rl.endStation;
      expect(st.filledWheels).toEqual([...(inFl ? ['FL'] : []), ...(inRl ? ['RL'] : [])]);
    }
  });

  it('the mask changes what is said, not the loads: the same pass without it has no spans and equal loads', () => {
    const withMask = runPass(buildModel(vehicle, { features: [filledGrid(patch)] }), path);
    const without = runPass(buildModel(vehicle, { features: [filledGrid(null)] }), path);
    expect(without.filledGround).toEqual([]);
    expect(without.stations.every((s) => s.filledWheels!.length === 0)).toBe(true);
    expect(withMask.stations.map((s) => s.wheels.map((w) => w.loadN))).toEqual(without.stations.map((s) => s.wheels.map((w) => w.loadN)));
  });

  it('line sweep: the line over the patch is flagged, the line shifted one track to the right is not', () => {
    // Offset −T: the left wheels run at y = 0.8 − 1.6 = −0.8 m, the right ones at −2.4 m: off the patch.
    const lines = makeLines(path, { from: -T, to: 0, step: T }, { from: 0, to: 0, step: 1 });
    expect(lines.map((l) => l.offsetM)).toEqual([-T, 0]);
    const out = runLineSweepJob({ vehicle, terrain: { features: [filledGrid(patch)] }, options: {}, lines });
    expect(out.map((l) => l.onFilledGround)).toEqual([false, true]);
  }, 60_000);
});

describe('one spot: rose and heading sweep', () => {
  // A patch around the front-left contact of the vehicle standing at the origin, heading 0 (1.4, 0.8).
  const patch = patchOf(1.2, 1.6, 0.6, 1.0);
  const reach = patchReach(patch);
  const terrain = { features: [filledGrid(patch)] };

  it('rose: FL stands on filled ground at the spot; without the mask, no note and the same angles', () => {
    const model = buildModel(vehicle, terrain);
    const pose = { xM: 0, yM: 0, headingRad: 0 };
    const r = stabilityRose(model, pose, { stepRad: Math.PI / 2 });
    expect(r.filledWheels).toEqual(['FL']);
    const plain = stabilityRose(buildModel(vehicle, { features: [filledGrid(null)] }), pose, { stepRad: Math.PI / 2 });
    expect(plain.filledWheels).toEqual([]);
    expect(r.directions.map((d) => d.tip?.angleRad)).toEqual(plain.directions.map((d) => d.tip?.angleRad));
  }, 60_000);

  it('heading sweep: at each heading the wheel whose contact turns onto the patch, none at the others', () => {
    const ground = groundPlaneAt(new TerrainField(terrain), 0, 0, footprintRadiusM(vehicle));
    const headingsRad = [0, Math.PI / 2, Math.PI, (3 * Math.PI) / 2];
    const out = runHeadingJob({ vehicle, terrain, xM: 0, yM: 0, ground, headingsRad });
    // Expected: each hub's ground point (±L/2, ±T/2) in the body frame, turned by the heading
    // (x' = x cos ψ − y sin ψ, y' = x sin ψ + y cos ψ), tested against the patch's reach.
    const body: Record<WheelName, [number, number]> = { FL: [L / 2, T / 2], FR: [L / 2, -T / 2], RL: [-L / 2, T / 2], RR: [-L / 2, -T / 2] };
    const expected = headingsRad.map((psi) =>
      WHEEL_NAMES.filter((w) => {
        const [bx, by] = body[w];
        const x = bx * Math.cos(psi) - by * Math.sin(psi);
        const y = bx * Math.sin(psi) + by * Math.cos(psi);
        return x > reach.x[0] && x < reach.x[1] && y > reach.y[0] && y < reach.y[1];
      }),
    );
    expect(expected).toEqual([['FL'], [], ['RR'], []]);
    expect(out.map((h) => h.filledWheels)).toEqual(expected);
  }, 60_000);
});
