/**
 * Orthographic line drawings of the vehicle at a solved pose, as SVG: a side view (seen from the
 * vehicle's right, nose to the right) and a rear view (seen from behind, the vehicle's left on the
 * left). Drawn from the solved state: the body outline (BodyShape, a box with a flat belly and
 * the overhangs at their bumper heights, at the centre plane) carried by the body pose, the wheels
 * at their solved centres, the CG, the plumb line from the CG along gravity, and the ground under
 * the wheel tracks sampled from the terrain. The drawing is in the terrain frame: on a tilt table
 * the ground is drawn level and the plumb line leans.
 */
import type { Pose, SolveResult, Vehicle } from '../core/model/types';
import type { TerrainField } from '../core/terrain/field';
import { bodyToTerrain } from '../core/solver/frame';
import { esc } from '../present/text';
import { M_PER_FT, fixed, type UnitSystem } from '../present/units';

type V3 = readonly [number, number, number];

/** Body point → terrain frame, with the solved body frame (src/core/solver/frame.ts). */
function bodyToWorld(r: SolveResult, _pose: Pose): (p: V3) => V3 {
  return ([x, y, z]) => bodyToTerrain(r.body.frame, x, y, z) as [number, number, number];
}

interface View {
  /** World point → drawing coordinates (u to the right, v up), metres. */
  readonly project: (p: V3) => [number, number];
  readonly title: string;
}

function makeViews(pose: Pose): { side: View; rear: View } {
  const hx = Math.cos(pose.headingRad), hy = Math.sin(pose.headingRad);
  // Left of the vehicle in plan.
  const lx = -hy, ly = hx;
  return {
    // From the right: forward is to the right.
    side: { title: 'Side view (from the right)', project: (p) => [(p[0] - pose.xM) * hx + (p[1] - pose.yM) * hy, p[2]] },
    // From behind: the vehicle's left is on the left, so u = −(lateral offset to the left).
    rear: { title: 'Rear view (from behind)', project: (p) => [-((p[0] - pose.xM) * lx + (p[1] - pose.yM) * ly), p[2]] },
  };
}

/** One shape of a panel, in drawing coordinates (m). */
interface DrawItem {
  readonly kind: 'polyline' | 'polygon' | 'circle';
  readonly pts?: [number, number][];
  readonly c?: [number, number];
  readonly r?: number;
  readonly cls: string;
  readonly label?: string;
}

export interface VehicleDrawingInput {
  readonly vehicle: Vehicle;
  readonly field: TerrainField;
  readonly pose: Pose;
  readonly result: SolveResult;
  /** Caption under the drawings. */
  readonly caption: string;
  /** Units of the scale bar: 1 m, or 3 ft in imperial. @default 'metric' */
  readonly units?: UnitSystem;
}

