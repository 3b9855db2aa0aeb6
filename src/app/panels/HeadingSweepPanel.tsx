import { useState } from 'react';
import { HEADING_MAX_EXTRA_RAD, type HeadingResult, type HeadingSweepResult, type Scenario } from '../../core';
import { runHeadings } from '../../worker/client';
import { DEG_PER_RAD, distanceText, shortText } from '../../present/units';
import { downhillWords, filledHeadingsWords } from '../../present/words';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { headingSweepStore, ROSE_M_PER_DEG } from '../../store/headingSweep';
import './fieldkit.css';

type Done = { readonly result: HeadingSweepResult; readonly wallMs: number; readonly workers: number; readonly for: Scenario };

const deg1 = (rad: number) => (rad * DEG_PER_RAD).toFixed(1);
const tipExtra = (h: HeadingResult) => (h.tip ? h.tip.extraRad : HEADING_MAX_EXTRA_RAD);

/** Extra tilt to the tip (solid) and to the first lift (dashed) against heading, 0–360°. */
function HeadingChart({ r, width = 380, height = 170 }: { r: HeadingSweepResult; width?: number; height?: number }) {
  const left = 36, right = 8, top = 8, bottom = 26;
  let max = 10;
  for (const h of r.headings) max = Math.max(max, tipExtra(h) * DEG_PER_RAD);
  max = Math.ceil(max / 10) * 10;
  const X = (rad: number) => left + ((rad * DEG_PER_RAD) / 360) * (width - left - right);
  const Y = (d: number) => top + (1 - d / max) * (height - top - bottom);
  const pts = (f: (h: HeadingResult) => number) => r.headings.filter((h) => h.solved).map((h) => `${X(h.headingRad).toFixed(1)},${Y(f(h) * DEG_PER_RAD).toFixed(1)}`).join(' ');
  const ticks: number[] = [];
  for (let d = 0; d <= max; d += 10) ticks.push(d);
  return (
    <svg className="chart" viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label="Extra tilt to the tip and to the first lift, by heading" data-testid="heading-chart">
      {ticks.map((d) => (
        <g key={d}>
          <line x1={left} x2={width - right} y1={Y(d)} y2={Y(d)} stroke="#e3e5e8" />
          <text x={left - 4} y={Y(d) + 3} fontSize="9" textAnchor="end">
            {d}°
          </text>
        </g>
      ))}
      {[0, 90, 180, 270, 360].map((d) => (
        <text key={d} x={X(d / DEG_PER_RAD)} y={height - 12} fontSize="9" textAnchor="middle">
          {d}°
        </text>
      ))}
      <text x={(left + width) / 2} y={height - 2} fontSize="9" textAnchor="middle">
        heading (from the terrain's x axis, counter-clockwise)
      </text>
      <polyline points={pts(tipExtra)} fill="none" stroke="#0b3d91" strokeWidth={2} />
      <polyline points={pts((h) => (h.firstLift ? h.firstLift.extraRad : tipExtra(h)))} fill="none" stroke="#D55E00" strokeWidth={2} strokeDasharray="5 3" />
      {r.worst ? <line x1={X(r.worst.headingRad)} x2={X(r.worst.headingRad)} y1={top} y2={height - bottom} stroke="#c0392b" /> : null}
      {r.unsolved.map((h) => (
        <text key={h.headingRad} x={X(h.headingRad)} y={top + 10} fontSize="10" textAnchor="middle" fill="#7a4b00">
          ?
        </text>
      ))}
    </svg>
  );
}

/**
 * Heading sweep on the ground as it is: at the vehicle's spot, every heading (5° apart) solved on
 * the scenario's terrain and tilted further about the ground's fall line to the first lift and the
 * tip; in the line sweep's workers. Drawn as a chart and as a rose over the terrain; the worst named.
 */
export function HeadingSweepPanel() {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const scenario = useScenarioPoseAside();
  const [stepDeg, setStepDeg] = useState(5);
  const [done, setDone] = useState<Done | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  // Re-renders on a drag only when the spot leaves (or comes back to) the one swept.
  const moved = usePlumb((s) => done !== null && (s.scenario.pose.xM !== done.for.pose.xM || s.scenario.pose.yM !== done.for.pose.yM));
  const stale = done !== null && (moved || done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.for.friction !== scenario.friction);
  const start = () => {
    const s = store.getState().scenario;
    run(
      (onProgress) => runHeadings(s, stepDeg / DEG_PER_RAD, onProgress),
      (r) => {
        setDone({ ...r, for: s });
        headingSweepStore.getState().setShown(r.result);
      },
      Math.round(360 / stepDeg),
    );
  };
  const r = done?.result;
  const w = r?.worst;
  return (
    <section className="panel" aria-labelledby="headings-h">
      <details>
        <summary>
          <h2 id="headings-h">Heading sweep on this ground</h2>
        </summary>
        <p className="hint">
          The vehicle turned on the spot where it stands, every heading solved on the ground as it is (not a level table), then tilted further down the
          ground's fall line until a wheel lifts and until it tips.
        </p>
        <div className="buttons">
          <label className="inline">
            Every
            <select value={stepDeg} onChange={(e) => setStepDeg(Number(e.target.value))} data-testid="heading-step">
              {[5, 10, 15, 30].map((d) => (
                <option key={d} value={d}>
                  {d}°
                </option>
              ))}
            </select>
          </label>
          <button type="button" data-testid="heading-sweep" disabled={progress !== null} onClick={start}>
            Sweep the headings here
          </button>
          {progress ? (
            <button type="button" onClick={cancel}>
              Cancel
            </button>
          ) : null}
          {done ? (
            <button type="button" onClick={() => headingSweepStore.getState().setShown(headingSweepStore.getState().shown ? null : done.result)}>
              Show or hide the rose
            </button>
          ) : null}
        </div>
        {progress ? <progress max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {r ? (
          <div data-testid="heading-result">
            {stale ? <p className="hint">The vehicle, its spot or the ground changed since: sweep again.</p> : null}
            <p>
              Ground here: {deg1(r.ground.slopeRad)}° from level
              {r.ground.slopeRad > 0 ? `, falling toward ${deg1(r.ground.fallAzimuthRad < 0 ? r.ground.fallAzimuthRad + 2 * Math.PI : r.ground.fallAzimuthRad)}° from the x axis` : ''} (a plane fitted
              within {distanceText(r.ground.radiusM, units)} of the spot; {r.ground.rmsM < 0.005 ? 'the ground is a plane there' : `uneven: ${distanceText(r.ground.rmsM, units)} rms off the plane, so "from level" is an estimate`}).
            </p>
            <p className="headline" data-testid="heading-worst" data-heading-deg={w ? w.headingRad * DEG_PER_RAD : ''} data-tip-extra-deg={w?.tip ? w.tip.extraRad * DEG_PER_RAD : ''}>
              {!w
                ? 'No heading could be solved here.'
                : `Worst heading ${deg1(w.headingRad)}° (${downhillWords(w.downhillRad)}): `}
              {!w
                ? ''
                : !w.stands
                ? 'does not stand here at all.'
                : w.tip
                  ? `tips after ${deg1(w.tip.extraRad)}° more than the ground here (${deg1(w.tip.extraRad + r.ground.slopeRad)}° from level)${w.firstLift ? `; ${w.firstLift.wheel} lifts after ${deg1(w.firstLift.extraRad)}° more` : ''}.`
                  : `no tip up to ${deg1(HEADING_MAX_EXTRA_RAD)}° more.`}
            </p>
            {r.unsolved.length > 0 ? (
              <p className="hint" data-testid="heading-unsolved">
                Not solved (the solver did not settle; not a tip, left out of the worst): {r.unsolved.map((h) => `${deg1(h.headingRad)}°`).join(', ')}.
              </p>
            ) : null}
            {filledHeadingsWords(r.headings) ? <p className="hint" data-testid="heading-filled-ground">{filledHeadingsWords(r.headings)}</p> : null}
            <HeadingChart r={r} />
            <p className="fineprint">
              Solid: extra tilt to the tip; dashed: to the first wheel lift; red: the worst heading. Over the terrain the rose's radius is{' '}
              {shortText(ROSE_M_PER_DEG, units)} per degree of extra tilt to the tip (short = worst).{' '}
              {r.headings.length} headings in {done!.wallMs.toFixed(0)} ms on {done!.workers} {done!.workers === 1 ? 'worker' : 'workers'}. Quasi-static
              estimates: real margins are smaller; keep far inside them and to the vehicle maker's limits.
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
