import { useEffect, useMemo } from 'react';
import { usePlumb } from '../store/react';
import { terrainBuffers, terrainExtent } from './adapters';

export interface TerrainMeshProps {
  /** Mesh sample spacing (m). */
  stepM?: number;
  /** Grid line spacing (m). */
  gridM?: number;
  /** Extent is re-centred on the vehicle in cells this size, so a drag rarely rebuilds the mesh (m). */
  recentreM?: number;
}

/** The terrain as a shaded mesh sampled from the terrain model, with a 1 m grid on it. */
export function TerrainMesh({ stepM = 0.08, gridM = 1, recentreM = 5 }: TerrainMeshProps) {
  const terrain = usePlumb((s) => s.scenario.terrain);
  const path = usePlumb((s) => s.scenario.path);
  const cx = usePlumb((s) => Math.round(s.scenario.pose.xM / recentreM) * recentreM);
  const cy = usePlumb((s) => Math.round(s.scenario.pose.yM / recentreM) * recentreM);
  const buffers = useMemo(
    () => terrainBuffers(terrain, terrainExtent({ xM: cx, yM: cy, headingRad: 0 }, path, 6), stepM, gridM),
    [terrain, path, cx, cy, stepM, gridM],
  );
  useEffect(
    () => () => {
      buffers.geometry.dispose();
      buffers.grid.dispose();
    },
    [buffers],
  );
  return (
    <group name="terrain">
      <mesh geometry={buffers.geometry} receiveShadow>
        <meshLambertMaterial vertexColors polygonOffset polygonOffsetFactor={1} polygonOffsetUnits={1} />
      </mesh>
      <lineSegments geometry={buffers.grid}>
        <lineBasicMaterial color="#3b3328" transparent opacity={0.45} />
      </lineSegments>
    </group>
  );
}
