import { useEffect, useRef, type ComponentRef } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import { OrbitControls } from '@react-three/drei/core/OrbitControls';
import * as THREE from 'three';
import { usePlumbStore } from '../store/react';
import { shownPose } from '../store/store';
import { drawnResult } from './tipState';
import { RAD_PER_DEG as DEG } from '../present/units';
import { useSceneApi, type ViewPreset } from './sceneContext';

export interface CameraRigProps {
  /** Starting distance from the vehicle (m). */
  distanceM?: number;
  minDistanceM?: number;
  maxDistanceM?: number;
}

const _ray = new THREE.Raycaster();
const _ndc = new THREE.Vector2();
const _inv = new THREE.Matrix4();
const _o = new THREE.Vector3();
const _dir = new THREE.Vector3();
const _hit = new THREE.Vector3();

/**
 * The camera: drei's OrbitControls (three's orbit controls: left drag or one finger orbits, right
 * drag, Ctrl + drag or two fingers pan, the wheel or a pinch zooms), never below the ground's
 * horizon. Pressing the vehicle body instead drags the vehicle over the terrain (Shift + drag
 * turns it): this listener sits on the canvas in the capture phase, so it sees the press before
 * the controls (on the same element or its parent) and switches them off for that drag. Every
 * move asks for one frame; a vehicle move re-solves (warm-started) at once.
 */
