/**
 * The live tilt readout's arithmetic (src/app/panels/liveTiltMath.ts) and the input hints.
 * Device orientation per the W3C DeviceOrientation Event Specification: the device frame is
 * rotated from the earth frame by Z(alpha)·X'(beta)·Y''(gamma); gravity in device axes is checked
 * against that rotation built as matrices here, and the vehicle's roll and pitch against tilts
 * made by hand.
 */
import { describe, expect, it } from 'vitest';
import { gravityInDevice, readAxis, vehicleAxes, vehicleTilt, type Vec3 } from '../../src/app/panels/liveTiltMath';
import { inputKindOf, sceneHint } from '../../src/store/inputKind';

const DEG = Math.PI / 180;

function rotZ(a: number) { const c = Math.cos(a), s = Math.sin(a); return [[c, -s, 0], [s, c, 0], [0, 0, 1]]; }
function rotX(a: number) { const c = Math.cos(a), s = Math.sin(a); return [[1, 0, 0], [0, c, -s], [0, s, c]]; }
function rotY(a: number) { const c = Math.cos(a), s = Math.sin(a); return [[c, 0, s], [0, 1, 0], [-s, 0, c]]; }
function mul(A: number[][], B: number[][]) { return A.map((r) => [0, 1, 2].map((j) => r[0] * B[0][j] + r[1] * B[1][j] + r[2] * B[2][j])); }

describe('gravity in the device frame', () => {
  it.each([
    [0, 0, 0],
    [30, 20, 0],
    [200, -35, 15],
    [10, 60, -40],
    [0, 5, 80],
  ])('alpha %d, beta %d, gamma %d: Rᵀ·(0, 0, −1) with R = Rz·Rx·Ry (W3C)', (a, b, g) => {
    const R = mul(mul(rotZ(a * DEG), rotX(b * DEG)), rotY(g * DEG));
    const want = [0, 1, 2].map((i) => -R[2][i]);
    const got = gravityInDevice(b, g);
    for (let i = 0; i < 3; i++) expect(got[i]).toBeCloseTo(want[i], 12);
  });

  it('flat on a table: gravity into the back of the device; top edge raised: toward the bottom edge', () => {
    expect(gravityInDevice(0, 0)).toEqual([0, -0, -1]);
    expect(gravityInDevice(90, 0)[1]).toBeCloseTo(-1, 12);
  });
});

describe('vehicle roll and pitch from the zero and the mount', () => {
  it('flat, top edge forward: gamma + tilts the right side down, beta − the nose down', () => {
    const axes = vehicleAxes(gravityInDevice(0, 0), 'flat-top-forward')!;
    const r = vehicleTilt(gravityInDevice(0, 10), axes);
    expect(r.rollRad / DEG).toBeCloseTo(10, 9);
    expect(r.pitchRad / DEG).toBeCloseTo(0, 9);
    const p = vehicleTilt(gravityInDevice(-5, 0), axes);
    expect(p.pitchRad / DEG).toBeCloseTo(5, 9);
    expect(p.rollRad / DEG).toBeCloseTo(0, 9);
  });

  it('a zero taken off true level is taken out: the same tilt from a 3° mounting error reads the same', () => {
    // A vehicle rolled 12° left side down (gravity rotated about the forward axis), the device mounted 3° nose-up in its holder.
    const mountErr = rotX(3 * DEG); // device tilted about its x axis in the vehicle
    // Gravity on level ground in the tilted device's axes:
    const gLevel = mul(mountErr, [[0], [0], [-1]]).map((r) => r[0]) as unknown as Vec3;
    const axes = vehicleAxes(gLevel, 'flat-top-forward')!;
    // Rotate gravity by 12° about the vehicle's forward axis (left side down: gravity leans to the left).
    const l = axes.left, u = axes.up;
    const c = Math.cos(12 * DEG), s = Math.sin(12 * DEG);
    const g: Vec3 = [0, 1, 2].map((i) => -c * u[i] + s * l[i]) as unknown as Vec3;
    const t = vehicleTilt(g, axes);
    expect(t.rollRad / DEG).toBeCloseTo(-12, 9);
    expect(t.pitchRad / DEG).toBeCloseTo(0, 9);
  });

  it('upright facing the driver: tipping the top edge back reads as nose up (tail down)', () => {
    // Upright: beta 90° (top edge up, screen facing the driver). Zero there; then the vehicle's nose rises 8°: the device leans back, beta 98°.
    const axes = vehicleAxes(gravityInDevice(90, 0), 'upright-facing-driver')!;
    const t = vehicleTilt(gravityInDevice(98, 0), axes);
    expect(t.pitchRad / DEG).toBeCloseTo(-8, 9);
    expect(t.rollRad / DEG).toBeCloseTo(0, 9);
    // A mount whose forward axis is vertical cannot tell the front: refused.
    expect(vehicleAxes(gravityInDevice(90, 0), 'flat-top-forward')).toBeNull();
  });

  it('an axis against its limits: margins to the lift and the tip; past the operating line', () => {
    const right = { liftRad: 38 * DEG, tipRad: 40 * DEG, operatingRad: 15 * DEG };
    const left = { liftRad: 36 * DEG, tipRad: 39 * DEG, operatingRad: 15 * DEG };
    const r = readAxis(-20 * DEG, 'roll', right, left);
    expect(r.toward).toBe('left side down');
    expect(r.toLiftRad / DEG).toBeCloseTo(16, 12);
    expect(r.toTipRad / DEG).toBeCloseTo(19, 12);
    expect(r.pastOperating).toBe(true);
    expect(readAxis(10 * DEG, 'roll', right, left).pastOperating).toBe(false);
    expect(readAxis(10 * DEG, 'pitch', right, left).toward).toBe('nose down');
  });
});

describe('hints for the input in use', () => {
  it('mouse hints name the mouse gestures; touch and pen hints name none of them', () => {
    expect(sceneHint('mouse')).toMatch(/Shift \+ drag.*right-drag.*wheel/);
    for (const k of ['touch', 'pen'] as const) expect(sceneHint(k)).not.toMatch(/Shift|right-drag|wheel/);
    expect(sceneHint('touch')).toMatch(/finger/);
    expect(inputKindOf('touch')).toBe('touch');
    expect(inputKindOf('pen')).toBe('pen');
    expect(inputKindOf('mouse')).toBe('mouse');
  });
});
