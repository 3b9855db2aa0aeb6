import { useMemo, useState } from 'react';
import type { Scenario, UnitSystem } from '../../core';
import { parseTyreSize, parseWheelSize, type TyreSize } from '../../core/scenario/tyreSize';
import { toDisplay, unitSymbol } from '../../present/units';
import { setIn, validate } from '../edit';
import { usePlumb, usePlumbStore } from '../../store/react';

/** A size length in the user's units: mm to 0.1 in metric, inches to 0.1 in imperial (a size is not known better). */
function sizeLength(m: number, units: UnitSystem): string {
  return `${toDisplay('short', m, units).toFixed(1)} ${unitSymbol('short', units)}`;
}

function stiffnessText(nPerM: number, units: UnitSystem): string {
  // 1 lbf/in = 4.4482216152605 N / 0.0254 m = 175.1268 N/m.
  return units === 'metric' ? `${Math.round(nPerM / 1000)} kN/m` : `${Math.round(nPerM / 175.12683524647636)} lbf/in`;
}

function resolvedWords(s: TyreSize, units: UnitSystem): string {
  const parts = [`${s.designation}: diameter ${sizeLength(s.diameterM, units)}, radius ${sizeLength(s.radiusM, units)} (unloaded)`];
  if (s.widthM !== null) parts.push(`section width ${sizeLength(s.widthM, units)}`);
  if (s.rimDiameterIn !== null) parts.push(`on a ${s.rimDiameterIn} in rim`);
  if (s.construction) parts.push(s.construction);
  return `${parts.join(', ')}. Stiffness ${stiffnessText(s.stiffnessNPerM, units)}: ${s.stiffnessSource}. Size designation: ISO 4000-1 / ETRTO / Tire and Rim Association.`;
}

/**
 * The tyre and wheel sizes as the trade writes them (315/70R17, LT285/75R16, 35x12.50R17, 17x9 -12),
 * resolved and shown back; the tyre's radius and width (and, if asked, the stiffness estimate) set
 * on the front, rear or both axles as one undoable edit.
 */
export function TyreSizeField() {
  const store = usePlumbStore();
  const units = usePlumb((s) => s.units);
  const [text, setText] = useState('');
  const [confirmed, setConfirmed] = useState<string | null>(null);
  const [axle, setAxle] = useState<'both' | 'front' | 'rear'>('both');
  const [withStiffness, setWithStiffness] = useState(false);
  const [wheelText, setWheelText] = useState('');
  const [note, setNote] = useState<string | null>(null);
  const parsed = useMemo(() => (text.trim() === '' ? null : parseTyreSize(text)), [text]);
  const size: TyreSize | null = parsed === null ? null : parsed.ok === true ? parsed.size : parsed.ok === 'ask' && confirmed === text ? parsed.ifYes : null;
  const wheel = useMemo(() => (wheelText.trim() === '' ? null : parseWheelSize(wheelText)), [wheelText]);

  const apply = () => {
    if (!size) return;
    let cand: Scenario = store.getState().scenario;
    const keys = axle === 'both' ? (['tyreFront', 'tyreRear'] as const) : axle === 'front' ? (['tyreFront'] as const) : (['tyreRear'] as const);
    for (const k of keys) {
      cand = setIn<Scenario>(cand, ['vehicle', k, 'radiusM'], size.radiusM);
      if (size.widthM !== null) cand = setIn<Scenario>(cand, ['vehicle', k, 'widthM'], size.widthM);
      if (withStiffness) cand = setIn<Scenario>(cand, ['vehicle', k, 'stiffnessNPerM'], size.stiffnessNPerM);
    }
    const res = validate(cand);
    if (res.ok) {
      store.getState().replaceScenario(cand);
      setNote(`Set on the ${axle === 'both' ? 'front and rear' : axle} tyres.`);
    } else setNote(`Not applied: ${res.errors[0].path}: ${res.errors[0].message}`);
  };

  return (
    <fieldset className="group" data-testid="tyre-size-group">
      <legend>Tyre and wheel size, as written on the sidewall</legend>
      <label className="field">
        <span className="field-label">Tyre size (315/70R17, LT285/75R16, 35x12.50R17, 35)</span>
        <input
          type="text"
          data-testid="tyre-size"
          value={text}
          placeholder="e.g. 315/70R17"
          onChange={(e) => {
            setText(e.target.value);
            setNote(null);
          }}
        />
      </label>
      {parsed && parsed.ok === 'ask' && confirmed !== text ? (
        <p className="hint" data-testid="tyre-size-question">
          {parsed.question}{' '}
          <button type="button" data-testid="tyre-size-yes" onClick={() => setConfirmed(text)}>
            Yes, the diameter
          </button>
        </p>
      ) : null}
      {parsed && parsed.ok === false ? <p className="field-error">{parsed.message}</p> : null}
      {size ? (
        <>
          <p className="hint" data-testid="tyre-size-resolved">
            {resolvedWords(size, units)}
          </p>
          <div className="row">
            <label className="field">
              <span className="field-label">Fit to</span>
              <select value={axle} data-testid="tyre-size-axle" onChange={(e) => setAxle(e.target.value as typeof axle)}>
                <option value="both">both axles</option>
                <option value="front">front axle</option>
                <option value="rear">rear axle</option>
              </select>
            </label>
            <label className="inline">
              <input type="checkbox" checked={withStiffness} onChange={(e) => setWithStiffness(e.target.checked)} data-testid="tyre-size-stiffness" /> also
              set the stiffness estimate
            </label>
          </div>
          <button type="button" data-testid="tyre-size-apply" onClick={apply}>
            Use this size
          </button>
        </>
      ) : null}
      {note ? <p className="hint">{note}</p> : null}
      <label className="field">
        <span className="field-label">Wheel (17x9 -12 with the offset in mm, or 17x9 BS 4.5 with the backspacing in inches)</span>
        <input type="text" data-testid="wheel-size" value={wheelText} placeholder="e.g. 17x9 -12" onChange={(e) => setWheelText(e.target.value)} />
      </label>
      {wheel && !wheel.ok ? <p className="field-error">{wheel.message}</p> : null}
      {wheel && wheel.ok ? (
        <p className="hint" data-testid="wheel-size-resolved">
          {wheel.wheel.rimDiameterIn}x{wheel.wheel.rimWidthIn} in: offset {wheel.wheel.offsetMm.toFixed(1)} mm, backspacing {wheel.wheel.backspacingIn.toFixed(2)} in
          {wheel.wheel.given === 'offset' ? ' (worked out' : ' (offset worked out'} as backspacing = (rim width + 1 in)/2 + offset/25.4, common practice). A new
          wheel moves the track: enter it in a build with the stock wheel.
        </p>
      ) : null}
      {size && size.rimDiameterIn !== null && wheel && wheel.ok && wheel.wheel.rimDiameterIn !== size.rimDiameterIn ? (
        <p className="field-error">
          The tyre is for a {size.rimDiameterIn} in rim, the wheel is {wheel.wheel.rimDiameterIn} in.
        </p>
      ) : null}
    </fieldset>
  );
}