export function CameraRig({ distanceM = 10, minDistanceM = 2, maxDistanceM = 80 }: CameraRigProps) {
  const api = useSceneApi();
  const store = usePlumbStore();
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);
  const scene = useThree((s) => s.scene);
  const invalidate = useThree((s) => s.invalidate);
  const controls = useRef<ComponentRef<typeof OrbitControls>>(null);

  useEffect(() => {
    const el = gl.domElement;
    const c = controls.current;
    if (!c) return;
    camera.up.set(0, 0, 1);
    const table = (): THREE.Object3D | undefined => scene.getObjectByName('tilt-table');

    /** Camera at (radius, azimuth theta, polar phi from straight up) about the target. */
    const place = (theta: number, phi: number, radius: number): void => {
      const sp = Math.sin(phi);
      camera.position.set(c.target.x + radius * sp * Math.cos(theta), c.target.y + radius * sp * Math.sin(theta), c.target.z + radius * Math.cos(phi));
      camera.lookAt(c.target);
      c.update();
      invalidate();
    };

    /** The vehicle's reference point, in world (tilted) coordinates. */
    const vehicleTarget = (out: THREE.Vector3): THREE.Vector3 => {
      // The vehicle as drawn: at the tip when the pose does not stand (tipState.ts).
      const c3 = drawnResult(store.getState()).body.cgWorld;
      out.set(c3[0], c3[1], c3[2] * 0.5);
      const t = table();
      if (t) {
        t.updateMatrixWorld(true);
        out.applyMatrix4(t.matrixWorld);
      }
      return out;
    };

    api.invalidate = invalidate;
    api.cameraState = () => ({ position: [camera.position.x, camera.position.y, camera.position.z], target: [c.target.x, c.target.y, c.target.z] });
    api.view = (preset: ViewPreset) => {
      const h = shownPose(store.getState()).headingRad;
      vehicleTarget(c.target);
      switch (preset) {
        case 'front':
          place(h, 82 * DEG, 9);
          break;
        case 'side':
          place(h + Math.PI / 2, 82 * DEG, 10);
          break;
        case 'above':
          place(h - Math.PI / 2, 0.5 * DEG, 11);
          break;
        case 'corner':
          place(h + 40 * DEG, 62 * DEG, Math.min(maxDistanceM, Math.max(minDistanceM, distanceM * 0.95)));
          break;
      }
    };
    api.view('corner');

    let dragging: 'none' | 'drag' | 'turn' = 'none';
    const grab = { planeZ: 0, hitX: 0, hitY: 0, poseX: 0, poseY: 0, angle0: 0, heading0: 0 };

    // Follow the vehicle when its shown pose moves other than by a drag (a pass station, a typed
    // pose): target and camera move by the same step, so the view keeps its angle and distance.
    let followed = shownPose(store.getState());
    const unfollow = store.subscribe((st) => {
      const p = shownPose(st);
      if (p === followed) return;
      const prev = followed;
      followed = p;
      if (dragging !== 'none') return;
      const t = table();
      _o.set(prev.xM, prev.yM, 0);
      _hit.set(p.xM, p.yM, 0);
      if (t) {
        t.updateMatrixWorld(true);
        _o.applyMatrix4(t.matrixWorld);
        _hit.applyMatrix4(t.matrixWorld);
      }
      _hit.sub(_o);
      c.target.add(_hit);
      camera.position.add(_hit);
      c.update();
      invalidate();
    });

    const setRay = (e: PointerEvent): void => {
      const r = el.getBoundingClientRect();
      _ndc.set(((e.clientX - r.left) / r.width) * 2 - 1, -((e.clientY - r.top) / r.height) * 2 + 1);
      _ray.setFromCamera(_ndc, camera);
    };

    /** Pointer ray meets the plane z = planeZ of the terrain frame; false if parallel. */
    const terrainHit = (e: PointerEvent, planeZ: number, out: THREE.Vector3): boolean => {
      setRay(e);
      const t = table();
      _inv.identity();
      if (t) _inv.copy(t.matrixWorld).invert();
      _o.copy(_ray.ray.origin).applyMatrix4(_inv);
      _dir.copy(_ray.ray.direction).transformDirection(_inv);
      if (Math.abs(_dir.z) < 1e-6) return false;
      const s = (planeZ - _o.z) / _dir.z;
      if (s <= 0) return false;
      out.copy(_o).addScaledVector(_dir, s);
      return true;
    };

    const onDown = (e: PointerEvent): void => {
      if (e.button !== 0 || e.ctrlKey || e.metaKey || !e.isPrimary) return;
      setRay(e);
      const hits = _ray.intersectObjects(api.grabbable, false);
      if (hits.length === 0) return; // the controls orbit
      const t = table();
      _inv.identity();
      if (t) _inv.copy(t.matrixWorld).invert();
      _hit.copy(hits[0].point).applyMatrix4(_inv);
      const pose = store.getState().scenario.pose;
      grab.planeZ = _hit.z;
      grab.hitX = _hit.x;
      grab.hitY = _hit.y;
      grab.poseX = pose.xM;
      grab.poseY = pose.yM;
      grab.heading0 = pose.headingRad;
      grab.angle0 = Math.atan2(_hit.y - pose.yM, _hit.x - pose.xM);
      dragging = e.shiftKey ? 'turn' : 'drag';
      // Switched off now, the controls ignore this press.
      c.enabled = false;
      store.getState().beginDrag();
      el.setPointerCapture(e.pointerId);
      el.style.cursor = 'grabbing';
    };

    const onMove = (e: PointerEvent): void => {
      if (dragging === 'none' || !terrainHit(e, grab.planeZ, _hit)) return;
      const t0 = performance.now();
      const st = store.getState();
      if (dragging === 'drag') {
        st.setPose({ xM: grab.poseX + (_hit.x - grab.hitX), yM: grab.poseY + (_hit.y - grab.hitY) }, false);
      } else {
        const a = Math.atan2(_hit.y - grab.poseY, _hit.x - grab.poseX);
        st.setPose({ headingRad: grab.heading0 + (a - grab.angle0) }, false);
      }
      api.stats.dragEvents++;
      api.stats.dragMs += performance.now() - t0;
    };

    const onUp = (e: PointerEvent): void => {
      if (dragging === 'none') return;
      store.getState().endDrag();
      el.style.cursor = '';
      dragging = 'none';
      c.enabled = true;
      if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
    };
    const onMenu = (e: Event): void => e.preventDefault();

    // Capture: seen before the controls' own listener, on the canvas or on its parent.
    el.addEventListener('pointerdown', onDown, { capture: true });
    el.addEventListener('pointermove', onMove);
    el.addEventListener('pointerup', onUp);
    el.addEventListener('pointercancel', onUp);
    el.addEventListener('contextmenu', onMenu);
    el.style.touchAction = 'none';
    return () => {
      unfollow();
      el.removeEventListener('pointerdown', onDown, { capture: true });
      el.removeEventListener('pointermove', onMove);
      el.removeEventListener('pointerup', onUp);
      el.removeEventListener('pointercancel', onUp);
      el.removeEventListener('contextmenu', onMenu);
    };
  }, [api, store, camera, gl, scene, invalidate, distanceM, minDistanceM, maxDistanceM]);

  useFrame(() => {
    api.stats.frames++;
    if (api.stats.firstFrameMs === null) api.stats.firstFrameMs = performance.now();
  });
  return (
    <OrbitControls
      ref={controls}
      enableDamping={false}
      minDistance={minDistanceM}
      maxDistance={maxDistanceM}
      minPolarAngle={0.5 * DEG}
      maxPolarAngle={89.5 * DEG}
      zoomSpeed={0.8}
    />
  );
}
