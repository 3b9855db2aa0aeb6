import { useEffect, useMemo, useRef, useState } from 'react';
import { WHEEL_NAMES, type PassResult, type Scenario, type SolveResult } from '../../core';
import { runJob } from '../../worker/client';
import type { ReplyOf } from '../../worker/messages';
import { ENERGY_COLOUR, MARGIN_COLOUR, WHEEL_COLOURS, WHEEL_DASHES } from '../../present/palette';
import { angleText, distanceText, radToDeg, shortText, toDisplay, unitSymbol } from '../../present/units';
import { QUASI_STATIC_CAUTION, eventWords, filledPassWords, passHeadline } from '../../present/words';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { DistanceChart, type DistanceMark } from './DistanceChart';

type Done = ReplyOf<'pass'> & { readonly for: Scenario };

/** Playback: the whole path in about this many frames, one frame every PLAY_MS. */
const PLAY_FRAMES = 160;
const PLAY_MS = 50;

/**
 * Obstacle pass: the vehicle crawls along the scenario's path (in a worker); a scrubber and play
 * button pose it at each station in the scene; charts of loads, travel and margins against
 * distance with the events marked; the headline in words.
 */
export function PassPanel() {
  const store = usePlumbStore();
  // Not re-rendered while the vehicle is dragged: nothing here depends on the pose.
  const scenario = useScenarioPoseAside();
  const units = usePlumb((s) => s.units);
  const [done, setDone] = useState<Done | null>(null);
  const [station, setStation] = useState(0);
  const [playing, setPlaying] = useState(false);
  const { progress, message, run, cancel } = useWorkerJob();
  const stationRef = useRef(0);
  const stale =
    done !== null &&
    (done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.for.path !== scenario.path || done.for.tilt !== scenario.tilt || done.for.friction !== scenario.friction);

  const show = (d: Done, i: number) => {
    const st = d.result.stations[i];
    const r: SolveResult | undefined = d.solved[i];
    if (!st || !r) return;
    stationRef.current = i;
    setStation(i);
    // Only while the pass belongs to the scenario on screen (same vehicle and terrain).
    const now = store.getState().scenario;
    if (now.vehicle === d.for.vehicle && now.terrain === d.for.terrain && now.tilt === d.for.tilt) {
      store.getState().showStation(`pass station ${i} (${distanceText(st.distanceM, store.getState().units)} along the path)`, st.pose, r);
    }
  };

  const start = () => {
    const s = store.getState().scenario;
    setPlaying(false);
    run(
      (onProgress) => runJob({ type: 'pass', scenario: s }, onProgress),
      (r) => {
        const d = { ...r, for: s };
        setDone(d);
        show(d, 0);
      },
    );
  };

  // Play: step through the stations; stops at the end.
  const doneRef = useRef(done);
  doneRef.current = done;
  useEffect(() => {
    if (!playing || !done) return;
    const n = done.result.stations.length;
    const step = Math.max(1, Math.ceil(n / PLAY_FRAMES));
    const t = setInterval(() => {
      const next = Math.min(n - 1, stationRef.current + step);
      if (doneRef.current) show(doneRef.current, next);
      if (next >= n - 1) setPlaying(false);
    }, PLAY_MS);
    return () => clearInterval(t);
  }, [playing, done]);

  const charts = useMemo(() => (done ? chartData(done.result, units) : null), [done, units]);

  if (!scenario.path) {
    return (
      <section className="panel" aria-labelledby="pass-h">
        <h2 id="pass-h">Obstacle pass</h2>
        <p className="hint">This scenario has no path. Draw one on the ground (Draw a line, then Use as the path) to crawl the vehicle along it.</p>
      </section>
    );
  }
  const r = done?.result;
  const st = r?.stations[station];
  const cur = st ? toDisplay('distance', st.distanceM, units) : undefined;
  const jumpTo = (x: number) => {
    if (!done) return;
    const xs = charts!.distances;
    let best = 0;
    for (let i = 1; i < xs.length; i++) if (Math.abs(xs[i] - x) < Math.abs(xs[best] - x)) best = i;
    setPlaying(false);
    show(done, best);
  };
  const onMark = (i: number) => {
    if (!done) return;
    setPlaying(false);
    show(done, Math.min(done.result.stations.length - 1, done.result.events[i].startStation));
  };
  // What the four charts share: the distance axis, the events, the current station, the clicks.
  const chartCommon = charts
    ? { distances: charts.distances, xUnit: unitSymbol('distance', units), marks: charts.marks, current: cur, onPick: jumpTo, onMark }
    : null;
  return (
    <section className="panel" aria-labelledby="pass-h">
      <details open>
        <summary>
          <h2 id="pass-h">Obstacle pass</h2>
        </summary>
        <p className="hint">
          Crawl from ({scenario.path.fromM.map((m) => distanceText(m, units)).join(', ')}) to ({scenario.path.toM.map((m) => distanceText(m, units)).join(', ')})
          {scenario.path.viaM?.length ? ` through ${scenario.path.viaM.length} corner point${scenario.path.viaM.length === 1 ? '' : 's'}` : ''}, a station every{' '}
          {distanceText(scenario.path.stepM, units)}, each a standing pose.
        </p>
        <div className="buttons">
          <button type="button" data-testid="pass-run" disabled={progress !== null} onClick={start}>
            {done ? 'Run the pass again' : 'Run the pass'}
          </button>
          {progress ? (
            <button type="button" data-testid="pass-cancel" onClick={cancel}>
              Cancel
            </button>
          ) : null}
        </div>
        {progress ? <progress data-testid="pass-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {done && r && charts ? (
          <div data-testid="pass-result">
            {stale ? <p className="hint">The scenario changed since this pass: run it again.</p> : null}
            <p
              className="headline"
              data-testid="pass-headline"
              data-first-unload-wheel={r.firstUnload?.wheel ?? ''}
              data-first-unload-m={r.firstUnload?.distanceM ?? ''}
              data-min-margin-deg={r.minMargin ? radToDeg(r.minMargin.forceAngleRad) : ''}
              data-min-margin-m={r.minMargin?.distanceM ?? ''}
            >
              {passHeadline(r, units)}
            </p>
            {filledPassWords(r, units) ? <p className="hint" data-testid="pass-filled-ground">{filledPassWords(r, units)}</p> : null}
            <div className="scrubber">
              <button type="button" data-testid="pass-play" onClick={() => {
                if (!playing && station >= r.stations.length - 1) show(done, 0);
                setPlaying(!playing);
              }}>
                {playing ? 'Pause' : 'Play'}
              </button>
              <input
                type="range"
                min={0}
                max={r.stations.length - 1}
                step={1}
                value={station}
                data-testid="pass-station"
                aria-label="Station along the path"
                onChange={(e) => {
                  setPlaying(false);
                  show(done, Number(e.target.value));
                }}
              />
              <span className="station-text" data-testid="pass-at">
                {st ? `${distanceText(st.distanceM, units)} · station ${station} of ${r.stations.length - 1}` : ''}
              </span>
            </div>
            {st ? (
              <p className="fineprint" data-testid="pass-station-summary">
                {st.hungUp
                  ? 'The body is inside the ground here: the vehicle hangs up and the pass stops (these loads are not a state it can stand in).'
                  : st.status === 'converged' || st.approximate
                  ? `Force-angle margin ${angleText(st.forceAngleRad)}, body roll ${angleText(st.rollRad)} and pitch ${angleText(st.pitchRad)} from level, underbody gap ${shortText(st.clearanceM, units)}${st.approximate ? ' (approximate solve)' : ''}.`
                  : `No balance here (${st.status}): the pass stops.`}
              </p>
            ) : null}
            <DistanceChart
              {...chartCommon!}
              testId="pass-chart-loads"
              series={charts.loads}
              yLabel={`Normal load per tyre (${unitSymbol('force', units)})`}
            />
            <DistanceChart
              {...chartCommon!}
              testId="pass-chart-travel"
              series={charts.travel}
              yLabel="Travel used (%; + bump, − droop)"
              yRange={[-100, 100]}
            />
            <DistanceChart
              {...chartCommon!}
              testId="pass-chart-margins"
              series={charts.forceAngle}
              yLabel="Force-angle margin (°)"
              height={120}
            />
            <DistanceChart
              {...chartCommon!}
              testId="pass-chart-energy"
              series={charts.energy}
              yLabel={`Energy margin: CG rise to tip (${unitSymbol('short', units)})`}
              height={120}
            />
            <h3 className="sub">Events (click to go there)</h3>
            {r.events.length === 0 ? (
              <p className="hint">None: every tyre stays loaded and inside its travel.</p>
            ) : (
              <ol className="events" data-testid="pass-events">
                {r.events.map((e, i) => (
                  <li key={i}>
                    <button type="button" className="link" data-testid={`pass-event-${i}`} onClick={() => onMark(i)}>
                      {eventWords(e, units)}
                    </button>
                  </li>
                ))}
              </ol>
            )}
            <p className="fineprint">
              {r.stations.length} of {r.plannedStations} stations in {done.wallMs.toFixed(0)} ms. {QUASI_STATIC_CAUTION}
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}

function chartData(r: PassResult, units: Scenario['units']) {
  const distances = r.stations.map((s) => toDisplay('distance', s.distanceM, units));
  const ok = (s: PassResult['stations'][number]) => !s.hungUp && (s.status === 'converged' || s.approximate);
  const loads = WHEEL_NAMES.map((name, k) => ({
    label: name,
    colour: WHEEL_COLOURS[k],
    dash: WHEEL_DASHES[k],
    values: r.stations.map((s) => {
      const l = s.wheels[k].loadN as number | null;
      return ok(s) && l !== null ? toDisplay('force', l, units) : null;
    }),
  }));
  const travel = WHEEL_NAMES.map((name, k) => ({
    label: name,
    colour: WHEEL_COLOURS[k],
    dash: WHEEL_DASHES[k],
    values: r.stations.map((s) => (ok(s) ? 100 * s.wheels[k].travelFraction : null)),
  }));
  const forceAngle = [{ label: 'force-angle', colour: MARGIN_COLOUR, values: r.stations.map((s) => (ok(s) ? radToDeg(s.forceAngleRad) : null)) }];
  const energy = [{ label: 'energy', colour: ENERGY_COLOUR, values: r.stations.map((s) => (ok(s) ? toDisplay('short', s.energyM, units) : null)) }];
  const marks: DistanceMark[] = r.events.map((e) => ({
    x: toDisplay('distance', e.startDistanceM, units),
    label: eventWords(e, units),
    strong: e.kind === 'tip' || e.kind === 'lifted',
  }));
  return { distances, loads, travel, forceAngle, energy, marks };
}
