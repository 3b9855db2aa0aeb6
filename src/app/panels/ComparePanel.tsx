import { useEffect, useRef, useState } from 'react';
import type { BuildRow, MetricName, Scenario } from '../../core';
import buildsDemo from '../../../assets/scenarios/side-hill-builds.json';
import { runJob, type Job } from '../../worker/client';
import type { ReplyOf } from '../../worker/messages';
import { DEG_PER_RAD, distanceText, fromSILength, lengthUnit } from '../format';
import { usePlumb, usePlumbStore } from '../storeContext';

type Done = ReplyOf<'compare'> & { readonly for: Scenario };

const buildLabel = (name: string): string => `the build "${name}"`;
type Kind = 'ratio' | 'length' | 'angle' | 'distance';

/** Columns of the table (the compare command's quantities, the most asked-for first). */
const COLUMNS: readonly (readonly [MetricName, string, Kind])[] = [
  ['ssf', 'SSF', 'ratio'],
  ['cgHeightM', 'CG height', 'length'],
  ['trackMeanM', 'Mean track', 'length'],
  ['leftDownLiftRad', 'Left down: lift', 'angle'],
  ['leftDownTipRad', 'Left down: tip', 'angle'],
  ['rightDownLiftRad', 'Right down: lift', 'angle'],
  ['rightDownTipRad', 'Right down: tip', 'angle'],
  ['noseDownTipRad', 'Nose down: tip', 'angle'],
  ['tailDownTipRad', 'Tail down: tip', 'angle'],
  ['weakestTipRad', 'Weakest tip', 'angle'],
  ['passFirstLiftM', 'Pass: first lift at', 'distance'],
  ['passMinForceAngleRad', 'Pass: least margin', 'angle'],
  ['passMinClearanceM', 'Pass: least gap', 'length'],
];

/**
 * Builds side by side: the vehicle as given and each build of the scenario, as the compare
 * command runs them (in a worker); two of them in the scene, one solid and one as an outline, or
 * one after the other.
 */
