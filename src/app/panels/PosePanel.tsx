import { usePlumb, usePlumbStore } from '../../store/react';
import { NumberField } from './NumberField';

/** Where the vehicle stands on the terrain: reference point and heading. */
export function PosePanel() {
  const store = usePlumbStore();
  const pose = usePlumb((s) => s.scenario.pose);
  const units = usePlumb((s) => s.units);
  return (
    <section className="panel" aria-labelledby="pose-h">
      <h2 id="pose-h">Position on the terrain</h2>
      <div className="row">
        <NumberField label="Forward x" kind="length" units={units} valueSI={pose.xM} testId="pose-x" step={0.1} onChange={(v) => store.getState().setPose({ xM: v })} />
        <NumberField label="Left y" kind="length" units={units} valueSI={pose.yM} testId="pose-y" step={0.1} onChange={(v) => store.getState().setPose({ yM: v })} />
        <NumberField label="Heading" kind="angle" units={units} valueSI={pose.headingRad} testId="pose-heading" step={5} onChange={(v) => store.getState().setPose({ headingRad: v })} />
      </div>
      <p className="hint">The reference point is on the ground midway between the axles. Heading is counter-clockwise from +x seen from above.</p>
    </section>
  );
}
