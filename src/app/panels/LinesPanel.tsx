import { useMemo, useState } from 'react';
import type { LineSummary, Scenario, SweepRange } from '../../core';
import { lineRows } from './LinesPanelRows';
import { runLines, type LineSweepReply } from '../../worker/client';
import { RAD_PER_DEG, angleText, changeText, distanceText } from '../../present/units';
import { filledLinesWords } from '../../present/words';
import { useWorkerJob } from './useWorkerJob';
import { usePlumb, usePlumbStore, useScenarioPoseAside } from '../../store/react';
import { NumberField } from './NumberField';

type Done = LineSweepReply & { readonly for: Scenario };

/** Lines listed at once, best and worst. */
const SHOWN_LINES = 8;

function RangeFields({ label, kind, value, onChange, testId }: { label: string; kind: 'length' | 'angle'; value: SweepRange; onChange: (r: SweepRange) => void; testId: string }) {
  const units = usePlumb((s) => s.units);
  return (
    <fieldset className="group">
      <legend>{label}</legend>
      <div className="row">
        <NumberField label="From" kind={kind} units={units} valueSI={value.from} testId={`${testId}-from`} onChange={(v) => onChange({ ...value, from: v })} />
        <NumberField label="To" kind={kind} units={units} valueSI={value.to} testId={`${testId}-to`} onChange={(v) => onChange({ ...value, to: v })} />
        <NumberField label="Step" kind={kind} units={units} valueSI={value.step} testId={`${testId}-step`} check={(d) => (d <= 0 ? 'must be > 0' : null)} onChange={(v) => onChange({ ...value, step: v })} />
      </div>
    </fieldset>
  );
}

/** Count of values of a range as the core makes them (src/core/analysis/lines.ts rangeValues). */
function countOf(r: SweepRange): number {
  if (!(r.step > 0) || r.to < r.from) return r.from === r.to ? 1 : 0;
  return Math.floor((r.to - r.from) / r.step + 1e-9) + 1;
}

/**
 * Best line: the scenario path moved sideways and turned, each line an obstacle pass (in a
 * worker), ranked by the smallest force-angle margin; the chosen line is drawn on the terrain.
 */
