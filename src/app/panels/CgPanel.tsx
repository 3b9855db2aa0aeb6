import { useMemo, useState } from 'react';
import {
  STANDARD_GRAVITY_M_PER_S2,
  cgFromLevelReadings,
  cgHeightFromAxleLift,
  withMeasuredCg,
  type AxleLiftCg,
  type LevelCg,
  type Scenario,
} from '../../core';
import { setIn, validate } from '../edit';
import { angleText, fromDisplay, lengthText, massText, shortText, unitSymbol } from '../../present/units';
import { usePlumb, usePlumbStore } from '../../store/react';
import { NumberField } from './NumberField';

interface Readings {
  /** Level corner readings FL, FR, RL, RR as the scales show them (kg; NaN: not entered). */
  cornersKg: [number, number, number, number];
  raisedAxle: 'front' | 'rear';
  raiseM: number;
  /** The two corners of the axle that stays on the scales, with the other axle raised (kg). */
  stayingKg: [number, number];
  loadedRadiusM: number;
  locked: boolean;
  writeMass: boolean;
}

const CORNERS = ['FL', 'FR', 'RL', 'RR'] as const;

/**
 * CG from scale readings (core: src/core/analysis/cg.ts): four corners on level ground give the
 * mass and the CG in plan; raising one axle gives the height. Writes the CG into the vehicle
 * (one undoable edit).
 */
