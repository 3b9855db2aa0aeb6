import { useRef } from 'react';
import { pathDrawHandles, pathDrawStore, usePathDraw } from './PathDrawState';
import { drawnLineColour } from './PathDraw';

/**
 * The points of the drawn lines as DOM markers over the 3D view (placed by PathDraw each frame):
 * large enough to touch, dragged (mouse, pen or finger) to move the point over the ground; a
 * double click (or Delete on a focused marker) removes the point.
 */
export function PathDrawMarkers() {
  const lines = usePathDraw((s) => s.lines);
  return (
    <div className="path-markers">
      {lines.flatMap((l, i) => l.points.map((_, k) => <Marker key={`${i}:${k}`} line={i} point={k} count={l.points.length} name={l.name} />))}
    </div>
  );
}

function Marker({ line, point, count, name }: { line: number; point: number; count: number; name: string }) {
  const key = `${line}:${point}`;
  const dragging = useRef(false);
  const where = point === 0 ? 'start' : point === count - 1 ? 'end' : `point ${point + 1}`;
  return (
    <div
      className="path-point"
      data-testid="path-point"
      data-line={line}
      data-point={point}
      data-end={point === 0 ? 'from' : point === count - 1 ? 'to' : 'via'}
      tabIndex={0}
      role="button"
      aria-label={`${name}, ${where}: drag to move, double-click or Delete to remove`}
      title={`${name}, ${where}: drag to move; double-click to remove`}
      style={{ borderColor: drawnLineColour(line), visibility: 'hidden' }}
      ref={(el) => {
        if (el) {
          pathDrawHandles.markers.set(key, el);
          pathDrawHandles.invalidate();
        } else pathDrawHandles.markers.delete(key);
      }}
      onPointerDown={(e) => {
        e.stopPropagation();
        e.preventDefault();
        dragging.current = true;
        pathDrawStore.getState().setDragging(true);
        e.currentTarget.setPointerCapture(e.pointerId);
      }}
      onPointerMove={(e) => {
        if (!dragging.current) return;
        const p = pathDrawHandles.hitAt?.(e.clientX, e.clientY);
        if (p) pathDrawStore.getState().movePoint(line, point, p);
      }}
      onPointerUp={(e) => {
        dragging.current = false;
        pathDrawStore.getState().setDragging(false);
        if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
      }}
      onPointerCancel={() => {
        dragging.current = false;
        pathDrawStore.getState().setDragging(false);
      }}
      onDoubleClick={(e) => {
        e.stopPropagation();
        pathDrawStore.getState().removePoint(line, point);
      }}
      onKeyDown={(e) => {
        if (e.key === 'Delete' || e.key === 'Backspace') {
          e.preventDefault();
          pathDrawStore.getState().removePoint(line, point);
        }
      }}
    >
      {point === 0 ? line + 1 : point === count - 1 ? '›' : '·'}
    </div>
  );
}
