import { useMemo, useRef } from 'react';
import * as THREE from 'three';
import { shownResult } from '../store/store';
import { useSolved } from './useSolved';

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
    const c = r.body.cgWorld;
    const p = r.body.plumbPointWorld;
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
    const outside = r.status === 'tipped' || r.margins.staticM < 0;
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
