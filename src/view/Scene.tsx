import { useEffect, useMemo } from 'react';
import { Canvas } from '@react-three/fiber';
import { Axles } from './Axles';
import { CameraRig } from './CameraRig';
import { LabelProjector } from './LabelProjector';
import { LoadColumn } from './LoadColumn';
import { GhostVehicle } from './GhostVehicle';
import { LoadLegend } from './LoadLegend';
import { PathLine } from './PathLine';
import { PathDraw } from './PathDraw';
import { HeadingRose } from './HeadingRose';
import { SceneHelp } from './SceneHelp';
import { PathDrawMarkers } from './PathDrawMarkers';
import { PlumbLine } from './PlumbLine';
import { SceneContext, makeSceneApi, type SceneApi, type ViewPreset } from './sceneContext';
import { SupportPolygon } from './SupportPolygon';
import { TerrainMesh } from './TerrainMesh';
import { TiltTable } from './TiltTable';
import { TipEdge } from './TipEdge';
import { TipEdgeNote } from './TipEdgeNote';
import { VehicleBody } from './VehicleBody';
import { Wheel } from './Wheel';
import { WheelLabel } from './WheelLabel';

export interface SceneProps {
  /** Receives the scene handles (camera presets, frame statistics) once created. */
  onApi?: (api: SceneApi) => void;
}

const PRESETS: readonly [ViewPreset, string][] = [
  ['front', 'Front'],
  ['side', 'Side'],
  ['above', 'Above'],
  ['corner', 'Corner'],
];

/** The 3D view: tilt table with terrain and vehicle, loads, CG and plumb line, support polygon. */
export function Scene({ onApi }: SceneProps) {
  const api = useMemo(makeSceneApi, []);
  useEffect(() => {
    onApi?.(api);
  }, [api, onApi]);
  return (
    <SceneContext.Provider value={api}>
      <div className="scene" data-testid="scene">
        <Canvas
          frameloop="demand"
          gl={{ preserveDrawingBuffer: true, antialias: false }}
          camera={{ fov: 45, near: 0.05, far: 500, position: [8, 6, 5], up: [0, 0, 1] }}
          dpr={1}
        >
          <SceneContext.Provider value={api}>
            <color attach="background" args={['#dfe6ec']} />
            <hemisphereLight args={['#ffffff', '#6b5d4a', 1.4]} position={[0, 0, 1]} />
            <directionalLight position={[6, 4, 12]} intensity={1.6} />
            <TiltTable>
              <TerrainMesh />
              <VehicleBody />
              <Axles />
              {[0, 1, 2, 3].map((i) => (
                <Wheel key={i} index={i} />
              ))}
              {[0, 1, 2, 3].map((i) => (
                <LoadColumn key={i} index={i} />
              ))}
              <SupportPolygon />
              <TipEdge />
              <PlumbLine />
              <GhostVehicle />
              <PathLine />
              <PathDraw />
              <HeadingRose />
            </TiltTable>
            <CameraRig />
            <LabelProjector />
          </SceneContext.Provider>
        </Canvas>
        <div className="scene-labels">
          {[0, 1, 2, 3].map((i) => (
            <WheelLabel key={i} index={i} />
          ))}
        </div>
        <TipEdgeNote />
        <PathDrawMarkers />
        <div className="view-buttons" role="group" aria-label="Preset views">
          {PRESETS.map(([p, label]) => (
            <button key={p} type="button" data-testid={`view-${p}`} onClick={() => api.view(p)}>
              {label}
            </button>
          ))}
        </div>
        <LoadLegend />
        <SceneHelp />
      </div>
    </SceneContext.Provider>
  );
}
