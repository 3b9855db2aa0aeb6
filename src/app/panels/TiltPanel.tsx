import { useState } from 'react';
import { RAD_PER_DEG, angleText, radToDeg } from '../../present/units';
import { TILT_DATUM_NOTE, downhillWords } from '../../present/words';
import { usePlumb, usePlumbStore } from '../../store/react';
import { NumberField } from './NumberField';
import { SweepChart } from './SweepChart';

const DIRECTIONS: readonly [string, number][] = [
  ['Nose down', 0],
  ['Left down', 90],
  ['Tail down', 180],
  ['Right down', 270],
];

/** Tilt table: angle and downhill direction, and a sweep from level to the tip. */
export function TiltPanel() {
  const store = usePlumbStore();
  const tilt = usePlumb((s) => s.scenario.tilt);
  const units = usePlumb((s) => s.units);
  const sweep = usePlumb((s) => s.sweep);
  // A boolean selector: moving the vehicle re-renders this panel only when the answer changes.
  const current = usePlumb(
    (s) =>
      s.sweep !== null &&
      s.sweep.scenario.vehicle === s.scenario.vehicle &&
      s.sweep.scenario.terrain === s.scenario.terrain &&
      s.sweep.scenario.pose === s.scenario.pose &&
      s.sweep.scenario.friction === s.scenario.friction &&
      s.sweep.scenario.tilt.downhillRad === s.scenario.tilt.downhillRad,
  );
  const [busy, setBusy] = useState(false);
  const sw = sweep?.result;
  return (
    <section className="panel" aria-labelledby="tilt-h">
      <h2 id="tilt-h">Tilt table</h2>
      <div className="row">
        <NumberField
          label="Tilt angle"
          kind="angle"
          units={units}
          valueSI={tilt.angleRad}
          testId="tilt-angle"
          step={0.5}
          check={(d) => (d < 0 || d > 89 ? 'between 0 and 89°' : null)}
          onChange={(v) => store.getState().setTilt({ angleRad: v })}
        />
        <NumberField
          label="Downhill direction"
          kind="angle"
          units={units}
          valueSI={tilt.downhillRad}
          testId="downhill"
          step={15}
          check={(d) => (d < -360 || d > 360 ? 'between −360 and 360°' : null)}
          onChange={(v) => store.getState().setTilt({ downhillRad: v })}
        />
      </div>
      <p className="hint">
        Downhill: {downhillWords(tilt.downhillRad)} (0° nose down, 90° left side down, 180° tail down, 270° right side down).
      </p>
      <div className="buttons">
        {DIRECTIONS.map(([label, d]) => (
          <button key={d} type="button" onClick={() => store.getState().setTilt({ downhillRad: d * RAD_PER_DEG })}>
            {label}
          </button>
        ))}
      </div>
      <div className="buttons">
        <button
          type="button"
          data-testid="tilt-sweep"
          disabled={busy}
          onClick={() => {
            setBusy(true);
            // Let the button show its busy state before the (tens of ms) sweep runs.
            setTimeout(() => {
              store.getState().runTiltSweep();
              setBusy(false);
            }, 0);
          }}
        >
          {busy ? 'Sweeping…' : 'Sweep tilt from level'}
        </button>
        {sw?.firstLift && current ? (
          <button type="button" onClick={() => store.getState().setTilt({ angleRad: sw.firstLift!.angleRad })}>
            Set tilt to the first lift
          </button>
        ) : null}
      </div>
      {sw && current ? (
        <div className="sweep-result">
          <p data-testid="first-lift" data-wheel={sw.firstLift?.wheel ?? ''} data-angle-deg={sw.firstLift ? radToDeg(sw.firstLift.angleRad) : ''}>
            {sw.firstLift
              ? `First lift: ${sw.firstLift.wheel} at ${angleText(sw.firstLift.angleRad)} tilt from level, ${downhillWords(sw.downhillRad)}`
              : 'No wheel lifts before the tip or 89°.'}
          </p>
          <p data-testid="tip">
            {sw.tip
              ? `Tips at ${angleText(sw.tip.angleRad)} tilt from level, over the ${sw.tip.edge.join('–')} edge.`
              : 'Does not tip up to 89°.'}
            {sw.slide ? ` Slides (grip used up) from ${angleText(sw.slide.angleRad)}.` : ''}
          </p>
          <SweepChart sweep={sw} units={units} currentRad={tilt.angleRad} />
          <p className="fineprint">
            {TILT_DATUM_NOTE} Sweep took {sweep!.wallMs.toFixed(0)} ms.
          </p>
        </div>
      ) : sweep ? (
        <p className="hint">The scenario changed since the last sweep: run it again.</p>
      ) : null}
    </section>
  );
}
