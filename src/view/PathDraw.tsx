import { useEffect, useMemo } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { TerrainField, snapToFileUnit, type UnitSystem } from '../core';
import { usePlumb } from '../store/react';
import { pathDrawHandles, pathDrawStore, rayGroundHit, usePathDraw, type DrawnLine, type XY } from './PathDrawState';

const _ray = new THREE.Raycaster();
const _ndc = new THREE.Vector2();
const _inv = new THREE.Matrix4();
const _o = new THREE.Vector3();
const _d = new THREE.Vector3();
const _p = new THREE.Vector3();

/** Height of the drawn lines and markers above the ground (m). */
const LIFT_M = 0.04;
/** A press moved farther than this on the ground draws a whole line (m); less is a click. */
const DRAG_LINE_M = 0.5;
const COLOURS = ['#D55E00', '#009E73', '#CC79A7', '#E69F00', '#56B4E9', '#F0E442'];

/** Colour of drawn line i (Okabe–Ito palette, colour-blind safe). */
export function drawnLineColour(i: number): string {
  return COLOURS[i % COLOURS.length];
}

/** A point on the ground kept to the scenario file's resolution (0.1 mm or 0.01 in), so the app holds what the file will say. */
export function snapXY(p: XY, units: UnitSystem): XY {
  return [snapToFileUnit('length', p[0], units), snapToFileUnit('length', p[1], units)];
}

/** The polyline draped on the ground: each leg sampled every ~5 cm (at least 8 samples a leg, at most 400). */
function drape(field: TerrainField, l: DrawnLine): Float32Array {
  const pts = l.points.length === 1 ? [l.points[0], l.points[0]] : l.points;
  const counts: number[] = [];
  let total = 1;
  for (let k = 1; k < pts.length; k++) {
    const n = Math.min(400, Math.max(8, Math.ceil(Math.hypot(pts[k][0] - pts[k - 1][0], pts[k][1] - pts[k - 1][1]) / 0.05)));
    counts.push(n);
    total += n;
  }
  const out = new Float32Array(3 * total);
  let j = 0;
  const put = (x: number, y: number) => {
    out[j++] = x;
    out[j++] = y;
    out[j++] = field.height(x, y) + LIFT_M;
  };
  put(pts[0][0], pts[0][1]);
  for (let k = 1; k < pts.length; k++) {
    const a = pts[k - 1];
    const b = pts[k];
    for (let i = 1; i <= counts[k - 1]; i++) {
      const f = i / counts[k - 1];
      put(a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1]));
    }
  }
  return out;
}

/**
 * Drawing candidate lines on the ground: while drawing is on, a left press on the ground adds a
 * point to the line being drawn (or starts one) or, dragged, draws a whole two-point line; the view
 * does not orbit on it. The lines are draped on the terrain; their point markers are DOM elements
 * (PathDrawMarkers) placed here each frame and dragged to edit. Lives inside the tilt-table group
 * (terrain frame).
 */
export function PathDraw() {
  const terrain = usePlumb((s) => s.scenario.terrain);
  const units = usePlumb((s) => s.scenario.units);
  const lines = usePathDraw((s) => s.lines);
  const gl = useThree((s) => s.gl);
  const camera = useThree((s) => s.camera);
  const scene = useThree((s) => s.scene);
  const invalidate = useThree((s) => s.invalidate);
  const field = useMemo(() => new TerrainField(terrain), [terrain]);

  useEffect(() => {
    const el = gl.domElement;
    const table = () => scene.getObjectByName('tilt-table');
    const hitAt = (clientX: number, clientY: number): XY | null => {
      const r = el.getBoundingClientRect();
      _ndc.set(((clientX - r.left) / r.width) * 2 - 1, -((clientY - r.top) / r.height) * 2 + 1);
      _ray.setFromCamera(_ndc, camera);
      const t = table();
      _inv.identity();
      if (t) {
        t.updateMatrixWorld(true);
        _inv.copy(t.matrixWorld).invert();
      }
      _o.copy(_ray.ray.origin).applyMatrix4(_inv);
      _d.copy(_ray.ray.direction).transformDirection(_inv);
      const hit = rayGroundHit((x, y) => field.height(x, y), [_o.x, _o.y, _o.z], [_d.x, _d.y, _d.z]);
      return hit ? snapXY([hit[0], hit[1]], units) : null;
    };
    pathDrawHandles.hitAt = hitAt;
    pathDrawHandles.invalidate = invalidate;
    let down: XY | null = null;
    let pointer = -1;
    // Capture phase on the canvas: runs before the camera's own listener and keeps a drawing press from orbiting.
    const onDown = (e: PointerEvent): void => {
      if (!pathDrawStore.getState().drawing || e.button !== 0 || e.ctrlKey || e.metaKey) return;
      const p = hitAt(e.clientX, e.clientY);
      if (!p) return;
      e.stopImmediatePropagation();
      e.preventDefault();
      down = p;
      pointer = e.pointerId;
    };
    const onUp = (e: PointerEvent): void => {
      if (down === null || e.pointerId !== pointer) return;
      const a = down;
      down = null;
      const b = hitAt(e.clientX, e.clientY);
      const st = pathDrawStore.getState();
      if (b && Math.hypot(b[0] - a[0], b[1] - a[1]) > DRAG_LINE_M) st.addLine(a, b);
      else st.addPoint(a);
    };
    el.addEventListener('pointerdown', onDown, { capture: true });
    window.addEventListener('pointerup', onUp);
    const unsub = pathDrawStore.subscribe(() => invalidate());
    return () => {
      if (pathDrawHandles.hitAt === hitAt) pathDrawHandles.hitAt = null;
      el.removeEventListener('pointerdown', onDown, { capture: true });
      window.removeEventListener('pointerup', onUp);
      unsub();
    };
  }, [gl, camera, scene, invalidate, field, units]);

  const objects = useMemo(
    () =>
      lines.map((l, i) => {
        const g = new THREE.BufferGeometry();
        g.setAttribute('position', new THREE.BufferAttribute(drape(field, l), 3));
        return new THREE.Line(g, new THREE.LineBasicMaterial({ color: drawnLineColour(i), linewidth: 2 }));
      }),
    [lines, field],
  );
  useEffect(
    () => () => {
      for (const o of objects) {
        o.geometry.dispose();
        (o.material as THREE.Material).dispose();
      }
    },
    [objects],
  );

  // Place the DOM markers over the line points on every drawn frame.
  useFrame(({ size }) => {
    const t = scene.getObjectByName('tilt-table');
    const ls = pathDrawStore.getState().lines;
    for (const [key, el] of pathDrawHandles.markers) {
      const [li, k] = key.split(':');
      const p = ls[Number(li)]?.points[Number(k)];
      if (!p) {
        el.style.visibility = 'hidden';
        continue;
      }
      _p.set(p[0], p[1], field.height(p[0], p[1]) + LIFT_M);
      if (t) _p.applyMatrix4(t.matrixWorld);
      _p.project(camera);
      const x = (_p.x * 0.5 + 0.5) * size.width;
      const y = (-_p.y * 0.5 + 0.5) * size.height;
      el.style.transform = `translate(-50%, -50%) translate(${x.toFixed(1)}px, ${y.toFixed(1)}px)`;
      el.style.visibility = _p.z > 1 ? 'hidden' : 'visible';
    }
  });

  return (
    <group name="drawn-lines">
      {objects.map((o, i) => (
        <primitive key={i} object={o} />
      ))}
    </group>
  );
}
