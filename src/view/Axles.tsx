import { useRef } from 'react';
import * as THREE from 'three';
import { usePlumb } from '../store/react';
import { shownModel, shownPose, shownVehicle } from '../store/store';
import { drawnResult } from './tipState';
import { alongQuaternion, bodyMatrix } from './adapters';
import { useSolved } from './useSolved';

export interface AxlesProps {
  radiusM?: number;
}

const _m = new THREE.Matrix4();
const _a = new THREE.Vector3();
const _b = new THREE.Vector3();
const _d = new THREE.Vector3();

/**
 * Axles: a beam between the wheel centres for a solid axle; for independent suspension a link
 * from each wheel centre to the body near the centre line. Either way the articulation shows.
 * Bars 0–1 are the front axle (beam, or left and right links), 2–3 the rear.
 */
export function Axles({ radiusM = 0.045 }: AxlesProps) {
  const bars = [useRef<THREE.Mesh>(null), useRef<THREE.Mesh>(null), useRef<THREE.Mesh>(null), useRef<THREE.Mesh>(null)];
  const solidFront = usePlumb((s) => shownVehicle(s).suspensionFront.type === 'solid');
  const solidRear = usePlumb((s) => shownVehicle(s).suspensionRear.type === 'solid');
  useSolved((s) => {
    const r = drawnResult(s);
    const model = shownModel(s);
    bodyMatrix(model, shownPose(s), r, _m);
    for (let axle = 0; axle < 2; axle++) {
      const solid = axle === 0 ? solidFront : solidRear;
      const ax = model.axles[axle];
      for (let side = 0; side < 2; side++) {
        const bar = bars[2 * axle + side].current;
        if (!bar) continue;
        const wi = 2 * axle + side;
        const c = r.wheels[wi].centreWorld;
        _a.set(c[0], c[1], c[2]);
        if (solid) {
          if (side === 1) {
            bar.visible = false;
            continue;
          }
          const o = r.wheels[wi + 1].centreWorld;
          _b.set(o[0], o[1], o[2]);
        } else {
          // Inner pivot: on the body, 0.2 m from the centre line, at the wheel's ride height.
          _b.set(ax.xM, side === 0 ? 0.2 : -0.2, model.rideRadiusM[wi]).applyMatrix4(_m);
        }
        bar.visible = true;
        _d.subVectors(_b, _a);
        const len = _d.length();
        bar.position.copy(_a).addScaledVector(_d, 0.5);
        alongQuaternion(_d, bar.quaternion);
        bar.scale.set(1, Math.max(len, 1e-3), 1);
      }
    }
  });
  return (
    <group name="axles">
      {bars.map((ref, i) => (
        <mesh key={i} ref={ref}>
          <cylinderGeometry args={[radiusM, radiusM, 1, 12]} />
          <meshLambertMaterial color="#4a4f55" />
        </mesh>
      ))}
    </group>
  );
}
