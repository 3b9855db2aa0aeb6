/**
 * What the scene draws for a pose past the tip (src/view/tipState.ts) and the tip edge in words
 * (src/present/tipWords.ts). References: the rigid tilt-table bound tan θ = (T/2 + w/2 − y)/h
 * (the moment balance about the downhill contact line; SSF, NHTSA 2001, see REFERENCES "Rollover
 * of a rigid vehicle"; with the tyre half-width as in issue 10's rigid bound), and the plane's own
 * height z = tan(cross-slope)·y for where the drawn edge lies.
 */
import { describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { parseScenario, type Scenario } from '../../src/core';
import { createPlumbStore } from '../../src/store/store';
import { drawnResult, tipViewOf } from '../../src/view/tipState';
import { tipSentence, tipSideWords } from '../../src/present/tipWords';

const DEG = Math.PI / 180;

function scenario(tiltDeg: number): Scenario {
  const p = parseScenario({ ...demo, tilt: { ...demo.tilt, angle: tiltDeg } });
  if (!p.ok) throw new Error('the side-hill demo does not parse');
  return p.scenario;
}

describe('tipViewOf', () => {
  it('is null while the pose stands (the pose itself is drawn)', () => {
    const st = createPlumbStore(scenario(0)).getState();
    expect(st.result.standing).toBe(true);
    expect(tipViewOf(st)).toBeNull();
    expect(drawnResult(st)).toBe(st.result);
  });

  it('past the tip: a standing state at the tip, the downhill edge on the ground, the tip below the rigid bound', () => {
    const st = createPlumbStore(scenario(60)).getState();
    expect(st.result.standing).toBe(false);
    // The pose's own result carries no loads (nothing of it may be shown as real).
    for (const w of st.result.wheels) expect(w.loadN).toBeNull();
    const tv = tipViewOf(st);
    expect(tv).not.toBeNull();
    if (!tv) return;
    // Memoised on the result: every view reads the same object.
    expect(tipViewOf(st)).toBe(tv);
    expect(drawnResult(st)).toBe(tv.atTip);
    expect(tv.atTip.standing).toBe(true);
    expect(tv.tip.angleRad).toBeLessThan(60 * DEG);
    expect(tv.tip.angleRad).toBeGreaterThan(0);

    // Left side down: a vehicle goes over its downhill (left) contact line (the moment balance
    // of the rigid tilt table, REFERENCES "Rollover of a rigid vehicle").
    expect([...tv.tip.edge].sort()).toEqual(['FL', 'RL']);
    // The drawn edge runs along the left side (y > 0, left of the centre line in ISO 8855), about a
    // wheelbase long (3.1 m; the contacts sit within a tyre radius, 0.39 m, of the axle lines).
    for (const p of [tv.edgeFromM, tv.edgeToM]) {
      expect(p[1]).toBeGreaterThan(0.5);
      expect(p[1]).toBeLessThan(1.58 / 2 + 0.265);
      // On the ground: the demo plane descends to the left at 20° (crossSlope −20), z = −tan 20°·y;
      // the contact points lie within the tyre's deflection (a few cm) of it.
      expect(Math.abs(p[2] - -Math.tan(20 * DEG) * p[1])).toBeLessThan(0.03);
    }
    const len = Math.hypot(tv.edgeToM[0] - tv.edgeFromM[0], tv.edgeToM[1] - tv.edgeFromM[1]);
    expect(len).toBeGreaterThan(3.1 - 2 * 0.39);
    expect(len).toBeLessThan(3.1 + 2 * 0.39);

    // The ground's slope from level at the tip is below the same vehicle made rigid:
    // tan θ = (T/2 + w/2 − y)/h with the total CG (vehicle 2150 kg at 0.78 m, centred; driver 85 kg at
    // 0.95 m, 0.37 m left; gear 45 kg at 0.88 m, 0.20 m right). y toward the downhill side lowers it.
    const m = 2150 + 85 + 45;
    const h = (2150 * 0.78 + 85 * 0.95 + 45 * 0.88) / m;
    const y = (85 * 0.37 - 45 * 0.2) / m;
    const rigid = Math.atan((1.58 / 2 + 0.265 / 2 - y) / h);
    expect(tv.tip.fromLevelRad).toBeLessThan(rigid);
    // The demo ground is 20° from level at no table tilt, so the slope at the tip is 20° more than the table tilt
    // (on a plane the two datums differ by the plane's slope).
    expect(tv.tip.fromLevelRad - tv.tip.angleRad).toBeCloseTo(20 * DEG, 3);
  });
});

describe('tipViewOf as the table is raised further or turned', () => {
  it('reuses the tip while only the tilt grows past it; another downhill direction gives its own downhill edge', () => {
    const store = createPlumbStore(scenario(60));
    const a = tipViewOf(store.getState());
    expect(a).not.toBeNull();
    store.getState().setTilt({ angleRad: 65 * DEG });
    const b = tipViewOf(store.getState());
    // The same vehicle, ground, pose and direction: the same state at the tip, the pose 5° further past it.
    expect(b?.atTip).toBe(a?.atTip);
    expect(b!.poseTiltRad).toBeCloseTo(65 * DEG, 12);
    expect(b!.poseTiltRad - b!.tip.angleRad).toBeCloseTo(a!.poseTiltRad - a!.tip.angleRad + 5 * DEG, 12);
    // Right side down: it goes over its downhill (right) contact line (REFERENCES "Rollover of a rigid
    // vehicle"), and later than left side down, since the demo ground already falls 20° to the left.
    store.getState().setTilt({ angleRad: 75 * DEG, downhillRad: 270 * DEG });
    const c = tipViewOf(store.getState());
    expect(c).not.toBeNull();
    expect([...c!.tip.edge].sort()).toEqual(['FR', 'RR']);
    for (const p of [c!.edgeFromM, c!.edgeToM]) expect(p[1]).toBeLessThan(-0.5);
    expect(c!.tip.angleRad).toBeGreaterThan(a!.tip.angleRad + 20 * DEG);
    // On a plane the ground's slope from level at the tip is nearly the same either way: the two differ
    // only through the CG's 1 cm lateral offset (rigid: d/dy atan((T/2 + w/2 − y)/h) · 2y ≈ 2y·cos²θ/h
    // ≈ 0.9° at θ ≈ 39°, h = 0.79 m), so within 1.5°.
    expect(Math.abs(c!.tip.fromLevelRad - a!.tip.fromLevelRad)).toBeLessThan(1.5 * DEG);
  });
});

describe('tip edge in words', () => {
  it('names the side from the edge tyres (wheel order FL, FR, RL, RR)', () => {
    expect(tipSideWords(['FL', 'RL'])).toBe('the left side');
    expect(tipSideWords(['FR', 'RR'])).toBe('the right side');
    expect(tipSideWords(['FL', 'FR'])).toBe('the front');
    expect(tipSideWords(['RL', 'RR'])).toBe('the rear');
    expect(tipSideWords(['FL', 'RR'])).toBe('the FL–RR diagonal');
    expect(tipSideWords(['RL'])).toBe('the RL tyre alone');
  });

  it('states each angle with its datum, rounded to 0.1°, and how far past the tip the pose is', () => {
    const text = tipSentence({ edge: ['FL', 'RL'], downhillRad: 90 * DEG, tipTiltRad: 18.8321 * DEG, tipFromLevelRad: 38.8321 * DEG, poseTiltRad: 60 * DEG });
    expect(text).toBe(
      'Tips about the left side (FL–RL) at 18.8° table tilt from level (the ground under it then 38.8° from level), left side down; this pose, at 60.0° table tilt, is 41.2° past it.',
    );
    // On a level table the ground's slope is the table tilt: said once.
    expect(tipSentence({ edge: ['FR', 'RR'], downhillRad: 270 * DEG, tipTiltRad: 40.24 * DEG, tipFromLevelRad: 40.24 * DEG, poseTiltRad: 45 * DEG })).toBe(
      'Tips about the right side (FR–RR) at 40.2° table tilt from level, right side down; this pose, at 45.0° table tilt, is 4.8° past it.',
    );
  });
});
