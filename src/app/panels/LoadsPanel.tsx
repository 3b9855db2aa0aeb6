import { useMemo } from 'react';
import { OF_STATIC_NOTE, STANDARD_GRAVITY_M_PER_S2, angleText, forceText, percentText, scaleText, shortText } from '../../present/units';
import { statusWords, warningsFor } from '../../present/words';
import { loadShareColour } from '../../present/palette';
import { usePlumb, usePlumbStore } from '../../store/react';
import { shownResult } from '../../store/store';
import { tipSentence } from '../../present/tipWords';
import { tipViewOf } from '../../view/tipState';

/** Side table: the four tyre loads, weight, margins and warnings in words. */
export function LoadsPanel() {
  const store = usePlumbStore();
  const r = usePlumb(shownResult);
  const tip = usePlumb(tipViewOf);
  const shown = usePlumb((s) => s.shown);
  const units = usePlumb((s) => s.units);
  const friction = usePlumb((s) => s.scenario.friction);
  const warnings = useMemo(() => warningsFor(r, friction), [r, friction]);
  let sum = 0;
  for (const w of r.wheels) sum += (w.verticalLoadN as number | null) ?? 0;
  return (
    <section className="panel" aria-labelledby="loads-h">
      <h2 id="loads-h">Tyre loads</h2>
      {shown ? (
        <p className="shown-note" data-testid="shown-note">
          Showing {shown.label}, not the scenario as edited.{' '}
          <button type="button" onClick={() => store.getState().clearShown()}>
            Back to the scenario
          </button>
        </p>
      ) : null}
      <p className="weight" data-testid="vehicle-weight" data-weight-n={r.weightN}>
        Vehicle weight with payload: <b>{scaleText(r.weightN, units)}</b> ({forceText(r.weightN, units)})
      </p>
      {!r.standing ? (
        <p className="danger" role="alert" data-testid="pose-not-standing" data-status={r.status}>
          Goes over: this pose does not stand ({statusWords(r.status).toLowerCase()}: {r.reason}).{' '}
          {tip ? (
            <span data-testid="pose-tip">
              {tipSentence({ edge: tip.tip.edge, downhillRad: tip.downhillRad, tipTiltRad: tip.tip.angleRad, tipFromLevelRad: tip.tip.fromLevelRad, poseTiltRad: tip.poseTiltRad })}{' '}
            </span>
          ) : (
            'No stable state on the way up from the table level (the ground as it lies) was found to draw at the tip, so no tip edge is shown. '
          )}
          No loads, travel or margins are shown: they would belong to no balance.{' '}
          {tip ? 'The vehicle is drawn in red as it stands at the tip, with the edge it goes over in magenta.' : 'The vehicle is drawn as a red ghost.'}
        </p>
      ) : null}
      <table className="loads">
        <thead>
          <tr>
            <th scope="col">Tyre</th>
            <th scope="col" title="What a scale under the tyre reads (force along gravity)">Scale reading</th>
            <th scope="col" title="Force across the contact, normal to the ground">Normal load</th>
            <th scope="col">Of static</th>
            <th scope="col" title="Suspension travel from ride height, + is bump">Travel</th>
          </tr>
        </thead>
        <tbody>
          {r.wheels.map((w) => {
            return (
              <tr key={w.name} className={w.lifted && r.standing ? 'lifted' : undefined} data-testid={`table-load-${w.name}`}>
                <th scope="row">
                  <span className="swatch" style={{ background: loadShareColour(w.loadShare) }} aria-hidden="true" /> {w.name}
                </th>
                <td>{w.lifted && r.standing ? <strong>LIFTED</strong> : scaleText(w.verticalLoadN, units)}</td>
                <td>{forceText(w.loadN, units)}</td>
                <td>{percentText(w.loadShare)}</td>
                <td>
                  {shortText(w.travelM, units)} <small>({percentText(w.travelFraction)})</small>
                </td>
              </tr>
            );
          })}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row">Sum</th>
            <td data-testid="load-sum">{r.standing ? scaleText(sum, units) : '—'}</td>
            <td colSpan={3} />
          </tr>
        </tfoot>
      </table>
      <p className="status" data-testid="solve-status">
        {statusWords(r.status)}
        {r.standing ? (
          <>
            {' · '}force-angle margin {angleText(r.margins.forceAngleRad)}
            {' · '}plumb point {shortText(r.margins.staticM, units)} inside the support
            {' · '}body roll {angleText(r.body.rollToLevelRad)} and pitch {angleText(r.body.pitchToLevelRad)} from level
          </>
        ) : null}
      </p>
      <ul className="warnings" data-testid="warnings" aria-live="polite">
        {warnings.length === 0 ? <li className="note">No lift or tip warnings at this pose.</li> : null}
        {warnings.map((w, i) => (
          <li key={i} className={w.level}>
            {w.level === 'danger' ? 'Danger: ' : w.level === 'warning' ? 'Warning: ' : 'Note: '}
            {w.text}
          </li>
        ))}
      </ul>
      <p className="fineprint">
        Scale reading: force along gravity divided by g = {STANDARD_GRAVITY_M_PER_S2} m/s², so the four add up to the
        weight on any slope. Normal load is the force across the contact. {OF_STATIC_NOTE}
      </p>
    </section>
  );
}