export function LinesPanel() {
  const store = usePlumbStore();
  // Not re-rendered while the vehicle is dragged: nothing here depends on the pose.
  const scenario = useScenarioPoseAside();
  const units = usePlumb((s) => s.units);
  const chosen = usePlumb((s) => s.overlayPath);
  const [offsets, setOffsets] = useState<SweepRange>({ from: -1, to: 1, step: 0.5 });
  const [headings, setHeadings] = useState<SweepRange>({ from: -5 * RAD_PER_DEG, to: 5 * RAD_PER_DEG, step: 5 * RAD_PER_DEG });
  const [done, setDone] = useState<Done | null>(null);
  const { progress, message, run, cancel } = useWorkerJob();
  // Ranks as the core gives them: lines whose margins differ by no more than the method's
  // resolution (0.1°) share a rank and are marked tied (src/core/analysis/lines.ts rankLines).
  const { rows, resolutionRad } = useMemo(() => lineRows(done?.ranked ?? []), [done]);
  if (!scenario.path) {
    return (
      <section className="panel" aria-labelledby="lines-h">
        <h2 id="lines-h">Best line</h2>
        <p className="hint">This scenario has no path to vary.</p>
      </section>
    );
  }
  const count = countOf(offsets) * countOf(headings);
  const stale = done !== null && (done.for.vehicle !== scenario.vehicle || done.for.terrain !== scenario.terrain || done.for.path !== scenario.path);
  const start = () => {
    const s = store.getState().scenario;
    run(
      (onProgress) => runLines(s, offsets, headings, onProgress),
      (r) => {
        setDone({ ...r, for: s });
        if (r.ranked.length > 0) store.getState().setOverlayPath(r.ranked[0].path);
      },
      count,
    );
  };
  const ranked = done?.ranked ?? [];
  const list = rows.map((r, pos) => ({ ...r, pos }));
  const worstRank = list.length > 0 ? list[list.length - 1].rank : 0;
  const shown = list.length <= SHOWN_LINES ? list : [...list.slice(0, SHOWN_LINES / 2), ...list.slice(-SHOWN_LINES / 2)];
  const words = (l: LineSummary): string => {
    const parts = [`force-angle margin ${angleText(l.minForceAngleRad)} at ${distanceText(l.minMarginDistanceM, units)}`];
    if (l.tip) parts.push(`tips at ${distanceText(l.tip.distanceM, units)}`);
    else if (l.firstLift) parts.push(`${l.firstLift.wheel} lifts at ${distanceText(l.firstLift.distanceM, units)}`);
    else if (l.firstUnload) parts.push(`${l.firstUnload.wheel} light at ${distanceText(l.firstUnload.distanceM, units)}`);
    return parts.join('; ');
  };
  return (
    <section className="panel" aria-labelledby="lines-h">
      <details>
        <summary>
          <h2 id="lines-h">Best line</h2>
        </summary>
        <p className="hint">The path moved to its left (+) or right (−) and turned about its middle; each line is a full pass. Ranked by the smallest force-angle margin.</p>
        <RangeFields label="Sideways offset" kind="length" value={offsets} onChange={setOffsets} testId="lines-offset" />
        <RangeFields label="Heading change (+ turns left)" kind="angle" value={headings} onChange={setHeadings} testId="lines-heading" />
        <div className="buttons">
          <button type="button" data-testid="lines-run" disabled={progress !== null || count === 0 || count > 400} onClick={start}>
            Try {count} line{count === 1 ? '' : 's'}
          </button>
          {progress ? (
            <button type="button" data-testid="lines-cancel" onClick={cancel}>
              Cancel
            </button>
          ) : null}
          {chosen ? (
            <button type="button" onClick={() => store.getState().setOverlayPath(null)}>
              Hide the line
            </button>
          ) : null}
        </div>
        {count > 400 ? <p className="hint">At most 400 lines at once: take larger steps.</p> : null}
        {progress ? <progress data-testid="lines-progress" max={progress.total} value={progress.done} style={{ width: '100%' }} /> : null}
        {message ? <p className="hint">{message}</p> : null}
        {done ? (
          <div data-testid="lines-result">
            {stale ? <p className="hint">The scenario changed since this sweep: run it again.</p> : null}
            <ol className="lines" data-testid="lines-list">
              {shown.map(({ line, rank, tied, pos }, k) => (
                <li key={line.index} value={rank} className={chosen === line.path ? 'chosen' : undefined} data-testid="lines-item" data-rank={rank} data-tied={tied}>
                  {k === SHOWN_LINES / 2 && list.length > SHOWN_LINES ? <span className="gap">…</span> : null}
                  <button type="button" className="link" data-testid={`lines-row-${pos}`} onClick={() => store.getState().setOverlayPath(line.path)}>
                    {rank === 1 ? 'Best: ' : rank === worstRank ? 'Worst: ' : ''}
                    offset {changeText('distance', line.offsetM, units)}, heading {changeText('angle', line.headingChangeRad, units)}: {words(line)}
                  </button>
                  {tied > 0 ? (
                    <span className="tied" data-testid="lines-tied">
                      {' '}
                      tied (rank {rank}) with {tied} other{tied === 1 ? '' : 's'}: margins within {angleText(resolutionRad)}
                    </span>
                  ) : null}
                </li>
              ))}
            </ol>
            {filledLinesWords(ranked) ? <p className="hint" data-testid="lines-filled-ground">{filledLinesWords(ranked)}</p> : null}
            <div className="buttons">
              <button
                type="button"
                disabled={!chosen || stale}
                data-testid="lines-use"
                onClick={() => {
                  if (chosen) store.getState().replaceScenario({ ...store.getState().scenario, path: chosen });
                }}
              >
                Make the drawn line the scenario path
              </button>
            </div>
            <p className="fineprint">
              Ranked only where the smallest force-angle margins differ by more than {angleText(resolutionRad)}, the method&apos;s
              resolution (the pass looks at its stations only); closer lines share a rank and are marked tied. {ranked.length} lines in {done.wallMs.toFixed(0)} ms on {done.workers} {done.workers === 1 ? 'worker' : 'workers'}. The drawn line (blue) is the one picked; the dark line is the scenario path. Static margins only: keep far inside them.
            </p>
          </div>
        ) : null}
      </details>
    </section>
  );
}
