import { useRef, type ReactNode } from 'react';
import type * as THREE from 'three';
import { tiltQuaternion } from './adapters';
import { shownPose } from '../store/store';
import { useSolved } from './useSolved';

export interface TiltTableProps {
  children?: ReactNode;
}

/** Turns everything inside (terrain and vehicle, in the terrain frame) like a tilt table. */
export function TiltTable({ children }: TiltTableProps) {
  const ref = useRef<THREE.Group>(null);
  useSolved((s) => {
    const g = ref.current;
    if (!g) return;
    tiltQuaternion(s.scenario.tilt, shownPose(s).headingRad, g.quaternion);
    g.updateMatrixWorld(true);
  });
  return (
    <group ref={ref} name="tilt-table">
      {children}
    </group>
  );
}
