import { useEffect, useState } from 'react';
import {
  candidateSpecs,
  candidatesToLines,
  lineComplete,
  lineToPathOrNull,
  linesToCandidates,
  pathPoints,
  rankCandidates,
  sameCandidates,
  type LineSpec,
  type LineSummary,
  type PathSpec,
  type RankedCandidate,
  type Scenario,
} from './pathPanelDeps';
import { runLineSpecs, type LineSweepReply } from '../../worker/client';
import { angleText, distanceText, toDisplay } from '../../present/units';
import { setIn, validate } from '../edit';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { pathDrawStore, usePathDraw, type DrawnLine, type XY } from '../../view/PathDrawState';
import { drawnLineColour } from '../../view/PathDraw';
import './fieldkit.css';
import { useInputKind } from '../../store/inputKind';

type Done = LineSweepReply & { readonly for: Scenario; readonly drawn: readonly DrawnLine[] };

/** Station spacing of a drawn line when the scenario has no path yet (m): 5 cm, as the demos. */
const DEFAULT_STEP_M = 0.05;

function xyText(p: XY, units: Scenario['units']): string {
  const f = (m: number) => toDisplay('distance', m, units).toFixed(units === 'metric' ? 2 : 1);
  return `(${f(p[0])}, ${f(p[1])})`;
}

function samePoints(a: readonly XY[], b: readonly XY[]): boolean {
  return a.length === b.length && a.every((p, i) => p[0] === b[i][0] && p[1] === b[i][1]);
}

/**
 * Keeps the drawn lines and the scenario's saved candidate lines the same: a change in the drawing
 * (a point added, moved when let go, removed; a line renamed or removed) is written to the scenario
 * as one undoable edit, checked like any edit; a scenario opened, restored or undone redraws the
 * lines. Returns the last refusal (a name used twice), if any.
 */
function usePathSync(): string | null {
  const store = usePlumbStore();
  const [refused, setRefused] = useState<string | null>(null);
  useEffect(() => {
    const fromScenario = () => {
      const c = store.getState().scenario.candidates;
      if (!sameCandidates(c, linesToCandidates(pathDrawStore.getState().lines))) pathDrawStore.getState().setLines(candidatesToLines(c));
    };
    const toScenario = () => {
      const d = pathDrawStore.getState();
      if (d.dragging) return;
      const s = store.getState().scenario;
      const next = linesToCandidates(d.lines);
      if (sameCandidates(s.candidates, next)) {
        setRefused(null);
        return;
      }
      const cand = setIn<Scenario>(s, ['candidates'], next);
      const res = validate(cand, s.units);
      if (res.ok) {
        setRefused(null);
        store.getState().replaceScenario(cand);
      } else setRefused(`Not saved in the scenario: ${res.errors[0].path}: ${res.errors[0].message}`);
    };
    fromScenario();
    const offScenario = store.subscribe((st, prev) => {
      if (st.scenario.candidates !== prev.scenario.candidates) fromScenario();
    });
    const offDraw = pathDrawStore.subscribe((st, prev) => {
      if (st.lines !== prev.lines || st.dragging !== prev.dragging) toScenario();
    });
    return () => {
      offScenario();
      offDraw();
    };
  }, [store]);
  return refused;
}

/**
 * Lines drawn on the ground in the 3D view: a toggle to draw (click points one after another, or
 * press and drag a two-point line), the lines listed with their points (rename, remove a point or a
 * line), each one made the scenario's path (then run the pass), and all of them compared as the
 * line sweep compares lines (in the same workers), ties shown as ties. The lines are saved in the
 * scenario (its `candidates`), so a saved file and the autosave keep them.
 */
