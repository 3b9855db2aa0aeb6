import { useMemo, useRef } from 'react';
import * as THREE from 'three';
import { useSolved } from './useSolved';
import { drawnResult } from './tipState';

export interface SupportPolygonProps {
  /** Most hull vertices drawn. */
  maxVertices?: number;
  /** Lift off the ground along gravity-up so it is not hidden in the terrain (m). */
  liftM?: number;
}

/**
 * The support polygon (hull of the loaded tyre contacts) on the ground: a see-through fill and a
 * solid outline, with the weakest tip edge drawn thicker in dashes.
 */
export function SupportPolygon({ maxVertices = 64, liftM = 0.025 }: SupportPolygonProps) {
  const fillRef = useRef<THREE.Mesh>(null);
  const { fill, outline, weak, outlineObj, weakObj } = useMemo(() => {
    const f = new THREE.BufferGeometry();
    f.setAttribute('position', new THREE.BufferAttribute(new Float32Array(maxVertices * 9), 3));
    const o = new THREE.BufferGeometry();
    o.setAttribute('position', new THREE.BufferAttribute(new Float32Array((maxVertices + 1) * 3), 3));
    const w = new THREE.BufferGeometry();
    w.setAttribute('position', new THREE.BufferAttribute(new Float32Array(6), 3));
    return {
      fill: f,
      outline: o,
      weak: w,
      outlineObj: new THREE.Line(o, new THREE.LineBasicMaterial({ color: '#0b3d91' })),
      weakObj: new THREE.Line(w, new THREE.LineDashedMaterial({ color: '#111111', dashSize: 0.1, gapSize: 0.06 })),
    };
  }, [maxVertices]);
  useSolved((s) => {
    const r = drawnResult(s);
    const poly = r.supportPolygonWorld;
    const n = Math.min(poly.length, maxVertices);
    const gd = r.gravityDirWorld;
    const ux = -gd[0] * liftM;
    const uy = -gd[1] * liftM;
    const uz = -gd[2] * liftM;
    const op = outline.getAttribute('position') as THREE.BufferAttribute;
    for (let i = 0; i <= n && n > 0; i++) {
      const p = poly[i % n];
      op.setXYZ(i, p[0] + ux, p[1] + uy, p[2] + uz);
    }
    op.needsUpdate = true;
    outline.setDrawRange(0, n > 0 ? n + 1 : 0);
    outline.computeBoundingSphere();
    // Fan from vertex 0 (the hull is convex).
    const fp = fill.getAttribute('position') as THREE.BufferAttribute;
    let t = 0;
    for (let i = 1; i + 1 < n; i++) {
      for (const k of [0, i, i + 1]) fp.setXYZ(t++, poly[k][0] + ux, poly[k][1] + uy, poly[k][2] + uz);
    }
    fp.needsUpdate = true;
    fill.setDrawRange(0, t);
    fill.computeBoundingSphere();
    if (fillRef.current) fillRef.current.visible = t > 0;
    const e = r.margins.weakestEdge;
    const wp = weak.getAttribute('position') as THREE.BufferAttribute;
    if (e >= 0 && n >= 2) {
      const a = poly[e % n];
      const b = poly[(e + 1) % n];
      wp.setXYZ(0, a[0] + 2 * ux, a[1] + 2 * uy, a[2] + 2 * uz);
      wp.setXYZ(1, b[0] + 2 * ux, b[1] + 2 * uy, b[2] + 2 * uz);
      weak.setDrawRange(0, 2);
      weakObj.computeLineDistances();
    } else {
      weak.setDrawRange(0, 0);
    }
    wp.needsUpdate = true;
    weak.computeBoundingSphere();
  });
  return (
    <group name="support">
      <mesh ref={fillRef} geometry={fill} renderOrder={1}>
        <meshBasicMaterial color="#2f6fd6" transparent opacity={0.28} side={THREE.DoubleSide} depthWrite={false} />
      </mesh>
      <primitive object={outlineObj} />
      <primitive object={weakObj} />
    </group>
  );
}