/** Side and rear drawings side by side, as one <svg>. */
export function vehicleDrawing(d: VehicleDrawingInput): string {
  const { vehicle: v, field, pose, result: r } = d;
  const toW = bodyToWorld(r, pose);
  const views = makeViews(pose);
  const L = v.wheelbaseM;
  const b = v.body;
  const xf = L / 2 + b.frontOverhangM;
  const xr = -L / 2 - b.rearOverhangM;
  // Side outline at the centre plane (body frame x, z).
  const sideBody: V3[] = ([
    [xr, 0, b.rearBumperClearanceM], [xr, 0, b.roofHeightM], [xf, 0, b.roofHeightM], [xf, 0, b.frontBumperClearanceM],
    [L / 2, 0, b.frontBumperClearanceM], [L / 2, 0, b.bellyClearanceM], [-L / 2, 0, b.bellyClearanceM], [-L / 2, 0, b.rearBumperClearanceM],
  ] as const).map(toW);
  // Rear outline: the body section midway between the axles.
  const hw = b.widthM / 2;
  const rearBody: V3[] = ([[0, hw, b.bellyClearanceM], [0, hw, b.roofHeightM], [0, -hw, b.roofHeightM], [0, -hw, b.bellyClearanceM]] as const).map(toW);

  // Ground: along each wheel track (side view) and across each axle (rear view), in plan.
  const hx = Math.cos(pose.headingRad), hy = Math.sin(pose.headingRad);
  const lx = -hy, ly = hx;
  const N = 120;
  const groundLine = (ax: number, ay: number, dx: number, dy: number, from: number, to: number): V3[] => {
    const out: V3[] = [];
    for (let i = 0; i <= N; i++) {
      const s = from + ((to - from) * i) / N;
      const x = ax + dx * s, y = ay + dy * s;
      out.push([x, y, field.height(x, y)]);
    }
    return out;
  };
  const reach = Math.max(xf, -xr) + 0.6;
  const tyreFront = v.tyreFront, tyreRear = v.tyreRear;
  const wl = r.wheels;
  const mid = (a: V3, c: V3): V3 => [(a[0] + c[0]) / 2, (a[1] + c[1]) / 2, (a[2] + c[2]) / 2];
  // Side: under the left and the right wheels (lines through the contact points, along the heading).
  const leftTrack = mid(wl[0].contactPointWorld, wl[2].contactPointWorld);
  const rightTrack = mid(wl[1].contactPointWorld, wl[3].contactPointWorld);
  const groundSideL = groundLine(leftTrack[0], leftTrack[1], hx, hy, -reach, reach);
  const groundSideR = groundLine(rightTrack[0], rightTrack[1], hx, hy, -reach, reach);
  const across = Math.max(hw, v.trackFrontM / 2, v.trackRearM / 2) + 0.6;
  const frontAxle = mid(wl[0].contactPointWorld, wl[1].contactPointWorld);
  const rearAxle = mid(wl[2].contactPointWorld, wl[3].contactPointWorld);
  const groundRearF = groundLine(frontAxle[0], frontAxle[1], lx, ly, -across, across);
  const groundRearR = groundLine(rearAxle[0], rearAxle[1], lx, ly, -across, across);

  const cg = r.body.cgWorld;
  const g = r.gravityDirWorld;
  const plumb = r.body.plumbPointWorld;
  // The plumb line runs from the CG along gravity to below the support plane.
  const plumbLen = Math.max(0.3, Math.hypot(cg[0] - plumb[0], cg[1] - plumb[1], cg[2] - plumb[2]) + 0.15);
  const plumbEnd: V3 = [cg[0] + g[0] * plumbLen, cg[1] + g[1] * plumbLen, cg[2] + g[2] * plumbLen];

  const panel = (view: View, which: 'side' | 'rear'): { items: DrawItem[]; bounds: [number, number, number, number] } => {
    const P = view.project;
    let u0 = Infinity, u1 = -Infinity, v0 = Infinity, v1 = -Infinity;
    const grow = (p: [number, number], r0 = 0) => {
      u0 = Math.min(u0, p[0] - r0); u1 = Math.max(u1, p[0] + r0);
      v0 = Math.min(v0, p[1] - r0); v1 = Math.max(v1, p[1] + r0);
    };
    const items: DrawItem[] = [];
    const poly = (pts: readonly V3[], cls: string, kind: 'polyline' | 'polygon' = 'polyline') => {
      const q = pts.map(P);
      q.forEach((p) => grow(p));
      items.push({ kind, pts: q, cls });
    };
    if (which === 'side') {
      poly(groundSideR, 'gnd');
      poly(groundSideL, 'gnd2');
      poly(sideBody, 'body', 'polygon');
      // Far-side (left) wheels first, dashed; near-side (right) wheels solid.
      for (const i of [0, 2, 1, 3]) {
        const w = wl[i];
        const rad = i < 2 ? tyreFront.radiusM : tyreRear.radiusM;
        const c = P(w.centreWorld);
        grow(c, rad);
        items.push({ kind: 'circle', c, r: rad, cls: i % 2 === 0 ? 'whl2' : 'whl', label: w.name });
      }
    } else {
      poly(groundRearR, 'gnd');
      poly(groundRearF, 'gnd2');
      poly(rearBody, 'body', 'polygon');
      for (const i of [0, 1, 2, 3]) {
        const w = wl[i];
        const t = i < 2 ? tyreFront : tyreRear;
        // The tyre from behind: a rectangle width × diameter about its axis.
        const a = w.axisWorld;
        const cW = w.centreWorld;
        const up = [0, 0, 1] as const;
        // Radial direction in the wheel plane closest to up: up minus its part along the axis.
        const k = up[0] * a[0] + up[1] * a[1] + up[2] * a[2];
        let ux = up[0] - k * a[0], uy = up[1] - k * a[1], uz = up[2] - k * a[2];
        const n = Math.hypot(ux, uy, uz) || 1;
        ux /= n; uy /= n; uz /= n;
        const hwT = t.widthM / 2, rT = t.radiusM;
        const corner = (sa: number, sr: number): V3 => [
          cW[0] + sa * hwT * a[0] + sr * rT * ux,
          cW[1] + sa * hwT * a[1] + sr * rT * uy,
          cW[2] + sa * hwT * a[2] + sr * rT * uz,
        ];
        poly([corner(1, 1), corner(-1, 1), corner(-1, -1), corner(1, -1)], i < 2 ? 'whl' : 'whl2', 'polygon');
      }
    }
    poly([cg, plumbEnd], 'plumb', 'polyline');
    const cgp = P(cg);
    items.push({ kind: 'circle', c: cgp, r: 0.035, cls: 'cg', label: 'CG' });
    return { bounds: [u0, u1, v0, v1], items };
  };

  // Lay out the two panels at one scale.
  const sideP = panel(views.side, 'side');
  const rearP = panel(views.rear, 'rear');
  const panelW = 330, panelH = 230, gap = 20, top = 22;
  const spanU = Math.max(sideP.bounds[1] - sideP.bounds[0], rearP.bounds[1] - rearP.bounds[0]);
  const spanV = Math.max(sideP.bounds[3] - sideP.bounds[2], rearP.bounds[3] - rearP.bounds[2]);
  const scale = Math.min(panelW / spanU, (panelH - 10) / spanV);
  const out: string[] = [];
  const W = 2 * panelW + gap;
  const H = panelH + top + 40;
  out.push(`<svg class="chart drawing" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="Vehicle drawing">`);
  const render = (p: ReturnType<typeof panel>, ox: number, title: string) => {
    const [u0, u1, v0, v1] = p.bounds;
    const cx = ox + panelW / 2 - ((u0 + u1) / 2) * scale;
    const cy = top + panelH / 2 + ((v0 + v1) / 2) * scale;
    const X = (u: number) => fixed(cx + u * scale, 1);
    const Y = (vv: number) => fixed(cy - vv * scale, 1);
    out.push(`<text x="${ox}" y="14" class="ct">${esc(title)}</text>`);
    out.push(`<rect x="${ox}" y="${top}" width="${panelW}" height="${panelH}" fill="none" stroke="#ccc" stroke-width="0.6"/>`);
    const items = p.items;
    const style: Record<string, string> = {
      gnd: 'fill="none" stroke="#5a4630" stroke-width="1.6"',
      gnd2: 'fill="none" stroke="#5a4630" stroke-width="0.9" stroke-dasharray="5 3"',
      body: 'fill="#f3f3f3" fill-opacity="0.6" stroke="#000" stroke-width="1.2"',
      whl: 'fill="#fff" fill-opacity="0.7" stroke="#000" stroke-width="1.4"',
      whl2: 'fill="none" stroke="#555" stroke-width="0.9" stroke-dasharray="4 2"',
      plumb: 'fill="none" stroke="#b00020" stroke-width="1.1" stroke-dasharray="5 2 1 2"',
      cg: 'fill="#b00020" stroke="#000" stroke-width="0.6"',
    };
    for (const it of items) {
      const st = style[it.cls] ?? 'fill="none" stroke="#000"';
      if (it.kind === 'circle' && it.c && it.r !== undefined) {
        const rr = it.cls === 'cg' ? 3.5 : it.r * scale;
        out.push(`<circle cx="${X(it.c[0])}" cy="${Y(it.c[1])}" r="${fixed(rr, 1)}" ${st}/>`);
        if (it.label) {
          const dy = it.cls === 'cg' ? -6 : 3;
          out.push(`<text x="${fixed(cx + it.c[0] * scale + (it.cls === 'cg' ? 6 : 0), 1)}" y="${fixed(cy - it.c[1] * scale + dy, 1)}" text-anchor="${it.cls === 'cg' ? 'start' : 'middle'}" class="tk">${esc(it.label)}</text>`);
        }
      } else if (it.pts) {
        const pts = it.pts.map((q) => `${X(q[0])},${Y(q[1])}`).join(' ');
        out.push(`<${it.kind} points="${pts}" ${st}/>`);
      }
    }
  };
  render(sideP, 0, views.side.title);
  render(rearP, panelW + gap, views.rear.title);
  // Scale bar: 1 m, or 3 ft in imperial.
  const imperial = d.units === 'imperial';
  const bar = imperial ? 3 * M_PER_FT * scale : scale;
  out.push(`<line x1="4" x2="${fixed(4 + bar, 1)}" y1="${H - 24}" y2="${H - 24}" stroke="#000" stroke-width="1.4"/>`);
  out.push(`<text x="4" y="${H - 28}" class="tk">${imperial ? '3 ft' : '1 m'}</text>`);
  out.push(`<text x="${fixed(12 + bar, 1)}" y="${H - 20}" class="tk">solid ground: under the near-side track (side) / rear axle (rear); dashed: far side / front axle. Red: CG and plumb line.</text>`);
  out.push(`<text x="4" y="${H - 6}" class="tk">${esc(d.caption)}</text>`);
  out.push('</svg>');
  return out.join('');
}