export function CgPanel() {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const vehicle = usePlumb((s) => s.scenario.vehicle);
  const [r, setR] = useState<Readings>(() => ({
    cornersKg: [NaN, NaN, NaN, NaN],
    raisedAxle: 'front',
    raiseM: NaN,
    stayingKg: [NaN, NaN],
    loadedRadiusM: vehicle.tyreRear.radiusM,
    locked: false,
    writeMass: true,
  }));
  const [note, setNote] = useState<string | null>(null);
  const g = STANDARD_GRAVITY_M_PER_S2;
  const calc = useMemo((): { level: LevelCg | null; lift: AxleLiftCg | null; error: string | null } => {
    if (r.cornersKg.some((x) => !Number.isFinite(x))) return { level: null, lift: null, error: null };
    let level: LevelCg;
    try {
      // A scale shows weight / g (kg or lb); the core takes forces (N).
      level = cgFromLevelReadings({
        cornersN: [r.cornersKg[0] * g, r.cornersKg[1] * g, r.cornersKg[2] * g, r.cornersKg[3] * g],
        wheelbaseM: vehicle.wheelbaseM,
        trackFrontM: vehicle.trackFrontM,
        trackRearM: vehicle.trackRearM,
      });
    } catch (e) {
      return { level: null, lift: null, error: (e as Error).message };
    }
    if (!Number.isFinite(r.raiseM) || r.stayingKg.some((x) => !Number.isFinite(x))) return { level, lift: null, error: null };
    try {
      const lift = cgHeightFromAxleLift({
        wheelbaseM: vehicle.wheelbaseM,
        weightN: level.weightN,
        raisedAxle: r.raisedAxle,
        raiseM: r.raiseM,
        levelStayingAxleN: r.raisedAxle === 'front' ? level.rearAxleN : level.frontAxleN,
        raisedStayingAxleN: (r.stayingKg[0] + r.stayingKg[1]) * g,
        loadedRadiusM: r.loadedRadiusM,
        suspensionLocked: r.locked,
      });
      return { level, lift, error: null };
    } catch (e) {
      return { level, lift: null, error: (e as Error).message };
    }
  }, [r, vehicle, g]);

  const write = () => {
    const { level, lift } = calc;
    if (!level) return;
    const cur = store.getState().scenario;
    const v = withMeasuredCg(cur.vehicle, {
      heightM: lift?.heightM,
      behindFrontAxleM: level.behindFrontAxleM,
      leftOfCentreM: level.leftOfCentreM,
      massKg: r.writeMass ? level.massKg : undefined,
    });
    const cand = setIn<Scenario>(cur, ['vehicle'], v);
    const res = validate(cand);
    if (!res.ok) {
      setNote(`Not written: ${res.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
      return;
    }
    store.getState().replaceScenario(cand);
    setNote(`Written into the vehicle${lift ? '' : ' (plan position only: no height without the raised readings)'}. Undo takes it back.`);
  };

  const side = r.raisedAxle === 'front' ? 'rear' : 'front';
  return (
    <section className="panel" aria-labelledby="cg-h">
      <details>
        <summary>
          <h2 id="cg-h">Measure the CG</h2>
        </summary>
        <p className="hint">
          Weigh the vehicle as its mass is given in the build (the payload list is added on top: leave it off the scales, or out of the list). Enter what the scales read.
        </p>
        <fieldset className="group">
          <legend>1. Level, a scale under each tyre</legend>
          <div className="grid2">
            {CORNERS.map((c, i) => (
              <NumberField
                key={c}
                label={`${c} reading`}
                kind="mass"
                units={units}
                valueSI={r.cornersKg[i]}
                testId={`cg-${c.toLowerCase()}`}
                check={(d) => (d < 0 ? 'must be ≥ 0' : null)}
                onChange={(v) => setR((o) => ({ ...o, cornersKg: o.cornersKg.map((x, j) => (j === i ? v : x)) as Readings['cornersKg'] }))}
              />
            ))}
          </div>
          <p className="fineprint">
            Wheelbase {lengthText(vehicle.wheelbaseM, units)}, tracks {lengthText(vehicle.trackFrontM, units)} / {lengthText(vehicle.trackRearM, units)}, from the build.
          </p>
        </fieldset>
        <fieldset className="group">
          <legend>2. One axle raised</legend>
          <div className="row">
            <label className="field">
              <span className="field-label">Axle raised</span>
              <select data-testid="cg-axle" value={r.raisedAxle} onChange={(e) => setR((o) => ({ ...o, raisedAxle: e.target.value as Readings['raisedAxle'] }))}>
                <option value="front">front</option>
                <option value="rear">rear</option>
              </select>
            </label>
            <NumberField
              label="Raised by"
              kind="length"
              units={units}
              valueSI={r.raiseM}
              testId="cg-raise"
              check={(d) => (d <= 0 ? 'must be > 0' : null)}
              onChange={(v) => setR((o) => ({ ...o, raiseM: v }))}
            />
          </div>
          <div className="grid2">
            {[0, 1].map((i) => (
              <NumberField
                key={i}
                label={`${side === 'front' ? 'F' : 'R'}${i === 0 ? 'L' : 'R'} reading, raised`}
                kind="mass"
                units={units}
                valueSI={r.stayingKg[i]}
                testId={`cg-staying-${i === 0 ? 'left' : 'right'}`}
                check={(d) => (d < 0 ? 'must be ≥ 0' : null)}
                onChange={(v) => setR((o) => ({ ...o, stayingKg: o.stayingKg.map((x, j) => (j === i ? v : x)) as Readings['stayingKg'] }))}
              />
            ))}
            <NumberField
              label="Loaded tyre radius"
              kind="length"
              units={units}
              valueSI={r.loadedRadiusM}
              testId="cg-radius"
              check={(d) => (d <= 0 ? 'must be > 0' : null)}
              onChange={(v) => setR((o) => ({ ...o, loadedRadiusM: v }))}
            />
          </div>
          <label className="inline">
            <input type="checkbox" data-testid="cg-locked" checked={r.locked} onChange={(e) => setR((o) => ({ ...o, locked: e.target.checked }))} /> Suspension locked (blocked) for the raised reading
          </label>
        </fieldset>
        <div data-testid="cg-result" className="cg-result">
          {calc.error ? <p className="field-error">{calc.error}</p> : null}
          {calc.level ? (
            <p>
              Mass {massText(calc.level.massKg, units)}; CG {lengthText(calc.level.behindFrontAxleM, units)} behind the front axle,{' '}
              {lengthText(calc.level.leftOfCentreM ?? 0, units)} left of centre
              {calc.lift ? (
                <>
                  , <b data-testid="cg-height">{lengthText(calc.lift.heightM, units)} high</b> (raise angle {angleText(calc.lift.raiseAngleRad)} from level; each {unitSymbol('scale', units)} of reading error moves it by{' '}
                  {shortText(calc.lift.heightPerReadingErrorM * fromDisplay('scale', 1, units), units)})
                </>
              ) : (
                ' (the height needs the raised readings)'
              )}
              .
            </p>
          ) : !calc.error ? (
            <p className="hint">Enter the four level readings.</p>
          ) : null}
          {calc.lift && calc.lift.warnings.length > 0 ? (
            <ul className="warnings" data-testid="cg-warnings">
              {calc.lift.warnings.map((w, i) => (
                <li key={i} className="warning">
                  Warning: {w}.
                </li>
              ))}
            </ul>
          ) : null}
        </div>
        <label className="inline">
          <input type="checkbox" checked={r.writeMass} onChange={(e) => setR((o) => ({ ...o, writeMass: e.target.checked }))} /> Also write the mass
        </label>
        <div className="buttons">
          <button type="button" data-testid="cg-write" disabled={!calc.level} onClick={write}>
            Write the CG into the vehicle
          </button>
        </div>
        {note ? <p className="hint" data-testid="cg-note">{note}</p> : null}
        <p className="fineprint">Axle-lift method (SAE J874 / ISO 10392 practice). Labs measuring the same vehicle have disagreed significantly: treat the height as a band.</p>
      </details>
    </section>
  );
}
