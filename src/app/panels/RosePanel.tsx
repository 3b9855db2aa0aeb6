import { useState } from 'react';
import { spareFromRose, type RoseResult } from '../../core';
import { runRose } from '../../worker/client';
import { angleText, radToDeg } from '../../present/units';
import { downhillWords, filledSpotWords, spareLines } from '../../present/words';
import { MARGIN_COLOUR, WHEEL_COLOURS } from '../../present/palette';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore } from '../../store/react';

interface Done {
  result: RoseResult;
  wallMs: number;
}

/** Polar plot: tilt at first lift (dashed) and at the tip (solid) for each downhill direction; nose up the page. */
function RosePlot({ rose, size = 300 }: { rose: RoseResult; size?: number }) {
  const c = size / 2;
  const R = c - 28;
  let top = 0;
  for (const d of rose.directions) top = Math.max(top, radToDeg(d.tip?.angleRad ?? rose.maxAngleRad));
  const maxDeg = Math.min(90, Math.ceil((top + 1) / 10) * 10);
  // Direction d (counter-clockwise from the nose) → nose at the top, left side to the left.
  const pt = (dirRad: number, deg: number) => {
    const r = (deg / maxDeg) * R;
    return [c - r * Math.sin(dirRad), c - r * Math.cos(dirRad)] as const;
  };
  const ring = (key: 'tip' | 'lift') =>
    rose.directions
      .map((d) => {
        const a = key === 'tip' ? d.tip?.angleRad ?? rose.maxAngleRad : d.firstLift?.angleRad ?? d.tip?.angleRad ?? rose.maxAngleRad;
        const [x, y] = pt(d.downhillRad, radToDeg(a));
        return `${x.toFixed(1)},${y.toFixed(1)}`;
      })
      .join(' ');
  const rings: number[] = [];
  for (let d = 10; d <= maxDeg; d += 10) rings.push(d);
  return (
    <svg viewBox={`0 0 ${size} ${size}`} width="100%" role="img" aria-label="Stability rose: tilt at first lift and at tip, by downhill direction" data-testid="rose-plot">
      {rings.map((d) => (
        <g key={d}>
          <circle cx={c} cy={c} r={(d / maxDeg) * R} fill="none" stroke="#ddd" />
          <text x={c + 2} y={c - (d / maxDeg) * R + 10} fontSize="9" fill="#666">
            {d}°
          </text>
        </g>
      ))}
      <text x={c} y={12} textAnchor="middle" fontSize="10">
        nose down
      </text>
      <text x={c} y={size - 4} textAnchor="middle" fontSize="10">
        tail down
      </text>
      <text x={4} y={c + 4} fontSize="10">
        left
      </text>
      <text x={size - 4} y={c + 4} textAnchor="end" fontSize="10">
        right
      </text>
      <polygon points={ring('tip')} fill={MARGIN_COLOUR} fillOpacity={0.08} stroke={MARGIN_COLOUR} strokeWidth={2} />
      <polygon points={ring('lift')} fill="none" stroke={WHEEL_COLOURS[1]} strokeWidth={2} strokeDasharray="5 3" />
    </svg>
  );
}

/** The stability rose, computed in a worker with progress and cancel. */
export function RosePanel() {
  const store = usePlumbStore();
  const scenario = usePlumb((s) => s.scenario);
  const [done, setDone] = useState<(Done & { for: typeof scenario }) | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  const stale = done && (done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.for.pose !== scenario.pose);
  const start = () => {
    const s = store.getState().scenario;
    run((onProgress) => runRose(s, 5, onProgress), (r) => setDone({ ...r, for: s }));
  };
  return (
    <section className="panel" aria-labelledby="rose-h">
      <details>
        <summary>
          <h2 id="rose-h">Stability rose (all directions)</h2>
        </summary>
        <div className="buttons">
          <button type="button" data-testid="rose-run" disabled={progress !== null} onClick={start}>
            Sweep every 5°
          </button>
          {progress ? (
            <button type="button" data-testid="rose-cancel" onClick={cancel}>
              Cancel
            </button>
          ) : null}
        </div>
        {progress ? <progress data-testid="rose-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {done ? (
          <div data-testid="rose-result">
            {stale ? <p className="hint">The scenario changed since this rose: run it again.</p> : null}
            <RosePlot rose={done.result} />
            <p>
              Weakest direction: tips at {done.result.weakest.tip ? `${angleText(done.result.weakest.tip.angleRad)} tilt from level` : 'no tip up to 89°'} with{' '}
              {downhillWords(done.result.weakest.downhillRad)}. First lift anywhere:{' '}
              {done.result.weakestLift.firstLift
                ? `${done.result.weakestLift.firstLift.wheel} at ${angleText(done.result.weakestLift.firstLift.angleRad)}, ${downhillWords(done.result.weakestLift.downhillRad)}`
                : 'none before the tip'}
              .
            </p>
            <ul className="spare" data-testid="rose-spare">
              {spareLines(spareFromRose(done.result)).map((line, i) => (
                <li key={i}>{line}</li>
              ))}
            </ul>
            {filledSpotWords(done.result.filledWheels) ? <p className="hint" data-testid="rose-filled-ground">{filledSpotWords(done.result.filledWheels)}</p> : null}
            <p className="fineprint">
              Solid line: tip; dashed: first lift. {done.result.directions.length} directions in {done.wallMs.toFixed(0)} ms. Static limits
              only: keep far inside them.
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
