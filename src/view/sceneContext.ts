/**
 * Shared, non-reactive scene handles: what the pointer may grab, where the wheel labels sit, and
 * the camera presets. Created once per <Scene>.
 */
import { createContext, useContext } from 'react';
import type * as THREE from 'three';

export type ViewPreset = 'front' | 'side' | 'above' | 'corner';

export interface SceneApi {
  /** Meshes that start a vehicle drag when pressed. */
  readonly grabbable: THREE.Object3D[];
  /** Label elements per wheel (FL, FR, RL, RR), placed each frame by <LabelProjector>. */
  readonly labels: (HTMLElement | null)[];
  /** Anchor of each label in the terrain frame (m), written by <Wheel>. */
  readonly labelAnchors: Float64Array;
  /** The tip-edge label (DOM) and its anchor, the edge's midpoint in the terrain frame (m); written by <TipEdge>. */
  tipLabel: HTMLElement | null;
  readonly tipAnchor: Float64Array;
  /** Set by <CameraRig>: move the camera to a preset view of the vehicle. */
  view: (preset: ViewPreset) => void;
  /** Set by <CameraRig>: ask for one frame. */
  invalidate: () => void;
  /** Set by <CameraRig>: the camera's position and the point it orbits (world frame), for tests and the benchmark. */
  cameraState: () => { position: [number, number, number]; target: [number, number, number] } | null;
  /** Set by <TipEdge>: whether the tip edge is drawn, its tyres and ends (terrain frame, m), for tests. */
  tipEdgeState: () => { visible: boolean; edge: string; fromM: readonly number[]; toM: readonly number[] } | null;
  /** Frame statistics for the benchmark script (window.__plumbline). */
  readonly stats: { frames: number; dragEvents: number; dragMs: number; firstFrameMs: number | null };
}

export function makeSceneApi(): SceneApi {
  return {
    grabbable: [],
    labels: [null, null, null, null],
    labelAnchors: new Float64Array(12),
    tipLabel: null,
    tipAnchor: new Float64Array(3),
    view: () => undefined,
    invalidate: () => undefined,
    cameraState: () => null,
    tipEdgeState: () => null,
    stats: { frames: 0, dragEvents: 0, dragMs: 0, firstFrameMs: null },
  };
}

export const SceneContext = createContext<SceneApi | null>(null);

export function useSceneApi(): SceneApi {
  const api = useContext(SceneContext);
  if (!api) throw new Error('view: useSceneApi must be inside <Scene>');
  return api;
}
