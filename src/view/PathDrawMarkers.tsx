import { useRef } from 'react';
import { pathDrawHandles, pathDrawStore, usePathDraw } from './PathDrawState';
import { drawnLineColour } from './PathDraw';

/**
 * The ends of the drawn lines as DOM markers over the 3D view (placed by PathDraw each frame):
 * large enough to touch, dragged (mouse, pen or finger) to move the point over the ground.
 */
export function PathDrawMarkers() {
  const lines = usePathDraw((s) => s.lines);
  return (
    <div className="path-markers">
      {lines.flatMap((l, i) =>
        (['from', 'to'] as const)
          .filter((end) => end === 'from' || l.to !== null)
          .map((end) => <Marker key={`${i}:${end}`} line={i} end={end} />),
      )}
    </div>
  );
}

function Marker({ line, end }: { line: number; end: 'from' | 'to' }) {
  const key = `${line}:${end}`;
  const dragging = useRef(false);
  return (
    <div
      className="path-point"
      data-testid="path-point"
      data-line={line}
      data-end={end}
      title={`Line ${line + 1}, ${end === 'from' ? 'start' : 'end'}: drag to move`}
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
        e.currentTarget.setPointerCapture(e.pointerId);
      }}
      onPointerMove={(e) => {
        if (!dragging.current) return;
        const p = pathDrawHandles.hitAt?.(e.clientX, e.clientY);
        if (p) pathDrawStore.getState().movePoint(line, end, p);
      }}
      onPointerUp={(e) => {
        dragging.current = false;
        if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
      }}
    >
      {end === 'from' ? line + 1 : '›'}
    </div>
  );
}
