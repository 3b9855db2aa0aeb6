import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { usePlumb } from '../store/react';
import { alongQuaternion, bodyMatrix } from './adapters';
import { useSolved } from './useSolved';

export interface GhostVehicleProps {
  /** Outline colour (the colour-blind-safe vermilion of the wheel palette). */
  color?: string;
}

/**
 * A second build drawn as an outline (body box edges and tyre rims) where it stands at the same
 * pose, so two builds can be seen together; hidden when there is none.
 */
export function GhostVehicle({ color = '#D55E00' }: GhostVehicleProps) {
  const vehicle = usePlumb((s) => s.ghost?.vehicle ?? null);
  const group = useRef<THREE.Group>(null);
  const body = useRef<THREE.Group>(null);
  const wheels = [useRef<THREE.Group>(null), useRef<THREE.Group>(null), useRef<THREE.Group>(null), useRef<THREE.Group>(null)];
  const geo = useMemo(() => {
    if (!vehicle) return null;
    const b = vehicle.body;
    const front = vehicle.wheelbaseM / 2 + b.frontOverhangM;
    const rear = -(vehicle.wheelbaseM / 2 + b.rearOverhangM);
    const heightM = Math.max(0.05, b.roofHeightM - b.bellyClearanceM);
    const box = new THREE.BoxGeometry(front - rear, b.widthM, heightM);
    const edges = new THREE.EdgesGeometry(box);
    box.dispose();
    const tyre = (t: typeof vehicle.tyreFront) => {
      const c = new THREE.CylinderGeometry(t.radiusM, t.radiusM, t.widthM, 32, 1, true);
      const e = new THREE.EdgesGeometry(c, 30);
      c.dispose();
      return e;
    };
    return {
      edges,
      centre: new THREE.Vector3((front + rear) / 2, 0, b.bellyClearanceM + heightM / 2),
      tyres: [tyre(vehicle.tyreFront), tyre(vehicle.tyreRear)],
    };
  }, [vehicle]);
  useEffect(() => () => geo?.edges.dispose(), [geo]);
  useEffect(() => () => geo?.tyres.forEach((t) => t.dispose()), [geo]);
  useSolved((s) => {
    const g = s.ghost;
    if (!group.current) return;
    group.current.visible = g !== null;
    if (!g || !body.current) return;
    bodyMatrix(g.model, g.pose, g.result, body.current.matrix);
    body.current.matrixWorldNeedsUpdate = true;
    for (let i = 0; i < 4; i++) {
      const w = wheels[i].current;
      if (!w) continue;
      const r = g.result.wheels[i];
      w.position.set(r.centreWorld[0], r.centreWorld[1], r.centreWorld[2]);
      alongQuaternion(r.axisWorld, w.quaternion);
    }
  });
  if (!geo) return <group ref={group} visible={false} />;
  return (
    <group ref={group} name="ghost">
      <group ref={body} matrixAutoUpdate={false}>
        <lineSegments geometry={geo.edges} position={geo.centre}>
          <lineBasicMaterial color={color} />
        </lineSegments>
      </group>
      {wheels.map((ref, i) => (
        <group key={i} ref={ref}>
          <lineSegments geometry={geo.tyres[i < 2 ? 0 : 1]}>
            <lineBasicMaterial color={color} />
          </lineSegments>
        </group>
      ))}
    </group>
  );
}
