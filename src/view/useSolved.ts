/**
 * Transient updates: run `apply` with the state now and after every new result, then ask for one
 * frame (frameloop="demand"). Scene objects are written through refs, so a drag re-solves and
 * redraws without re-rendering React components. A shown pose (a pass station, a build) counts
 * as a new result.
 */
import { useLayoutEffect, useRef } from 'react';
import { useThree } from '@react-three/fiber';
import { usePlumbStore } from '../store/react';
import type { PlumbState } from '../store/store';

export function useSolved(apply: (s: PlumbState) => void): void {
  const store = usePlumbStore();
  const invalidate = useThree((s) => s.invalidate);
  const fn = useRef(apply);
  fn.current = apply;
  useLayoutEffect(() => {
    fn.current(store.getState());
    invalidate();
    return store.subscribe((st, prev) => {
      if (st.result !== prev.result || st.scenario !== prev.scenario || st.shown !== prev.shown || st.ghost !== prev.ghost || st.overlayPath !== prev.overlayPath) {
        fn.current(st);
        invalidate();
      }
    });
  }, [store, invalidate]);
}
