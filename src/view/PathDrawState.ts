/**
 * Candidate lines drawn on the ground in the 3D view: each a start and an end (the scenario's path
 * is a straight line from → to), shared by the scene (drawing, markers) and the path panel. One
 * store per page; plain data, no three.js. The pure ray–terrain intersection used for the clicks
 * is here too, so it can be tested without a browser.
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { PathSpec } from '../core';

export type XY = readonly [number, number];

export interface DrawnLine {
  readonly from: XY;
  /** Null while only the start has been placed. */
  readonly to: XY | null;
}

export interface PathDrawState {
  /** Clicks on the ground place points (the view does not orbit on a left press while this is on). */
  readonly drawing: boolean;
  readonly lines: readonly DrawnLine[];
  setDrawing(on: boolean): void;
  /** A click: ends the open line, or starts a new one. */
  addPoint(p: XY): void;
  /** A press dragged from a to b: a whole new line (when no line is open). */
  addLine(a: XY, b: XY): void;
  movePoint(line: number, end: 'from' | 'to', p: XY): void;
  removeLine(line: number): void;
  setLines(lines: readonly DrawnLine[]): void;
}

export function createPathDrawStore() {
  return createStore<PathDrawState>((set, get) => ({
    drawing: false,
    lines: [],
    setDrawing: (on) => set({ drawing: on }),
    addPoint: (p) => {
      const lines = get().lines;
      const last = lines[lines.length - 1];
      if (last && last.to === null) set({ lines: [...lines.slice(0, -1), { from: last.from, to: p }] });
      else set({ lines: [...lines, { from: p, to: null }] });
    },
    addLine: (a, b) => {
      const lines = get().lines;
      const last = lines[lines.length - 1];
      if (last && last.to === null) set({ lines: [...lines.slice(0, -1), { from: last.from, to: b }] });
      else set({ lines: [...lines, { from: a, to: b }] });
    },
    movePoint: (line, end, p) =>
      set({ lines: get().lines.map((l, i) => (i !== line ? l : end === 'from' ? { from: p, to: l.to } : { from: l.from, to: p })) }),
    removeLine: (line) => set({ lines: get().lines.filter((_, i) => i !== line) }),
    setLines: (lines) => set({ lines }),
  }));
}

/** The page's drawing store. */
export const pathDrawStore = createPathDrawStore();

export function usePathDraw<T>(selector: (s: PathDrawState) => T): T {
  return useStore(pathDrawStore, selector);
}

/**
 * Handles the scene fills in for the DOM markers: where a screen point meets the ground, and the
 * marker elements to place each frame.
 */
export const pathDrawHandles: {
  /** Terrain-frame ground point under a client (page) position, or null (sky, or no scene). */
  hitAt: ((clientX: number, clientY: number) => XY | null) | null;
  /** Marker elements by "line:end". */
  readonly markers: Map<string, HTMLElement>;
  /** Ask the scene for one frame (markers are placed when a frame is drawn). */
  invalidate: () => void;
} = { hitAt: null, markers: new Map(), invalidate: () => undefined };

/**
 * First point where a ray (terrain frame, origin o, unit direction d) meets the ground z = h(x, y):
 * marched in steps of stepM up to maxM, then bisected to toleranceM. Null when it never goes below
 * the ground (the sky), or starts below it.
 */
export function rayGroundHit(
  height: (x: number, y: number) => number,
  o: readonly [number, number, number],
  d: readonly [number, number, number],
  stepM = 0.05,
  maxM = 400,
  toleranceM = 1e-4,
): [number, number, number] | null {
  const above = (t: number) => o[2] + t * d[2] - height(o[0] + t * d[0], o[1] + t * d[1]);
  if (above(0) < 0) return null;
  let t0 = 0;
  for (let t = stepM; t <= maxM; t += stepM) {
    if (above(t) <= 0) {
      let a = t0;
      let b = t;
      while (b - a > toleranceM) {
        const m = 0.5 * (a + b);
        if (above(m) > 0) a = m;
        else b = m;
      }
      const s = 0.5 * (a + b);
      return [o[0] + s * d[0], o[1] + s * d[1], o[2] + s * d[2]];
    }
    t0 = t;
  }
  return null;
}

/** A drawn line as the scenario's path (from, to, step; heading along the line). */
export function lineToPath(l: DrawnLine, stepM: number): PathSpec | null {
  if (!l.to) return null;
  if (Math.hypot(l.to[0] - l.from[0], l.to[1] - l.from[1]) < 1e-6) return null;
  return { fromM: [l.from[0], l.from[1]], toM: [l.to[0], l.to[1]], stepM, headingRad: null };
}
