/**
 * One answer per scenario: the result is a function of the scenario alone, however it was reached.
 * Property-based (fast-check, seeded): random walks of edits as a user makes them in the app
 * (terrain presets, level ground, planes up to 30° of grade and cross-slope, moves, heading, tilt,
 * vehicle edits), each step solved as the app solves it (warm-started from the previous result when
 * the vehicle is the same) and compared with a fresh solve of the same scenario (no history):
 * the same status, the same lifted wheels, normal loads within 1e-6 of the weight (the residual bound
 * the solver promises). There must be no difference at all.
 *
 * The check is against the solver's own fresh answer, not an outside source: its definition (the
 * stable equilibrium from the reference start) is in src/core/solver/equilibrium.ts; whether that
 * answer is right is checked elsewhere (statics, cannon-es).
 */
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { describe, expect, it, vi } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import type { VehicleModel } from '../../../src/core/solver/model';
import type { SolveResult, TerrainFeature, Vehicle } from '../../../src/core/model/types';
import type { Scenario } from '../../../src/core/scenario/types';
import { parseScenario } from '../../../src/core/scenario/parse';
import { type PresetName, presetFeatures } from '../../../src/app/presets';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));

const DEG = Math.PI / 180;
const SEED = 20261202;
const WALKS = 100;
const STEPS_PER_WALK = 20;
/** Normal loads may differ by this share of the weight (the solver's residual bound, 1e-6·W). */
const LOAD_TOLERANCE_SHARE = 1e-6;
/** A coarser tyre (2 slices, springs every 5°) keeps 4,000 solves quick; the property does not depend on it. */
const TYRE = { tyre: { slices: 2, springSpacingRad: 5 * DEG, fanHalfAngleRad: 90 * DEG } };

const DEMOS = ['side-hill-stock', 'rock-diagonal-twist', 'ledge-crawler', 'expedition-roof-tent'];
const demos = new Map<string, Scenario>();
for (const name of DEMOS) {
  const parsed = parseScenario(JSON.parse(readFileSync(`assets/scenarios/${name}.json`, 'utf8')));
  if (!parsed.ok) throw new Error(`demo ${name} does not load`);
  demos.set(name, parsed.scenario);
}

type Edit =
  | { kind: 'preset'; name: PresetName }
  | { kind: 'level' }
  | { kind: 'plane'; gradeDeg: number; crossDeg: number }
  | { kind: 'move'; forwardM: number; leftM: number }
  | { kind: 'heading'; deg: number }
  | { kind: 'tilt'; angleDeg: number; downhillDeg: number }
  | { kind: 'untilt' }
  | { kind: 'vehicle'; cgHeightScale: number; trackDeltaM: number; payloadKg: number };

/** A value in [min, max] in steps of 0.1 (fast-check's doubles lean towards tiny values; edits in the app do not). */
const deg = (min: number, max: number) => fc.integer({ min: Math.round(min * 10), max: Math.round(max * 10) }).map((v) => v / 10);
const editArb: fc.Arbitrary<Edit> = fc.oneof(
  fc.record({ kind: fc.constant('preset' as const), name: fc.constantFrom<PresetName>('side-hill', 'ledge-up', 'ledge-down', 'rock', 'twist', 'ramp') }),
  fc.constant({ kind: 'level' as const }),
  fc.record({ kind: fc.constant('plane' as const), gradeDeg: deg(-30, 30), crossDeg: deg(-30, 30) }),
  fc.record({ kind: fc.constant('move' as const), forwardM: deg(-1, 1), leftM: deg(-1, 1) }),
  fc.record({ kind: fc.constant('heading' as const), deg: deg(0, 360) }),
  fc.record({ kind: fc.constant('tilt' as const), angleDeg: deg(0, 30), downhillDeg: deg(0, 360) }),
  fc.constant({ kind: 'untilt' as const }),
  fc.record({
    kind: fc.constant('vehicle' as const),
    cgHeightScale: fc.integer({ min: 85, max: 130 }).map((v) => v / 100),
    trackDeltaM: fc.integer({ min: -10, max: 10 }).map((v) => v / 100),
    payloadKg: deg(0, 300),
  }),
);

