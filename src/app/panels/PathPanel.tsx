import { useState } from 'react';
import { candidateSpecs, lineToPathOrNull, rankCandidates, type LineSpec, type LineSummary, type PathSpec, type RankedCandidate, type Scenario } from './pathPanelDeps';
import { runLineSpecs, type LineSweepReply } from '../../worker/client';
import { angleText, distanceText, toDisplay } from '../../present/units';
import { setIn, validate } from '../edit';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { pathDrawStore, usePathDraw, type DrawnLine } from '../../view/PathDrawState';
import { drawnLineColour } from '../../view/PathDraw';
import './fieldkit.css';
import { useInputKind } from '../../store/inputKind';

type Done = LineSweepReply & { readonly for: Scenario; readonly drawn: readonly DrawnLine[] };

/** Station spacing of a drawn line when the scenario has no path yet (m): 5 cm, as the demos. */
const DEFAULT_STEP_M = 0.05;

function xyText(p: readonly [number, number], units: Scenario['units']): string {
  const f = (m: number) => toDisplay('distance', m, units).toFixed(units === 'metric' ? 2 : 1);
  return `(${f(p[0])}, ${f(p[1])}) ${units === 'metric' ? 'm' : 'ft'}`;
}

/**
 * Lines drawn on the ground in the 3D view: a toggle to draw (click two points, or press and drag a
 * line), the lines listed with their ends, each one made the scenario's path (then run the pass), and
 * all of them compared as the line sweep compares lines (in the same workers), ties shown as ties.
 */
