import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { usePlumb } from '../store/react';
import { shownModel, shownPose, shownResult, shownVehicle } from '../store/store';
import { drawnResult } from './tipState';
import { bodyMatrix } from './adapters';
import { useSceneApi } from './sceneContext';
import { useSolved } from './useSolved';

export interface VehicleBodyProps {
  /** Body opacity; see-through so the CG and the far wheels stay visible. */
  opacity?: number;
}

/** The body as a box from the body outline (overhangs, width, belly to roof), posed as solved. */
export function VehicleBody({ opacity = 0.28 }: VehicleBodyProps) {
  const api = useSceneApi();
  const body = usePlumb((s) => shownVehicle(s).body);
  const wheelbaseM = usePlumb((s) => shownVehicle(s).wheelbaseM);
  // A pose that does not stand is drawn as a ghost: red, faint, with a dashed outline; never as a balance.
  const standing = usePlumb((s) => shownResult(s).standing);
  const group = useRef<THREE.Group>(null);
  const mesh = useRef<THREE.Mesh>(null);
  const { box, edges, centre } = useMemo(() => {
    const front = wheelbaseM / 2 + body.frontOverhangM;
    const rear = -(wheelbaseM / 2 + body.rearOverhangM);
    const lengthM = front - rear;
    const heightM = Math.max(0.05, body.roofHeightM - body.bellyClearanceM);
    const b = new THREE.BoxGeometry(lengthM, body.widthM, heightM);
    return {
      box: b,
      edges: new THREE.EdgesGeometry(b),
      centre: new THREE.Vector3((front + rear) / 2, 0, body.bellyClearanceM + heightM / 2),
    };
  }, [body, wheelbaseM]);
  useEffect(() => () => (box.dispose(), edges.dispose()), [box, edges]);
  useEffect(() => {
    const m = mesh.current;
    if (!m) return;
    api.grabbable.push(m);
    return () => {
      const i = api.grabbable.indexOf(m);
      if (i >= 0) api.grabbable.splice(i, 1);
    };
  }, [api]);
  useSolved((s) => {
    const g = group.current;
    if (!g) return;
    // A pose that does not stand is drawn as it stands at the tip (tipState.ts), never as the solver's last state.
    bodyMatrix(shownModel(s), shownPose(s), drawnResult(s), g.matrix);
    g.matrixWorldNeedsUpdate = true;
  });
  return (
    <group ref={group} matrixAutoUpdate={false} name="body" userData={{ standing }}>
      <mesh ref={mesh} geometry={box} position={centre} renderOrder={2}>
        <meshLambertMaterial color={standing ? '#8fa3b8' : '#c0392b'} transparent opacity={standing ? opacity : opacity * 0.5} depthWrite={false} />
      </mesh>
      <lineSegments geometry={edges} position={centre}>
        <lineBasicMaterial color={standing ? '#1d2a36' : '#c0392b'} transparent opacity={standing ? 1 : 0.6} />
      </lineSegments>
      {/* Nose marker: a bar across the front face so the heading reads at a glance. */}
      <mesh position={[centre.x + (wheelbaseM / 2 + body.frontOverhangM - centre.x), 0, body.bellyClearanceM + 0.12]}>
        <boxGeometry args={[0.04, body.widthM * 0.9, 0.08]} />
        <meshLambertMaterial color="#1d2a36" />
      </mesh>
    </group>
  );
}
