/**
 * The core↔three crossing (src/view/adapters.ts) and the colour scale. References: the core's own
 * gravity for a tilt (VehicleModel.setTilt), the solver state for the body height, the closed-form
 * normal of a plane, and the published viridis end colours.
 */
import { describe, expect, it } from 'vitest';
import * as THREE from 'three';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { GRAVITY_MPS2, TerrainField, buildModel, parseScenario, solveEquilibrium, type Scenario } from '../../src/core';
import { bodyMatrix, terrainBuffers, tiltQuaternion } from '../../src/view/adapters';
import { loadColourAt, loadColourRGB } from '../../src/present/palette';
import { warningsFor } from '../../src/present/words';
import { testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;

function demoScenario(): Scenario {
  const p = parseScenario(demo);
  if (!p.ok) throw new Error('demo');
  return p.scenario;
}

describe('tiltQuaternion', () => {
  it('turns the scene so that gravity in the terrain frame is what the core uses', () => {
    const s = demoScenario();
    const model = buildModel(s.vehicle, s.terrain);
    const q = new THREE.Quaternion();
    const g = new THREE.Vector3();
    for (const angle of [0, 5, 20, 37.5, 60]) {
      for (const down of [0, 90, 180, 270, 33]) {
        for (const heading of [0, 30, -120]) {
          model.setPose(0, 0, heading * DEG);
          model.setTilt(angle * DEG, down * DEG);
          tiltQuaternion({ angleRad: angle * DEG, downhillRad: down * DEG }, heading * DEG, q);
          // World gravity (0, 0, −g) seen in the turned frame: Rᵀ·g.
          g.set(0, 0, -GRAVITY_MPS2).applyQuaternion(q.clone().invert());
          expect(g.x).toBeCloseTo(model.gravity[0], 9);
          expect(g.y).toBeCloseTo(model.gravity[1], 9);
          expect(g.z).toBeCloseTo(model.gravity[2], 9);
        }
      }
    }
  });
});

describe('bodyMatrix', () => {
  it('places the reference point at the pose, at the height the solver holds, with the solved roll and pitch', () => {
    const s = demoScenario();
    const model = buildModel(s.vehicle, s.terrain);
    const pose = { xM: 1.5, yM: -0.4, headingRad: 25 * DEG };
    const r = solveEquilibrium(model, pose, { tilt: { angleRad: 8 * DEG, downhillRad: 90 * DEG } });
    expect(r.status).toBe('converged');
    const m = bodyMatrix(model, pose, r, new THREE.Matrix4());
    const o = new THREE.Vector3().setFromMatrixPosition(m);
    expect(o.x).toBeCloseTo(pose.xM, 9);
    expect(o.y).toBeCloseTo(pose.yM, 9);
    // state[0] is the reference point height (src/core/solver/model.ts, Q_Z).
    expect(o.z).toBeCloseTo(r.state[0], 9);
    // Body x axis: heading, then pitched nose-down by pitchRad: z component = −sin(pitch).
    const ex = new THREE.Vector3().setFromMatrixColumn(m, 0);
    expect(ex.z).toBeCloseTo(-Math.sin(r.body.pitchRad), 9);
    expect(Math.atan2(ex.y, ex.x)).toBeCloseTo(pose.headingRad, 9);
  });
});

describe('terrainBuffers', () => {
  it('samples heights from the terrain field and gives the plane its closed-form normal', () => {
    const terrain = { features: [{ type: 'plane' as const, gradeRad: 4 * DEG, crossSlopeRad: -20 * DEG, heightM: 0.3 }] };
    const b = terrainBuffers(terrain, { xMinM: -3, xMaxM: 3, yMinM: -2, yMaxM: 2 }, 0.25);
    const field = new TerrainField(terrain);
    const pos = b.geometry.getAttribute('position');
    const nor = b.geometry.getAttribute('normal');
    // Plane z = h + x tan g + y tan c: normal ∝ (−tan g, −tan c, 1).
    const n = new THREE.Vector3(-Math.tan(4 * DEG), -Math.tan(-20 * DEG), 1).normalize();
    expect(pos.count).toBe(25 * 17);
    for (let i = 0; i < pos.count; i += 7) {
      expect(pos.getZ(i)).toBeCloseTo(field.height(pos.getX(i), pos.getY(i)), 5);
      expect(nor.getX(i)).toBeCloseTo(n.x, 5);
      expect(nor.getY(i)).toBeCloseTo(n.y, 5);
      expect(nor.getZ(i)).toBeCloseTo(n.z, 5);
    }
    expect(b.grid.getAttribute('position').count).toBeGreaterThan(0);
  });

  it('shows a ledge: the mesh rises by the step height beyond it', () => {
    const terrain = { features: [{ type: 'step' as const, xM: 1, heightM: 0.3, yRangeM: null, edgeRadiusM: 0 }] };
    const b = terrainBuffers(terrain, { xMinM: -2, xMaxM: 3, yMinM: -1, yMaxM: 1 }, 0.1);
    expect(b.zMinM).toBeCloseTo(0, 9);
    expect(b.zMaxM).toBeCloseTo(0.3, 9);
  });
});

describe('viridis', () => {
  it('runs from #440154 to #fde725 (matplotlib viridis ends) with rising luminance', () => {
    expect(loadColourAt(0)).toBe('#440154');
    expect(loadColourAt(1)).toBe('#fde725');
    const lin = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
    // Relative luminance, WCAG 2.x / sRGB (IEC 61966-2-1): it must rise monotonically along the scale.
    let prev = -1;
    for (let t = 0; t <= 1.0001; t += 0.02) {
      const [r, g, b] = loadColourRGB(t, [0, 0, 0]);
      const y = 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
      expect(y).toBeGreaterThan(prev);
      prev = y;
    }
  });
});

describe('warnings in words', () => {
  it('names a lifted wheel and the tip on the demo tilted past the first lift', () => {
    const s = demoScenario();
    const model = buildModel(s.vehicle, s.terrain);
    const level = warningsFor(solveEquilibrium(model, s.pose, { tilt: s.tilt }), s.friction);
    expect(level.filter((w) => w.level === 'danger')).toEqual([]);
    let found = false;
    // The demo's three-wheel stances past the first lift are not stable (the solver reports them
    // unstable), so the lifted wheel is looked for on the plain test rig on a level tilt table.
    const rig = buildModel(testVehicle(), { features: [] });
    for (let a = 0; a < 50 && !found; a += 0.5) {
      const r = solveEquilibrium(rig, s.pose, { tilt: { angleRad: a * DEG, downhillRad: s.tilt.downhillRad } });
      const lifted = r.wheels.filter((w) => w.lifted);
      if (lifted.length > 0 && r.status === 'converged') {
        const w = warningsFor(r, s.friction);
        expect(w.some((x) => x.level === 'danger' && x.text.startsWith(`${lifted[0].name} has lifted`))).toBe(true);
        found = true;
      }
    }
    expect(found).toBe(true);
  });
});
