import { useEffect, useMemo } from 'react';
import * as THREE from 'three';
import { TerrainField, HEADING_MAX_EXTRA_RAD } from '../core';
import { usePlumb } from '../store/react';
import { ROSE_M_PER_DEG, useHeadingSweepShown } from '../store/headingSweep';

import { DEG_PER_RAD as DEG } from '../present/units';
const LIFT_M = 0.06;

/**
 * The heading sweep drawn over the terrain around the spot it was run at: for each heading, a point
 * that far out along that heading in proportion to the extra tilt to the tip (ROSE_M_PER_DEG), so
 * the rose is short toward the worst heading; the worst heading as a red spoke. In the terrain frame.
 */
export function HeadingRose() {
  const shown = useHeadingSweepShown((s) => s.shown);
  const terrain = usePlumb((s) => s.scenario.terrain);
  const objects = useMemo(() => {
    if (!shown) return null;
    const field = new TerrainField(terrain);
    const at = (h: number, rM: number, out: number[]) => {
      const x = shown.xM + rM * Math.cos(h);
      const y = shown.yM + rM * Math.sin(h);
      out.push(x, y, field.height(x, y) + LIFT_M);
    };
    const ring: number[] = [];
    const solved = shown.headings.filter((h) => h.solved);
    if (solved.length === 0 || !shown.worst) return null;
    for (const h of [...solved, solved[0]]) at(h.headingRad, (h.tip ? h.tip.extraRad : HEADING_MAX_EXTRA_RAD) * DEG * ROSE_M_PER_DEG, ring);
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.Float32BufferAttribute(ring, 3));
    const line = new THREE.Line(g, new THREE.LineBasicMaterial({ color: '#0b3d91' }));
    const worstH = shown.worst;
    const spoke: number[] = [];
    at(worstH.headingRad, 0, spoke);
    at(worstH.headingRad, Math.max(1, (worstH.tip ? worstH.tip.extraRad : HEADING_MAX_EXTRA_RAD) * DEG * ROSE_M_PER_DEG), spoke);
    const sg = new THREE.BufferGeometry();
    sg.setAttribute('position', new THREE.Float32BufferAttribute(spoke, 3));
    const worst = new THREE.Line(sg, new THREE.LineBasicMaterial({ color: '#c0392b' }));
    return { line, worst };
  }, [shown, terrain]);
  useEffect(
    () => () => {
      if (!objects) return;
      for (const o of [objects.line, objects.worst]) {
        o.geometry.dispose();
        (o.material as THREE.Material).dispose();
      }
    },
    [objects],
  );
  if (!objects) return null;
  return (
    <group name="heading-rose">
      <primitive object={objects.line} />
      <primitive object={objects.worst} />
    </group>
  );
}
