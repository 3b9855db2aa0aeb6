import { useFrame, useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { useSceneApi } from './sceneContext';

export interface LabelProjectorProps {
  /** Name of the tilt-table group whose frame the anchors are in. */
  tableName?: string;
}

const _p = new THREE.Vector3();

/** Places the wheel-load labels (DOM, outside the canvas) over their tyres on every drawn frame. */
export function LabelProjector({ tableName = 'tilt-table' }: LabelProjectorProps) {
  const api = useSceneApi();
  const scene = useThree((s) => s.scene);
  useFrame(({ camera, size }) => {
    const table = scene.getObjectByName(tableName);
    for (let i = 0; i < 4; i++) {
      const el = api.labels[i];
      if (!el) continue;
      const a = api.labelAnchors;
      _p.set(a[3 * i], a[3 * i + 1], a[3 * i + 2]);
      if (table) _p.applyMatrix4(table.matrixWorld);
      _p.project(camera);
      const behind = _p.z > 1;
      const x = (_p.x * 0.5 + 0.5) * size.width;
      const y = (-_p.y * 0.5 + 0.5) * size.height;
      el.style.transform = `translate(-50%, -100%) translate(${x.toFixed(1)}px, ${y.toFixed(1)}px)`;
      el.style.visibility = behind ? 'hidden' : 'visible';
    }
    const tl = api.tipLabel;
    if (tl && tl.dataset.shown === 'true') {
      const t = api.tipAnchor;
      _p.set(t[0], t[1], t[2]);
      if (table) _p.applyMatrix4(table.matrixWorld);
      _p.project(camera);
      const behind = _p.z > 1;
      const x = (_p.x * 0.5 + 0.5) * size.width;
      const y = (-_p.y * 0.5 + 0.5) * size.height;
      tl.style.transform = `translate(-50%, 0) translate(${x.toFixed(1)}px, ${y.toFixed(1)}px)`;
      tl.style.visibility = behind ? 'hidden' : 'visible';
    }
  });
  return null;
}
