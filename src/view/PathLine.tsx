import { useEffect, useMemo } from 'react';
import * as THREE from 'three';
import { PathWalker, TerrainField, type PathSpec } from '../core';
import { usePlumb } from '../store/react';

export interface PathLineProps {
  /** Height of the line above the ground (m). */
  liftM?: number;
  /** Samples along the line. */
  samples?: number;
}

/** Draws a path on the ground, following the terrain: from its start through its points to its end, `samples` in all, evenly along it. */
function pathPositions(field: TerrainField, p: PathSpec, liftM: number, samples: number): Float32Array {
  const out = new Float32Array(3 * (samples + 1));
  const w = new PathWalker(p, 0);
  for (let i = 0; i <= samples; i++) {
    w.at((i / samples) * w.lengthM);
    out[3 * i] = w.xM;
    out[3 * i + 1] = w.yM;
    out[3 * i + 2] = field.height(w.xM, w.yM) + liftM;
  }
  return out;
}

/**
 * The scenario's path (thin, dark) and the line chosen from a line sweep (thick, blue), draped on
 * the terrain. The reference point (ground, midway between the axles) travels along them.
 */
export function PathLine({ liftM = 0.03, samples = 200 }: PathLineProps) {
  const terrain = usePlumb((s) => s.scenario.terrain);
  const path = usePlumb((s) => s.scenario.path);
  const chosen = usePlumb((s) => s.overlayPath);
  const lines = useMemo(() => {
    const field = new TerrainField(terrain);
    const make = (p: PathSpec | null, color: string) => {
      if (!p) return null;
      const g = new THREE.BufferGeometry();
      g.setAttribute('position', new THREE.BufferAttribute(pathPositions(field, p, liftM, samples), 3));
      return new THREE.Line(g, new THREE.LineBasicMaterial({ color }));
    };
    return { field, path: make(path, '#3b3328'), chosen: make(chosen, '#0072B2') };
  }, [terrain, path, chosen, liftM, samples]);
  useEffect(
    () => () => {
      for (const l of [lines.path, lines.chosen]) {
        if (!l) continue;
        l.geometry.dispose();
        (l.material as THREE.Material).dispose();
      }
    },
    [lines],
  );
  return (
    <group name="paths">
      {lines.path ? <primitive object={lines.path} /> : null}
      {lines.chosen ? <primitive object={lines.chosen} /> : null}
      {chosen && lines.chosen ? <ChosenMarks path={chosen} field={lines.field} liftM={liftM} /> : null}
    </group>
  );
}

/** Small posts at the start and end of the chosen line, so it reads from far. */
function ChosenMarks({ path, field, liftM }: { path: PathSpec; field: TerrainField; liftM: number }) {
  const ends = [path.fromM, path.toM];
  return (
    <>
      {ends.map((p, i) => (
        <mesh key={i} position={[p[0], p[1], field.height(p[0], p[1]) + liftM + 0.15]} rotation={[Math.PI / 2, 0, 0]}>
          <cylinderGeometry args={[0.05, 0.05, 0.3, 8]} />
          <meshBasicMaterial color="#0072B2" />
        </mesh>
      ))}
    </>
  );
}
