import { useState } from 'react';
import { MAX_BUILDS, type BuildRow, type Scenario } from '../../core';
import buildsDemo from '../../../assets/scenarios/side-hill-builds.json';
import { runJob } from '../../worker/client';
import type { ReplyOf } from '../../worker/messages';
import { BUILD_METRICS, METRICS_NOTE, PASS_END_LABEL, changeSense, metricUnit, metricValue } from '../../present/metrics';
import { QUASI_STATIC_CAUTION, buildChangesWords, passEndWords } from '../../present/words';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { BuildsForm } from './BuildsForm';

type Done = ReplyOf<'compare'> & { readonly for: Scenario };

const buildLabel = (name: string): string => `the build "${name}"`;

/**
 * Builds side by side: the vehicle as given and each build of the scenario, as the compare
 * command runs them (in a worker); two of them in the scene, one solid and one as an outline, or
 * one after the other.
 */
export function ComparePanel() {
  const store = usePlumbStore();
  // Not re-rendered while the vehicle is dragged: nothing here depends on the pose.
  const scenario = useScenarioPoseAside();
  const units = usePlumb((s) => s.units);
  const shownLabel = usePlumb((s) => (s.shown?.kind === 'build' ? s.shown.label : null));
  const ghostLabel = usePlumb((s) => s.ghost?.label ?? null);
  const [done, setDone] = useState<Done | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  const builds = scenario.builds ?? [];
  const stale = done !== null && (done.for.vehicle !== scenario.vehicle || done.for.builds !== scenario.builds || done.for.terrain !== scenario.terrain || done.for.path !== scenario.path);

  const start = () => {
    const s = store.getState().scenario;
    run((onProgress) => runJob({ type: 'compare', scenario: s }, onProgress), (r) => setDone({ ...r, for: s }));
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

  return (
    <section className="panel" aria-labelledby="compare-h">
      <details>
        <summary>
          <h2 id="compare-h">Compare builds ({builds.length})</h2>
        </summary>
        <BuildsForm />
        {builds.length === 0 ? (
          <>
            <p className="hint">This scenario has no builds to compare: add one above, or open the demo (the builds are kept in the scenario file's "builds" list).</p>
            <button type="button" data-testid="compare-demo" onClick={() => store.getState().importData(buildsDemo)}>
              Open the builds demo
            </button>
          </>
        ) : (
          <>
            <p className="hint">
              The vehicle as given and {builds.length} build{builds.length === 1 ? '' : 's'}: {builds.map((b) => b.name).join('; ')}.
              {builds.length > MAX_BUILDS - 1 ? ` Only the first ${MAX_BUILDS - 1} are compared (${MAX_BUILDS} columns with the vehicle as given).` : ''}
            </p>
            <div className="buttons">
              <button type="button" data-testid="compare-run" disabled={progress !== null} onClick={start}>
                {done ? 'Compare again' : 'Compare'}
              </button>
              {progress ? (
                <button type="button" data-testid="compare-cancel" onClick={cancel}>
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
                    <th scope="col">Quantity</th>
                    {rows.map((r, i) => (
                      <th key={r.name} scope="col" title={buildChangesWords(r.changes, units, '\n')} data-testid={`compare-build-${i}`}>
                        [{i + 1}] {r.name}
                        {i === 0 ? <small> (reference)</small> : null}
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {BUILD_METRICS.map((m) => (
                    <tr key={m.key} data-testid={`compare-row-${m.key}`}>
                      <th scope="row">
                        {m.label.charAt(0).toUpperCase() + m.label.slice(1)}
                        {metricUnit(m.kind, units) ? <span className="unit"> ({metricUnit(m.kind, units)})</span> : null}
                      </th>
                      {rows.map((r, i) => (
                        <td key={r.name} data-testid={`compare-${m.key}-${i}`} data-value={r.metrics[m.key] ?? ''}>
                          {metricValue(m.kind, r.metrics[m.key], units)}
                          {i > 0 ? (
                            <small
                              className={`change${changeSense(m, r.change[m.key]) > 0 ? ' better' : changeSense(m, r.change[m.key]) < 0 ? ' worse' : ''}`}
                              data-testid={`compare-${m.key}-${i}-change`}
                              data-value={r.change[m.key] ?? ''}
                            >
                              {metricValue(m.kind, r.change[m.key], units, true)}
                            </small>
                          ) : null}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
                {/* How each build's pass ends (words, not a number to subtract): a footer row under the numbers. */}
                {rows.some((r) => r.passEnd) ? (
                  <tfoot>
                    <tr data-testid="compare-row-passEnd">
                      <th scope="row">{PASS_END_LABEL.charAt(0).toUpperCase() + PASS_END_LABEL.slice(1)}</th>
                      {rows.map((r, i) => (
                        <td key={r.name} className="words" style={{ whiteSpace: 'normal', textAlign: 'left', minWidth: 120 }} data-testid={`compare-passEnd-${i}`} data-outcome={r.passEnd?.outcome.kind ?? ''}>
                          {passEndWords(r.passEnd, units)}
                        </td>
                      ))}
                    </tr>
                  </tfoot>
                ) : null}
              </table>
            </div>
            <p className="fineprint">
              Builds as columns, [1] the reference; under each value its change from [1] (green: more stable, orange and bold: less). {METRICS_NOTE} Hover a build for what was changed.
            </p>
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
                  <b>{r.name}</b>: {buildChangesWords(r.changes, units)}
                </li>
              ))}
            </ul>
            <p className="fineprint">
              {done.wallMs.toFixed(0)} ms. {QUASI_STATIC_CAUTION}
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
