/**
 * Candidate lines drawn on the ground in the 3D view: each a named polyline (clicked points in
 * driving order), shared by the scene (drawing, markers) and the path panel, and kept in the
 * scenario as its saved candidate lines (`candidates`; the panel writes them there). One store per
 * page; plain data, no three.js. The pure ray–terrain intersection used for the clicks is here too,
 * so it can be tested without a browser.
 */
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import { SCENARIO_LIMITS, polylinePath, type CandidateLine, type PathSpec } from '../core';

export type XY = readonly [number, number];

export interface DrawnLine {
  readonly name: string;
  /** Points in driving order; a line with fewer than two is still being drawn. */
  readonly points: readonly XY[];
}

export interface PathDrawState {
  /** Clicks on the ground place points (the view does not orbit on a left press while this is on). */
  readonly drawing: boolean;
  readonly lines: readonly DrawnLine[];
  /** The line clicks add to; null: the next click starts a new line. */
  readonly active: number | null;
  /** A point marker is being dragged (the scenario is written when it is let go). */
  readonly dragging: boolean;
  setDrawing(on: boolean): void;
  /** A click: adds a point to the line being drawn, or starts a new one. */
  addPoint(p: XY): void;
  /** A press dragged from a to b: a whole new two-point line (the line being drawn is finished). */
  addLine(a: XY, b: XY): void;
  movePoint(line: number, point: number, p: XY): void;
  removePoint(line: number, point: number): void;
  /** The line being drawn is done: the next click starts a new line. */
  finishLine(): void;
  /** Clicks add to this line again (at its end). */
  continueLine(line: number): void;
  rename(line: number, name: string): void;
  removeLine(line: number): void;
  setDragging(on: boolean): void;
  /** Replace every line (from the scenario's saved lines); none is being drawn then. */
  setLines(lines: readonly DrawnLine[]): void;
}

/** "Line n" with the smallest n not yet used. */
export function freeLineName(lines: readonly DrawnLine[]): string {
  const used = new Set(lines.map((l) => l.name));
  let n = lines.length + 1;
  for (let k = 1; k <= lines.length + 1; k++) {
    if (!used.has(`Line ${k}`)) {
      n = k;
      break;
    }
  }
  return `Line ${n}`;
}

export function createPathDrawStore() {
  const replaceLine = (lines: readonly DrawnLine[], i: number, l: DrawnLine) => lines.map((x, k) => (k === i ? l : x));
  return createStore<PathDrawState>((set, get) => ({
    drawing: false,
    lines: [],
    active: null,
    dragging: false,
    setDrawing: (on) => set(on ? { drawing: true } : { drawing: false, active: null }),
    addPoint: (p) => {
      const { lines, active } = get();
      const l = active === null ? undefined : lines[active];
      if (l) {
        const last = l.points[l.points.length - 1];
        // A second click on the same spot adds no leg of length 0; a full line takes no more points.
        if ((last && last[0] === p[0] && last[1] === p[1]) || l.points.length >= SCENARIO_LIMITS.pathPoints) return;
        set({ lines: replaceLine(lines, active!, { name: l.name, points: [...l.points, p] }) });
      } else if (lines.length < SCENARIO_LIMITS.candidates) {
        set({ lines: [...lines, { name: freeLineName(lines), points: [p] }], active: lines.length });
      }
    },
    addLine: (a, b) => {
      const lines = get().lines;
      if (lines.length >= SCENARIO_LIMITS.candidates) return;
      set({ lines: [...lines, { name: freeLineName(lines), points: [a, b] }], active: null });
    },
    movePoint: (line, point, p) => {
      const l = get().lines[line];
      if (!l || point < 0 || point >= l.points.length) return;
      set({ lines: replaceLine(get().lines, line, { name: l.name, points: l.points.map((q, k) => (k === point ? p : q)) }) });
    },
    removePoint: (line, point) => {
      const { lines, active } = get();
      const l = lines[line];
      if (!l) return;
      const points = l.points.filter((_, k) => k !== point);
      if (points.length === 0) {
        set({ lines: lines.filter((_, k) => k !== line), active: active === null || active === line ? null : active > line ? active - 1 : active });
      } else set({ lines: replaceLine(lines, line, { name: l.name, points }) });
    },
    finishLine: () => set({ active: null }),
    continueLine: (line) => set(get().lines[line] ? { active: line, drawing: true } : {}),
    rename: (line, name) => {
      const l = get().lines[line];
      if (l) set({ lines: replaceLine(get().lines, line, { name, points: l.points }) });
    },
    removeLine: (line) => {
      const { lines, active } = get();
      set({ lines: lines.filter((_, i) => i !== line), active: active === null || active === line ? null : active > line ? active - 1 : active });
    },
    setDragging: (on) => set({ dragging: on }),
    setLines: (lines) => set({ lines, active: null }),
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
  /** Marker elements by "line:point". */
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

/** Whether a drawn line can be run: two or more points, each apart from the one before. */
export function lineComplete(l: DrawnLine): boolean {
  if (l.points.length < 2) return false;
  for (let i = 1; i < l.points.length; i++) {
    if (Math.hypot(l.points[i][0] - l.points[i - 1][0], l.points[i][1] - l.points[i - 1][1]) < 1e-6) return false;
  }
  return true;
}

/** A drawn line as a pass path (its points at the step; heading along each leg), or null while it cannot be run. */
export function lineToPath(l: DrawnLine, stepM: number): PathSpec | null {
  return lineComplete(l) ? polylinePath(l.points, stepM) : null;
}

/** The lines that can be run, as the scenario's saved candidate lines. */
export function linesToCandidates(lines: readonly DrawnLine[]): CandidateLine[] {
  return lines.filter(lineComplete).map((l) => ({ name: l.name, pointsM: l.points }));
}

/** The scenario's saved lines as drawn lines. */
export function candidatesToLines(c: readonly CandidateLine[] | undefined): DrawnLine[] {
  return (c ?? []).map((l) => ({ name: l.name, points: l.pointsM }));
}

/** Same names and points, in the same order. */
export function sameCandidates(a: readonly CandidateLine[] | undefined, b: readonly CandidateLine[] | undefined): boolean {
  const x = a ?? [];
  const y = b ?? [];
  if (x.length !== y.length) return false;
  for (let i = 0; i < x.length; i++) {
    if (x[i].name !== y[i].name || x[i].pointsM.length !== y[i].pointsM.length) return false;
    for (let k = 0; k < x[i].pointsM.length; k++) {
      if (x[i].pointsM[k][0] !== y[i].pointsM[k][0] || x[i].pointsM[k][1] !== y[i].pointsM[k][1]) return false;
    }
  }
  return true;
}
