import { useEffect, useRef } from 'react';
import { useFrame, useThree } from '@react-three/fiber';
import * as THREE from 'three';
import { usePlumbStore } from '../store/react';
import { shownPose, shownResult } from '../store/store';
import { useSceneApi, type ViewPreset } from './sceneContext';

export interface CameraRigProps {
  /** Starting distance from the vehicle (m). */
  distanceM?: number;
  minDistanceM?: number;
  maxDistanceM?: number;
}

type Mode = 'none' | 'orbit' | 'pan' | 'drag' | 'turn';

const _ray = new THREE.Raycaster();
const _ndc = new THREE.Vector2();
const _inv = new THREE.Matrix4();
const _o = new THREE.Vector3();
const _dir = new THREE.Vector3();
const _hit = new THREE.Vector3();
const _right = new THREE.Vector3();
const _upv = new THREE.Vector3();
const _off = new THREE.Vector3();
const DEG = Math.PI / 180;

/**
 * Pointer input for the scene, written here rather than taken from a controls library so the two
 * uses of a press do not fight: pressing the vehicle body drags the vehicle over the terrain
 * (Shift + drag turns it), pressing anywhere else orbits; right button or Ctrl + drag pans; the
 * wheel zooms. Every move asks for one frame; a vehicle move re-solves (warm-started) at once.
 */
