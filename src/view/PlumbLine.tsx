import { useMemo, useRef } from 'react';
import * as THREE from 'three';
import { shownResult } from '../store/store';
import { useSolved } from './useSolved';
import { tipViewOf, type TipView } from './tipState';

type V3 = readonly [number, number, number];

/**
 * Where the line from the CG at the tip along gravity g meets the plane through the tip edge whose
 * normal is the load-weighted contact normal of the state at the tip.
 */
function plumbPast(tv: TipView, g: V3): V3 {
  const c = tv.atTip.body.cgWorld;
  let nx = 0, ny = 0, nz = 0;
  for (const w of tv.atTip.wheels) {
    const l = w.loadN ?? 0;
    nx += l * w.contactNormalWorld[0]; ny += l * w.contactNormalWorld[1]; nz += l * w.contactNormalWorld[2];
  }
  const e = tv.edgeFromM;
  const gn = g[0] * nx + g[1] * ny + g[2] * nz;
  const dn = (e[0] - c[0]) * nx + (e[1] - c[1]) * ny + (e[2] - c[2]) * nz;
  // Gravity along the ground or away from it (tilts near 90° and beyond): a line of the CG's height.
  const t = gn < -1e-9 ? dn / gn : Math.abs(dn) / Math.max(1e-9, Math.hypot(nx, ny, nz));
  return [c[0] + t * g[0], c[1] + t * g[1], c[2] + t * g[2]];
}

export interface PlumbLineProps {
  /** CG marker radius (m). */
  markerRadiusM?: number;
}

/**
 * The CG (a black-and-white quartered ball, the usual mass-centre mark) and the plumb line from it
 * along gravity down to the ground, ending in a ring at the plumb point. The line turns from
 * black to a dashed red-and-white when the plumb point has left the support.
 */
const _up = new THREE.Vector3();
const _z = new THREE.Vector3(0, 0, 1);

export function PlumbLine({ markerRadiusM = 0.07 }: PlumbLineProps) {
  const cg = useRef<THREE.Group>(null);
  const ring = useRef<THREE.Mesh>(null);
  const line = useMemo(() => {
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(new Float32Array(6), 3));
    return g;
  }, []);
  const okMat = useMemo(() => new THREE.LineBasicMaterial({ color: '#111111' }), []);
  const outMat = useMemo(() => new THREE.LineDashedMaterial({ color: '#c0392b', dashSize: 0.06, gapSize: 0.04 }), []);
  const lineObject = useMemo(() => new THREE.Line(line, okMat), [line, okMat]);
  useSolved((s) => {
    const r = shownResult(s);
    const tv = tipViewOf(s);
    // Past the tip: the CG of the vehicle as it stands at the tip, with the plumb line along the
    // gravity of the pose shown, down to the plane of the tip edge (it falls outside the support).
    const c = tv ? tv.atTip.body.cgWorld : r.body.cgWorld;
    const p = tv ? plumbPast(tv, r.gravityDirWorld) : r.body.plumbPointWorld;
    if (cg.current) cg.current.position.set(c[0], c[1], c[2]);
    const gd = r.gravityDirWorld;
    _up.set(-gd[0], -gd[1], -gd[2]);
    if (ring.current) {
      ring.current.position.set(p[0] + 0.02 * _up.x, p[1] + 0.02 * _up.y, p[2] + 0.02 * _up.z);
      ring.current.quaternion.setFromUnitVectors(_z, _up);
    }
    const pos = line.getAttribute('position') as THREE.BufferAttribute;
    pos.setXYZ(0, c[0], c[1], c[2]);
    pos.setXYZ(1, p[0], p[1], p[2]);
    pos.needsUpdate = true;
    line.computeBoundingSphere();
    const outside = tv !== null || r.status === 'tipped' || r.margins.staticM < 0;
    lineObject.material = outside ? outMat : okMat;
    if (outside) lineObject.computeLineDistances();
  });
  return (
    <group name="plumb">
      <group ref={cg}>
        {[0, 1, 2, 3].map((q) => (
          <mesh key={q} rotation={[0, (q * Math.PI) / 2, 0]}>
            <sphereGeometry args={[markerRadiusM, 16, 8, 0, Math.PI / 2]} />
            <meshBasicMaterial color={q % 2 === 0 ? '#111111' : '#f5f5f5'} side={THREE.DoubleSide} />
          </mesh>
        ))}
      </group>
      <primitive object={lineObject} />
      <mesh ref={ring}>
        <ringGeometry args={[0.06, 0.1, 24]} />
        <meshBasicMaterial color="#111111" side={THREE.DoubleSide} />
      </mesh>
    </group>
  );
}