export function PathPanel() {
  const store = usePlumbStore();
  const scenario = useScenarioPoseAside();
  const units = usePlumb((s) => s.units);
  const drawing = usePathDraw((s) => s.drawing);
  const input = useInputKind();
  const lines = usePathDraw((s) => s.lines);
  const [done, setDone] = useState<Done | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  const stepM = scenario.path?.stepM ?? DEFAULT_STEP_M;
  const complete = lines.map((l) => lineToPathOrNull(l, stepM));
  const ready = complete.filter((p): p is PathSpec => p !== null);
  const stale = done !== null && (done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.drawn !== lines);

  const takeLine = (i: number) => {
    const p = complete[i];
    if (!p) return;
    const cand = setIn<Scenario>(store.getState().scenario, ['path'], p);
    const res = validate(cand);
    if (res.ok) {
      store.getState().replaceScenario(cand);
      setNote(`Line ${i + 1} is the scenario's path now: run the obstacle pass to crawl along it.`);
    } else setNote(`Line ${i + 1} cannot be the path: ${res.errors[0].path}: ${res.errors[0].message}`);
  };

  const compare = () => {
    const s = store.getState().scenario;
    const drawn = pathDrawStore.getState().lines;
    // Index = the line's number in the drawing (incomplete lines are skipped).
    const specs: LineSpec[] = candidateSpecs(drawn.map((l) => lineToPathOrNull(l, stepM)));
    run(
      (onProgress) => runLineSpecs(s, specs, onProgress),
      (r) => setDone({ ...r, for: s, drawn }),
      specs.length,
    );
  };

  const words = (l: LineSummary): string => {
    const parts: string[] = [];
    if (l.tip) parts.push(`tips at ${distanceText(l.tip.distanceM, units)}`);
    else if (l.hangUp) parts.push(`hangs up on the ${l.hangUp.part === 'front' ? 'front bumper' : l.hangUp.part === 'rear' ? 'rear bumper' : l.hangUp.part.replace('-', ' ')} at ${distanceText(l.hangUp.distanceM, units)}`);
    else parts.push(`smallest force-angle margin ${angleText(l.minForceAngleRad)} at ${distanceText(l.minMarginDistanceM, units)}`);
    parts.push(l.firstUnload ? `${l.firstUnload.wheel} unloads first at ${distanceText(l.firstUnload.distanceM, units)}` : 'no wheel goes light');
    if (l.firstLift) parts.push(`${l.firstLift.wheel} lifts at ${distanceText(l.firstLift.distanceM, units)}`);
    return parts.join('; ');
  };
  const ranked: RankedCandidate[] = done ? rankCandidates(done.ranked) : [];

  return (
    <section className="panel" aria-labelledby="path-h">
      <details>
        <summary>
          <h2 id="path-h">Draw a line</h2>
        </summary>
        <p className="hint">
          {drawing
            ? input === 'mouse'
              ? 'Drawing: click the ground for the start, then the end (or press and drag a whole line). Drag a numbered marker to move an end.'
              : `Drawing: tap the ground for the start, then the end (or draw a whole line with ${input === 'pen' ? 'the pen' : 'one finger'}). Drag a numbered marker to move an end.`
            : 'Draw candidate lines on the ground in the 3D view, make one the path for the obstacle pass, or compare them all.'}
        </p>
        <div className="buttons">
          <button
            type="button"
            data-testid="path-draw"
            aria-pressed={drawing}
            className={drawing ? 'toggle-on' : undefined}
            onClick={() => pathDrawStore.getState().setDrawing(!drawing)}
          >
            {drawing ? 'Stop drawing' : 'Draw lines'}
          </button>
          <button type="button" data-testid="path-compare" disabled={ready.length === 0 || progress !== null} onClick={compare}>
            Compare {ready.length} line{ready.length === 1 ? '' : 's'}
          </button>
          {progress ? (
            <button type="button" onClick={cancel}>
              Cancel
            </button>
          ) : null}
          {lines.length > 0 ? (
            <button type="button" onClick={() => pathDrawStore.getState().setLines([])}>
              Clear
            </button>
          ) : null}
        </div>
        {lines.length > 0 ? (
          <ol className="drawn-lines" data-testid="path-lines">
            {lines.map((l, i) => (
              <li key={i} data-testid={`path-line-${i}`} data-from={l.from.join(',')} data-to={l.to ? l.to.join(',') : ''}>
                <span className="swatch" style={{ background: drawnLineColour(i) }} /> {xyText(l.from, units)} → {l.to ? xyText(l.to, units) : '(tap the end)'}{' '}
                {complete[i] ? (
                  <button type="button" data-testid={`path-use-${i}`} onClick={() => takeLine(i)}>
                    Use as the path
                  </button>
                ) : null}{' '}
                <button type="button" onClick={() => pathDrawStore.getState().removeLine(i)} aria-label={`Remove line ${i + 1}`}>
                  Remove
                </button>
              </li>
            ))}
          </ol>
        ) : null}
        {note ? (
          <p className="hint" data-testid="path-note">
            {note}
          </p>
        ) : null}
        {progress ? <progress max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {done ? (
          <div data-testid="path-ranking">
            {stale ? <p className="hint">The lines or the scenario changed since: compare again.</p> : null}
            <ol className="lines">
              {ranked.map((c) => (
                <li key={c.summary.index} value={c.rank} data-testid="path-rank-row" data-line={c.summary.index} data-rank={c.rank} data-tied={c.tiedWith}>
                  <span className="swatch" style={{ background: drawnLineColour(c.summary.index) }} /> Line {c.summary.index + 1}
                  {c.tiedWith > 1 ? ` (tied with ${c.tiedWith - 1} other${c.tiedWith > 2 ? 's' : ''}: margins within 0.1°)` : ''}: {words(c.summary)}
                </li>
              ))}
            </ol>
            <p className="fineprint">
              Ranked by the smallest force-angle margin along each line; a line that tips or hangs up ranks last. Lines within 0.1° are tied: the method
              cannot tell them apart. {done.ranked.length} line{done.ranked.length === 1 ? '' : 's'} in {done.wallMs.toFixed(0)} ms on {done.workers}{' '}
              {done.workers === 1 ? 'worker' : 'workers'}. Quasi-static: real margins are smaller.
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