export function PathPanel() {
  const store = usePlumbStore();
  const scenario = useScenarioPoseAside();
  const units = usePlumb((s) => s.units);
  const drawing = usePathDraw((s) => s.drawing);
  const active = usePathDraw((s) => s.active);
  const input = useInputKind();
  const lines = usePathDraw((s) => s.lines);
  const refused = usePathSync();
  const [done, setDone] = useState<Done | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  const stepM = scenario.path?.stepM ?? DEFAULT_STEP_M;
  const complete = lines.map((l) => lineToPathOrNull(l, stepM));
  const ready = complete.filter((p): p is PathSpec => p !== null);
  const stale = done !== null && (done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.drawn !== lines);
  const pathPts = scenario.path ? pathPoints(scenario.path) : null;
  const unitWord = units === 'metric' ? 'm' : 'ft';
  const d = pathDrawStore.getState;

  const takeLine = (i: number) => {
    const p = complete[i];
    if (!p) return;
    const cur = store.getState().scenario;
    // The path keeps its station spacing; the heading follows the line's legs.
    const cand = setIn<Scenario>(cur, ['path'], p);
    const res = validate(cand, cur.units);
    if (res.ok) {
      store.getState().replaceScenario(cand);
      setNote(`${lines[i].name} is the scenario's path now: run the obstacle pass to crawl along it.`);
    } else setNote(`${lines[i].name} cannot be the path: ${res.errors[0].path}: ${res.errors[0].message}`);
  };

  const compare = () => {
    const s = store.getState().scenario;
    const drawn = d().lines;
    // Index = the line's number in the drawing (lines still being drawn are skipped).
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
  const tap = input === 'mouse' ? 'click' : 'tap';

  return (
    <section className="panel" aria-labelledby="path-h">
      <details>
        <summary>
          <h2 id="path-h">Draw a line</h2>
        </summary>
        <p className="hint">
          {drawing
            ? `Drawing: ${tap} the ground to add points one after another (${input === 'mouse' ? 'or press and drag a straight line' : `or draw a straight line with ${input === 'pen' ? 'the pen' : 'one finger'}`}); "Finish line" starts the next. Drag a marker to move a point; ${input === 'mouse' ? 'double-click it' : 'use × in the list'} to remove it.`
            : 'Draw candidate lines on the ground in the 3D view, make one the path for the obstacle pass, or compare them all. The lines are saved in the scenario.'}
        </p>
        <div className="buttons">
          <button type="button" data-testid="path-draw" aria-pressed={drawing} className={drawing ? 'toggle-on' : undefined} onClick={() => d().setDrawing(!drawing)}>
            {drawing ? 'Stop drawing' : 'Draw lines'}
          </button>
          {active !== null ? (
            <button type="button" data-testid="path-finish" onClick={() => d().finishLine()}>
              Finish line
            </button>
          ) : null}
          <button type="button" data-testid="path-compare" disabled={ready.length === 0 || progress !== null} onClick={compare}>
            Compare {ready.length} line{ready.length === 1 ? '' : 's'}
          </button>
          {progress ? (
            <button type="button" onClick={cancel}>
              Cancel
            </button>
          ) : null}
          {lines.length > 0 ? (
            <button type="button" onClick={() => d().setLines([])}>
              Clear
            </button>
          ) : null}
        </div>
        {lines.length > 0 ? (
          <ol className="drawn-lines" data-testid="path-lines">
            {lines.map((l, i) => (
              <li key={i} data-testid={`path-line-${i}`} data-points={JSON.stringify(l.points)} data-name={l.name}>
                <span className="swatch" style={{ background: drawnLineColour(i) }} />{' '}
                <input
                  type="text"
                  data-testid={`path-name-${i}`}
                  aria-label={`Name of line ${i + 1}`}
                  value={l.name}
                  maxLength={200}
                  size={14}
                  onChange={(e) => d().rename(i, e.target.value)}
                />{' '}
                {pathPts && samePoints(pathPts, l.points) ? <strong data-testid={`path-is-path-${i}`}>(the path) </strong> : null}
                {active === i ? <em>(drawing) </em> : null}
                <span className="points">
                  {l.points.map((p, k) => (
                    <span key={k} className="point">
                      {k > 0 ? ' → ' : ''}
                      {xyText(p, units)}
                      <button type="button" className="small" data-testid={`path-point-remove-${i}-${k}`} aria-label={`Remove point ${k + 1} of ${l.name}`} onClick={() => d().removePoint(i, k)}>
                        ×
                      </button>
                    </span>
                  ))}{' '}
                  {unitWord}
                </span>
                {!lineComplete(l) ? <span className="hint"> ({tap} {l.points.length < 2 ? 'the next point' : 'apart from the last point'})</span> : null}{' '}
                {complete[i] ? (
                  <button type="button" data-testid={`path-use-${i}`} onClick={() => takeLine(i)}>
                    Use as the path
                  </button>
                ) : null}{' '}
                {active !== i ? (
                  <button type="button" onClick={() => d().continueLine(i)} aria-label={`Add points to ${l.name}`}>
                    Add points
                  </button>
                ) : null}{' '}
                <button type="button" data-testid={`path-line-remove-${i}`} onClick={() => d().removeLine(i)} aria-label={`Remove ${l.name}`}>
                  Remove
                </button>
              </li>
            ))}
          </ol>
        ) : null}
        {refused ? (
          <p className="hint warn" data-testid="path-refused">
            {refused}
          </p>
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
                  <span className="swatch" style={{ background: drawnLineColour(c.summary.index) }} /> {done.drawn[c.summary.index]?.name ?? `Line ${c.summary.index + 1}`}
                  {c.tiedWith > 1 ? ` (tied with ${c.tiedWith - 1} other${c.tiedWith > 2 ? 's' : ''}: margins within 0.1°)` : ''}: {words(c.summary)}
                </li>
              ))}
            </ol>
            <p className="fineprint">
              Ranked by the smallest force-angle margin along each line; a line that tips or hangs up ranks last. Lines within 0.1° are tied: the method
              cannot tell them apart. {done.ranked.length} line{done.ranked.length === 1 ? '' : 's'} in {done.wallMs.toFixed(0)} ms on {done.workers}{' '}
              {done.workers === 1 ? 'worker' : 'workers'}. Quasi-static estimates: real margins are smaller; keep to the vehicle maker&apos;s limits and use a spotter.
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