export function CameraRig({ distanceM = 10, minDistanceM = 2, maxDistanceM = 80 }: CameraRigProps) {
  const api = useSceneApi();
  const store = usePlumbStore();
  const camera = useThree((s) => s.camera);
  const gl = useThree((s) => s.gl);
  const scene = useThree((s) => s.scene);
  const invalidate = useThree((s) => s.invalidate);
  const orbit = useRef({ target: new THREE.Vector3(), radius: distanceM, theta: 0, phi: 1.1 });

  useEffect(() => {
    const el = gl.domElement;
    const o = orbit.current;
    camera.up.set(0, 0, 1);
    const table = (): THREE.Object3D | undefined => scene.getObjectByName('tilt-table');

    const place = (): void => {
      const sp = Math.sin(o.phi);
      camera.position.set(
        o.target.x + o.radius * sp * Math.cos(o.theta),
        o.target.y + o.radius * sp * Math.sin(o.theta),
        o.target.z + o.radius * Math.cos(o.phi),
      );
      camera.lookAt(o.target);
      camera.updateMatrixWorld();
      invalidate();
    };

    /** The vehicle's reference point, in world (tilted) coordinates. */
    const vehicleTarget = (out: THREE.Vector3): THREE.Vector3 => {
      const st = store.getState();
      const c = shownResult(st).body.cgWorld;
      out.set(c[0], c[1], c[2] * 0.5);
      const t = table();
      if (t) {
        t.updateMatrixWorld(true);
        out.applyMatrix4(t.matrixWorld);
      }
      return out;
    };

    api.invalidate = invalidate;
    api.view = (preset: ViewPreset) => {
      const h = shownPose(store.getState()).headingRad;
      vehicleTarget(o.target);
      switch (preset) {
        case 'front':
          o.theta = h;
          o.phi = 82 * DEG;
          o.radius = 9;
          break;
        case 'side':
          o.theta = h + Math.PI / 2;
          o.phi = 82 * DEG;
          o.radius = 10;
          break;
        case 'above':
          o.theta = h - Math.PI / 2;
          o.phi = 0.5 * DEG;
          o.radius = 11;
          break;
        case 'corner':
          o.theta = h + 40 * DEG;
          o.phi = 62 * DEG;
          o.radius = 9.5;
          break;
      }
      place();
    };
    api.view('corner');

    let mode: Mode = 'none';
    let lastX = 0;
    let lastY = 0;
    const grab = { planeZ: 0, hitX: 0, hitY: 0, poseX: 0, poseY: 0, angle0: 0, heading0: 0 };

    // Follow the vehicle when its shown pose moves other than by a drag (a pass station, a typed
    // pose): the target moves by the same step, so the view keeps its angle and distance.
    let followed = shownPose(store.getState());
    const unfollow = store.subscribe((st) => {
      const p = shownPose(st);
      if (p === followed) return;
      const prev = followed;
      followed = p;
      if (mode === 'drag' || mode === 'turn') return;
      const t = table();
      _o.set(prev.xM, prev.yM, 0);
      _hit.set(p.xM, p.yM, 0);
      if (t) {
        t.updateMatrixWorld(true);
        _o.applyMatrix4(t.matrixWorld);
        _hit.applyMatrix4(t.matrixWorld);
      }
      o.target.add(_hit.sub(_o));
      place();
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
      lastX = e.clientX;
      lastY = e.clientY;
      if (e.button === 0 && !e.ctrlKey && !e.metaKey) {
        setRay(e);
        const hits = _ray.intersectObjects(api.grabbable, false);
        if (hits.length > 0) {
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
          mode = e.shiftKey ? 'turn' : 'drag';
          store.getState().beginDrag();
          el.setPointerCapture(e.pointerId);
          el.style.cursor = 'grabbing';
          return;
        }
        mode = 'orbit';
      } else {
        mode = 'pan';
      }
      el.setPointerCapture(e.pointerId);
    };

    const onMove = (e: PointerEvent): void => {
      if (mode === 'none') {
        return;
      }
      const dx = e.clientX - lastX;
      const dy = e.clientY - lastY;
      lastX = e.clientX;
      lastY = e.clientY;
      if (mode === 'orbit') {
        o.theta -= dx * 0.008;
        o.phi = Math.min(89.5 * DEG, Math.max(0.5 * DEG, o.phi - dy * 0.008));
        place();
      } else if (mode === 'pan') {
        const k = (o.radius * 0.0016);
        _right.setFromMatrixColumn(camera.matrixWorld, 0);
        _upv.setFromMatrixColumn(camera.matrixWorld, 1);
        _off.copy(_right).multiplyScalar(-dx * k).addScaledVector(_upv, dy * k);
        o.target.add(_off);
        place();
      } else if (terrainHit(e, grab.planeZ, _hit)) {
        const t0 = performance.now();
        const st = store.getState();
        if (mode === 'drag') {
          st.setPose({ xM: grab.poseX + (_hit.x - grab.hitX), yM: grab.poseY + (_hit.y - grab.hitY) }, false);
        } else {
          const a = Math.atan2(_hit.y - grab.poseY, _hit.x - grab.poseX);
          st.setPose({ headingRad: grab.heading0 + (a - grab.angle0) }, false);
        }
        api.stats.dragEvents++;
        api.stats.dragMs += performance.now() - t0;
      }
    };

    const onUp = (e: PointerEvent): void => {
      if (mode === 'drag' || mode === 'turn') {
        store.getState().endDrag();
        el.style.cursor = '';
      }
      mode = 'none';
      if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
    };

    const onWheel = (e: WheelEvent): void => {
      e.preventDefault();
      o.radius = Math.min(maxDistanceM, Math.max(minDistanceM, o.radius * Math.exp(e.deltaY * 0.001)));
      place();
    };
    const onMenu = (e: Event): void => e.preventDefault();

    el.addEventListener('pointerdown', onDown);
    el.addEventListener('pointermove', onMove);
    el.addEventListener('pointerup', onUp);
    el.addEventListener('pointercancel', onUp);
    el.addEventListener('wheel', onWheel, { passive: false });
    el.addEventListener('contextmenu', onMenu);
    el.style.touchAction = 'none';
    return () => {
      unfollow();
      el.removeEventListener('pointerdown', onDown);
      el.removeEventListener('pointermove', onMove);
      el.removeEventListener('pointerup', onUp);
      el.removeEventListener('pointercancel', onUp);
      el.removeEventListener('wheel', onWheel);
      el.removeEventListener('contextmenu', onMenu);
    };
  }, [api, store, camera, gl, scene, invalidate, minDistanceM, maxDistanceM]);

  useFrame(() => {
    api.stats.frames++;
    if (api.stats.firstFrameMs === null) api.stats.firstFrameMs = performance.now();
  });
  return null;
}