export function ComparePanel() {
  const store = usePlumbStore();
  const scenario = usePlumb((s) => s.scenario);
  const units = usePlumb((s) => s.units);
  const shownLabel = usePlumb((s) => (s.shown?.kind === 'build' ? s.shown.label : null));
  const ghostLabel = usePlumb((s) => s.ghost?.label ?? null);
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const [done, setDone] = useState<Done | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const job = useRef<Job<ReplyOf<'compare'>> | null>(null);
  useEffect(() => () => job.current?.cancel(), []);
  const builds = scenario.builds ?? [];
  const stale = done !== null && (done.for.vehicle !== scenario.vehicle || done.for.builds !== scenario.builds || done.for.terrain !== scenario.terrain || done.for.path !== scenario.path);

  const start = () => {
    const s = store.getState().scenario;
    setMessage(null);
    setProgress({ done: 0, total: 1 });
    const j = runJob({ type: 'compare', scenario: s }, (d, t) => setProgress({ done: d, total: t }));
    job.current = j;
    j.done
      .then((r) => setDone({ ...r, for: s }))
      .catch((e: Error) => setMessage(e.message === 'cancelled' ? 'Cancelled.' : `Failed: ${e.message}`))
      .finally(() => {
        if (job.current === j) job.current = null;
        setProgress(null);
      });
  };

  const rows = done?.rows ?? [];
  const solidIndex = shownLabel ? rows.findIndex((r) => buildLabel(r.name) === shownLabel) : 0;
  const ghostIndex = ghostLabel ? rows.findIndex((r) => buildLabel(r.name) === ghostLabel) : -1;
  const setSolid = (i: number) => {
    if (stale) return;
    if (i <= 0) store.getState().clearShown();
    else store.getState().showBuild(rows[i].vehicle, buildLabel(rows[i].name), 'alone');
  };
  const setGhost = (i: number) => {
    if (stale) return;
    if (i < 0) store.setState({ ghost: null });
    else store.getState().showBuild(rows[i].vehicle, buildLabel(rows[i].name), 'ghost');
  };

  const cell = (kind: Kind, v: number | null, signed = false): string => {
    if (v === null) return '–';
    const sign = signed && v > 0 ? '+' : '';
    if (kind === 'ratio') return `${sign}${v.toFixed(3)}`;
    if (kind === 'angle') return `${sign}${(v * DEG_PER_RAD).toFixed(1)}°`;
    if (kind === 'distance') return `${sign}${distanceText(v, units)}`;
    return `${sign}${fromSILength(v, units).toFixed(units === 'metric' ? 3 : 1)} ${lengthUnit(units)}`;
  };

  return (
    <section className="panel" aria-labelledby="compare-h">
      <details>
        <summary>
          <h2 id="compare-h">Compare builds ({builds.length})</h2>
        </summary>
        {builds.length === 0 ? (
          <>
            <p className="hint">This scenario has no builds to compare. Builds are listed in the scenario file ("builds": lift, tyres, wheels and spacers, payload, anti-roll bars, travel).</p>
            <button type="button" data-testid="compare-demo" onClick={() => store.getState().importData(buildsDemo)}>
              Open the builds demo
            </button>
          </>
        ) : (
          <>
            <p className="hint">
              The vehicle as given and {builds.length} build{builds.length === 1 ? '' : 's'}: {builds.map((b) => b.name).join('; ')}.
            </p>
            <div className="buttons">
              <button type="button" data-testid="compare-run" disabled={progress !== null} onClick={start}>
                {done ? 'Compare again' : 'Compare'}
              </button>
              {progress ? (
                <button type="button" data-testid="compare-cancel" onClick={() => job.current?.cancel()}>
                  Cancel
                </button>
              ) : null}
            </div>
          </>
        )}
        {progress ? <progress data-testid="compare-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {done ? (
          <div data-testid="compare-result">
            {stale ? <p className="hint">The scenario changed since this comparison: run it again.</p> : null}
            <div className="table-scroll">
              <table className="compare" data-testid="compare-table">
                <thead>
                  <tr>
                    <th scope="col">Build</th>
                    {COLUMNS.map(([k, label]) => (
                      <th key={k} scope="col">
                        {label}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {rows.map((r, i) => (
                    <tr key={r.name} data-testid={`compare-row-${i}`}>
                      <th scope="row" title={r.changes.join('\n')}>
                        {r.name}
                        {i === 0 ? <small> (reference)</small> : null}
                      </th>
                      {COLUMNS.map(([k, , kind]) => (
                        <td key={k}>
                          {cell(kind, r.metrics[k])}
                          {i > 0 ? <small className="change">{cell(kind, r.change[k], true)}</small> : null}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <p className="fineprint">Second line: change from the first build. Tilt angles on a level tilt table; the pass on the scenario path. Hover a build for what was changed.</p>
            <fieldset className="group">
              <legend>In the scene</legend>
              <div className="row">
                <label className="field">
                  <span className="field-label">Solid</span>
                  <select data-testid="compare-solid" value={Math.max(0, solidIndex)} disabled={stale} onChange={(e) => setSolid(Number(e.target.value))}>
                    {rows.map((r, i) => (
                      <option key={r.name} value={i}>
                        {r.name}
                      </option>
                    ))}
                  </select>
                </label>
                <label className="field">
                  <span className="field-label">Outline (orange)</span>
                  <select data-testid="compare-ghost" value={ghostIndex} disabled={stale} onChange={(e) => setGhost(Number(e.target.value))}>
                    <option value={-1}>none</option>
                    {rows.map((r, i) => (
                      <option key={r.name} value={i}>
                        {r.name}
                      </option>
                    ))}
                  </select>
                </label>
              </div>
              <div className="buttons">
                <button
                  type="button"
                  data-testid="compare-swap"
                  disabled={stale || ghostIndex < 0}
                  onClick={() => {
                    const a = Math.max(0, solidIndex);
                    const b = ghostIndex;
                    setSolid(b);
                    setGhost(a);
                  }}
                >
                  Swap solid and outline
                </button>
                <button type="button" onClick={() => store.getState().clearShown(true)}>
                  Vehicle as given only
                </button>
              </div>
              <p className="fineprint">Both stand at the scenario pose and follow it when the vehicle is moved; the wheel labels and the load table show the solid one.</p>
            </fieldset>
            <ul className="changes">
              {rows.slice(1).map((r: BuildRow) => (
                <li key={r.name}>
                  <b>{r.name}</b>: {r.changes.join('; ')}
                </li>
              ))}
            </ul>
            <p className="fineprint">{done.wallMs.toFixed(0)} ms. Quasi-static estimates on rigid ground; real margins are smaller.</p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
