import { useEffect, useMemo, useRef } from 'react';
import * as THREE from 'three';
import { alongQuaternion } from './adapters';
import { useSceneApi } from './sceneContext';
import { tipViewOf } from './tipState';
import { useSolved } from './useSolved';

export interface TipEdgeProps {
  /** Radius of the bar drawn along the edge (m): thick enough to read at a glance, unlike a 1 px line. */
  radiusM?: number;
  /** Lift off the ground along the contact normal so it is not hidden in the terrain (m). */
  liftM?: number;
}

const _a = new THREE.Vector3();
const _b = new THREE.Vector3();
const _d = new THREE.Vector3();

/**
 * The edge of the support a pose that does not stand goes over: a magenta bar on the ground
 * between the two outermost contacts of the state at the tip (tipState.ts), with round ends.
 * Hidden while the pose stands. Its userData carries the edge's tyres and ends (for tests).
 */
export function TipEdge({ radiusM = 0.035, liftM = 0.04 }: TipEdgeProps) {
  const api = useSceneApi();
  const group = useRef<THREE.Group>(null);
  const bar = useRef<THREE.Mesh>(null);
  const ends = [useRef<THREE.Mesh>(null), useRef<THREE.Mesh>(null)];
  const geo = useMemo(() => ({ bar: new THREE.CylinderGeometry(1, 1, 1, 12, 1), end: new THREE.SphereGeometry(1, 12, 8) }), []);
  useEffect(() => {
    api.tipEdgeState = () => {
      const g = group.current;
      if (!g) return null;
      const u = g.userData as { edge?: string; fromM?: readonly number[]; toM?: readonly number[] };
      return { visible: g.visible, edge: u.edge ?? '', fromM: u.fromM ?? [], toM: u.toM ?? [] };
    };
    return () => {
      api.tipEdgeState = () => null;
    };
  }, [api]);
  useEffect(() => () => (geo.bar.dispose(), geo.end.dispose()), [geo]);
  useSolved((s) => {
    const g = group.current;
    if (!g || !bar.current) return;
    const tv = tipViewOf(s);
    g.visible = tv !== null;
    g.userData = tv ? { edge: tv.tip.edge.join(','), fromM: tv.edgeFromM, toM: tv.edgeToM } : {};
    if (!tv) return;
    // Up: the load-weighted contact normal of the state at the tip.
    let nx = 0, ny = 0, nz = 0;
    for (const w of tv.atTip.wheels) {
      const l = w.loadN ?? 0;
      nx += l * w.contactNormalWorld[0]; ny += l * w.contactNormalWorld[1]; nz += l * w.contactNormalWorld[2];
    }
    const nl = Math.hypot(nx, ny, nz) || 1;
    const k = liftM / nl;
    _a.set(tv.edgeFromM[0] + k * nx, tv.edgeFromM[1] + k * ny, tv.edgeFromM[2] + k * nz);
    _b.set(tv.edgeToM[0] + k * nx, tv.edgeToM[1] + k * ny, tv.edgeToM[2] + k * nz);
    _d.subVectors(_b, _a);
    bar.current.position.addVectors(_a, _b).multiplyScalar(0.5);
    alongQuaternion(_d, bar.current.quaternion);
    bar.current.scale.set(radiusM, Math.max(_d.length(), 1e-3), radiusM);
    ends[0].current?.position.copy(_a);
    ends[1].current?.position.copy(_b);
    const t = api.tipAnchor;
    t[0] = bar.current.position.x;
    t[1] = bar.current.position.y;
    t[2] = bar.current.position.z;
  });
  return (
    <group ref={group} name="tip-edge" visible={false}>
      <mesh ref={bar} geometry={geo.bar} renderOrder={3}>
        <meshBasicMaterial color="#c2185b" />
      </mesh>
      {ends.map((r, i) => (
        <mesh key={i} ref={r} geometry={geo.end} scale={radiusM * 1.6}>
          <meshBasicMaterial color="#c2185b" />
        </mesh>
      ))}
    </group>
  );
}
