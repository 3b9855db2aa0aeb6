/**
 * Which input the user is on: a finger ('touch'), a pen, or a mouse. Starts from the primary
 * pointer's media feature (pointer: coarse ⇒ touch) and follows the last pointer pressed, so hints
 * match what is in the hand (a tablet with a mouse plugged in gets the mouse hints once it is used).
 */
import { useEffect, useState } from 'react';

export type InputKind = 'touch' | 'pen' | 'mouse';

export function initialInputKind(): InputKind {
  if (typeof window === 'undefined' || typeof window.matchMedia !== 'function') return 'mouse';
  return window.matchMedia('(pointer: coarse)').matches ? 'touch' : 'mouse';
}

export function inputKindOf(pointerType: string): InputKind {
  return pointerType === 'touch' ? 'touch' : pointerType === 'pen' ? 'pen' : 'mouse';
}

export function useInputKind(): InputKind {
  const [kind, setKind] = useState<InputKind>(initialInputKind);
  useEffect(() => {
    const on = (e: PointerEvent) => setKind(inputKindOf(e.pointerType));
    window.addEventListener('pointerdown', on, { capture: true, passive: true });
    return () => window.removeEventListener('pointerdown', on, { capture: true });
  }, []);
  return kind;
}

/** The 3D view's hint for an input kind. */
export function sceneHint(kind: InputKind): string {
  if (kind === 'mouse') return 'Drag the body to move the vehicle, Shift + drag to turn it. Drag elsewhere to orbit, right-drag to pan, wheel to zoom.';
  const who = kind === 'pen' ? 'the pen' : 'one finger';
  return `Drag the body with ${who} to move the vehicle; drag elsewhere with ${who} to turn the view. The Front, Side, Above and Corner buttons frame the vehicle.`;
}
