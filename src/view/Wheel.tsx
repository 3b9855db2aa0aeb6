import { useMemo, useRef } from 'react';
import * as THREE from 'three';
import { usePlumb } from '../store/react';
import { shownVehicle } from '../store/store';
import { drawnResult } from './tipState';
import { alongQuaternion } from './adapters';
import { useSceneApi } from './sceneContext';
import { useSolved } from './useSolved';

export interface WheelProps {
  /** Wheel index: 0 FL, 1 FR, 2 RL, 3 RR. */
  index: number;
  /** Height of the label anchor above the tyre top (m). */
  labelLiftM?: number;
}

/**
 * One tyre at the solved wheel centre and axis. A loaded tyre is solid; a lifted one turns into a
 * see-through outline with bright rims, so it cannot be mistaken for a loaded one even in grey.
 */
export function Wheel({ index, labelLiftM = 0.3 }: WheelProps) {
  const api = useSceneApi();
  const tyre = usePlumb((s) => (index < 2 ? shownVehicle(s).tyreFront : shownVehicle(s).tyreRear));
  const group = useRef<THREE.Group>(null);
  const solid = useRef<THREE.Group>(null);
  const hollow = useRef<THREE.Group>(null);
  const { tyreGeo, hubGeo, ringGeo } = useMemo(() => {
    const ring = new THREE.BufferGeometry();
    const n = 48;
    const pts = new Float32Array(n * 3 * 2 * 2);
    let k = 0;
    // Two rims (inner and outer face) as line segments, and cross lines so it reads as hollow.
    for (const side of [-0.5, 0.5]) {
      for (let i = 0; i < n; i++) {
        const a0 = (i / n) * Math.PI * 2;
        const a1 = ((i + 1) / n) * Math.PI * 2;
        pts[k++] = Math.cos(a0) * tyre.radiusM;
        pts[k++] = side * tyre.widthM;
        pts[k++] = Math.sin(a0) * tyre.radiusM;
        pts[k++] = Math.cos(a1) * tyre.radiusM;
        pts[k++] = side * tyre.widthM;
        pts[k++] = Math.sin(a1) * tyre.radiusM;
      }
    }
    ring.setAttribute('position', new THREE.BufferAttribute(pts, 3));
    return {
      tyreGeo: new THREE.CylinderGeometry(tyre.radiusM, tyre.radiusM, tyre.widthM, 40, 1),
      hubGeo: new THREE.CylinderGeometry(tyre.radiusM * 0.55, tyre.radiusM * 0.55, tyre.widthM * 1.02, 24, 1),
      ringGeo: ring,
    };
  }, [tyre]);
  useSolved((s) => {
    const g = group.current;
    if (!g || !solid.current || !hollow.current) return;
    const w = drawnResult(s).wheels[index];
    g.position.set(w.centreWorld[0], w.centreWorld[1], w.centreWorld[2]);
    alongQuaternion(w.axisWorld, g.quaternion);
    solid.current.visible = !w.lifted;
    hollow.current.visible = w.lifted;
    const a = api.labelAnchors;
    a[3 * index] = w.centreWorld[0];
    a[3 * index + 1] = w.centreWorld[1];
    a[3 * index + 2] = w.centreWorld[2] + tyre.radiusM + labelLiftM;
  });
  return (
    <group ref={group} name={`wheel-${index}`}>
      <group ref={solid}>
        <mesh geometry={tyreGeo}>
          <meshLambertMaterial color="#2b2b2b" />
        </mesh>
        <mesh geometry={hubGeo}>
          <meshLambertMaterial color="#9a9a9a" />
        </mesh>
      </group>
      <group ref={hollow} visible={false}>
        <mesh geometry={tyreGeo}>
          <meshBasicMaterial color="#ffffff" transparent opacity={0.12} depthWrite={false} />
        </mesh>
        <lineSegments geometry={ringGeo}>
          <lineBasicMaterial color="#ffffff" />
        </lineSegments>
        <mesh geometry={tyreGeo}>
          <meshBasicMaterial color="#000000" wireframe transparent opacity={0.5} />
        </mesh>
      </group>
    </group>
  );
}
