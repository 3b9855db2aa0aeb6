import { WHEEL_NAMES } from '../core';
import { usePlumb } from '../store/react';
import { percentText, scaleText } from '../present/units';
import { shownResult } from '../store/store';
import { useSceneApi } from './sceneContext';

export interface WheelLabelProps {
  /** Wheel index: 0 FL, 1 FR, 2 RL, 3 RR. */
  index: number;
}

/**
 * The load on one tyre, as a scale under it would read, and as a share of its static load; placed
 * over the tyre by <LabelProjector>. A lifted tyre says so in words.
 */
export function WheelLabel({ index }: WheelLabelProps) {
  const api = useSceneApi();
  const units = usePlumb((s) => s.units);
  const w = usePlumb((s) => shownResult(s).wheels[index]);
  // A pose that does not stand: the name only (no load, and no lift of a state that is no balance).
  const standing = usePlumb((s) => shownResult(s).standing);
  const lifted = w.lifted && standing;
  const name = WHEEL_NAMES[index];
  return (
    <div
      ref={(el) => {
        api.labels[index] = el;
      }}
      className={lifted ? 'wheel-label lifted' : 'wheel-label'}
      data-testid={`wheel-load-${name}`}
      data-lifted={lifted ? 'true' : 'false'}
    >
      <b>{name}</b> {lifted ? <strong className="lifted-word">LIFTED</strong> : null}
      {standing ? (
        <>
          {' '}
          <span className="load-number">{scaleText(w.verticalLoadN, units)}</span>{' '}
          <span className="load-share">{percentText(w.loadShare)} of static</span>
        </>
      ) : null}
    </div>
  );
}
