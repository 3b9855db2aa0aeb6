import { useRef } from 'react';
import * as THREE from 'three';
import { usePlumb } from '../store/react';
import { shownResult, shownVehicle } from '../store/store';
import { alongQuaternion, loadShareColor } from './adapters';
import { useSolved } from './useSolved';

export interface LoadColumnProps {
  /** Wheel index: 0 FL, 1 FR, 2 RL, 3 RR. */
  index: number;
  /** Column height for a quarter of the vehicle's weight (m). */
  heightPerQuarterM?: number;
  radiusM?: number;
}

const _up = new THREE.Vector3();
const _side = new THREE.Vector3();

/**
 * A column standing beside the tyre's contact, its height in proportion to the scale reading
 * (vertical load), coloured by the share of the tyre's static load; it ends in an arrow head
 * pressing on the ground. Hidden when the tyre has lifted.
 */
export function LoadColumn({ index, heightPerQuarterM = 0.9, radiusM = 0.055 }: LoadColumnProps) {
  const group = useRef<THREE.Group>(null);
  const shaft = useRef<THREE.Mesh>(null);
  const head = useRef<THREE.Mesh>(null);
  const material = useRef<THREE.MeshLambertMaterial>(null);
  const tyreWidthM = usePlumb((s) => (index < 2 ? shownVehicle(s).tyreFront.widthM : shownVehicle(s).tyreRear.widthM));
  const headM = 0.14;
  useSolved((s) => {
    const g = group.current;
    if (!g || !shaft.current || !head.current || !material.current) return;
    const r = shownResult(s);
    const w = r.wheels[index];
    const quarter = r.weightN / 4;
    const h = Math.max(0.02, (heightPerQuarterM * (w.verticalLoadN ?? 0)) / quarter);
    g.visible = !w.lifted && r.status !== 'no-contact';
    const gd = r.gravityDirWorld;
    _up.set(-gd[0], -gd[1], -gd[2]);
    // Outboard: along the tyre axis to the left for left wheels, to the right for right wheels.
    const out = (index & 1) === 0 ? 1 : -1;
    const ax = w.axisWorld;
    _side.set(ax[0], ax[1], ax[2]).multiplyScalar(out * (tyreWidthM / 2 + 0.12));
    const c = w.contactPointWorld;
    g.position.set(c[0] + _side.x, c[1] + _side.y, c[2] + _side.z);
    alongQuaternion(_up, g.quaternion);
    shaft.current.scale.set(1, h, 1);
    shaft.current.position.set(0, headM + h / 2, 0);
    head.current.position.set(0, headM / 2, 0);
    loadShareColor(w.loadShare, material.current.color);
  });
  return (
    <group ref={group} name={`load-${index}`}>
      <mesh ref={shaft}>
        <cylinderGeometry args={[radiusM, radiusM, 1, 16]} />
        <meshLambertMaterial ref={material} />
      </mesh>
      <mesh ref={head} rotation={[Math.PI, 0, 0]}>
        <coneGeometry args={[radiusM * 1.9, headM, 16]} />
        <meshLambertMaterial color="#222222" />
      </mesh>
    </group>
  );
}