function apply(s: Scenario, e: Edit, base: Vehicle): Scenario {
  switch (e.kind) {
    case 'preset':
      return { ...s, terrain: { features: presetFeatures(e.name, s) } };
    case 'level':
      return { ...s, terrain: { features: [] } };
    case 'plane': {
      const f: TerrainFeature = { type: 'plane', gradeRad: e.gradeDeg * DEG, crossSlopeRad: e.crossDeg * DEG, heightM: 0 };
      return { ...s, terrain: { features: [f] } };
    }
    case 'move': {
      const c = Math.cos(s.pose.headingRad);
      const sn = Math.sin(s.pose.headingRad);
      return { ...s, pose: { ...s.pose, xM: s.pose.xM + c * e.forwardM - sn * e.leftM, yM: s.pose.yM + sn * e.forwardM + c * e.leftM } };
    }
    case 'heading':
      return { ...s, pose: { ...s.pose, headingRad: e.deg * DEG } };
    case 'tilt':
      return { ...s, tilt: { angleRad: e.angleDeg * DEG, downhillRad: e.downhillDeg * DEG } };
    case 'untilt':
      return { ...s, tilt: { ...s.tilt, angleRad: 0 } };
    case 'vehicle': {
      const v: Vehicle = {
        ...base,
        cg: { ...base.cg, heightM: base.cg.heightM * e.cgHeightScale },
        trackFrontM: base.trackFrontM + e.trackDeltaM,
        trackRearM: base.trackRearM + e.trackDeltaM,
        payload: e.payloadKg > 1 ? [{ label: 'load', massKg: e.payloadKg, behindFrontAxleM: base.wheelbaseM / 2, leftOfCentreM: 0, heightM: base.cg.heightM + 0.3 }] : [],
      };
      return { ...s, vehicle: v };
    }
  }
}

/** What must match: status, lifted wheels, normal loads (within the tolerance). Returns the first difference. */
function difference(a: SolveResult, b: SolveResult): string | null {
  if (a.status !== b.status) return `status ${a.status} (warm) vs ${b.status} (fresh)`;
  for (let i = 0; i < 4; i++) {
    const wa = a.wheels[i];
    const wb = b.wheels[i];
    if (wa.lifted !== wb.lifted) return `${wa.name} lifted ${wa.lifted} (warm) vs ${wb.lifted} (fresh)`;
    const la = wa.loadN ?? 0;
    const lb = wb.loadN ?? 0;
    if (Math.abs(la - lb) > LOAD_TOLERANCE_SHARE * a.weightN) return `${wa.name} load ${la.toFixed(1)} N (warm) vs ${lb.toFixed(1)} N (fresh)`;
  }
  return null;
}

describe('history independence (property-based, seeded)', () => {
  it(`${WALKS} walks × ${STEPS_PER_WALK} edits: every warm answer equals the fresh solve of the same scenario`, () => {
    let steps = 0;
    let warmSolves = 0;
    const diffs: string[] = [];
    const statuses: Record<string, number> = {};
    fc.assert(
      fc.property(fc.constantFrom(...DEMOS), fc.array(editArb, { minLength: STEPS_PER_WALK, maxLength: STEPS_PER_WALK }), (demo, edits) => {
        let s = demos.get(demo)!;
        const base = s.vehicle;
        let app: VehicleModel = buildModel(s.vehicle, s.terrain, TYRE);
        let fresh: VehicleModel = buildModel(s.vehicle, s.terrain, TYRE);
        let prev = solveEquilibrium(app, s.pose, { tilt: s.tilt, friction: s.friction });
        for (const e of edits) {
          const next = apply(s, e, base);
          const sameVehicle = next.vehicle === s.vehicle;
          if (!sameVehicle) {
            app = buildModel(next.vehicle, next.terrain, TYRE);
            fresh = buildModel(next.vehicle, next.terrain, TYRE);
          } else if (next.terrain !== s.terrain) {
            app.setTerrain(next.terrain);
            fresh.setTerrain(next.terrain);
          }
          // As the app does: warm from the previous state when the vehicle is the same.
          const warm = sameVehicle ? prev.state : null;
          if (warm) warmSolves++;
          const got = solveEquilibrium(app, next.pose, { tilt: next.tilt, friction: next.friction, warmStart: warm });
          const ref = solveEquilibrium(fresh, next.pose, { tilt: next.tilt, friction: next.friction });
          steps++;
          statuses[ref.status] = (statuses[ref.status] ?? 0) + 1;
          const d = difference(got, ref);
          if (d) diffs.push(`${demo} after ${e.kind} ${JSON.stringify(e)}: ${d}; tilt ${(next.tilt.angleRad / DEG).toFixed(1)}° heading ${(next.pose.headingRad / DEG).toFixed(1)}° terrain ${JSON.stringify(next.terrain.features.map((f) => f.type))}`);
          if (d && process.env.PLUMB_HISTORY_DEBUG) console.log(JSON.stringify({ pose: next.pose, tilt: next.tilt, terrain: next.terrain, vehicle: next.vehicle === base ? demo : next.vehicle }));
          s = next;
          prev = got;
        }
      }),
      { numRuns: WALKS, seed: SEED },
    );
    console.log(`history walks: ${steps} steps (${warmSolves} warm-started), statuses ${JSON.stringify(statuses)}, differences ${diffs.length}`);
    for (const d of diffs.slice(0, 10)) console.log(`  ${d}`);
    expect(steps).toBeGreaterThanOrEqual(2000);
    expect(diffs).toEqual([]);
  }, 600_000);
});
