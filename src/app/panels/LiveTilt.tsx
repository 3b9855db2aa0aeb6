import { useEffect, useMemo, useRef, useState } from 'react';
import { cardFor } from '../../report/card';
import { usePlumb, usePlumbStore } from '../../store/react';
import { gravityInDevice, readAxis, vehicleAxes, vehicleTilt, type AxisLimits, type AxisReading, type Mount, type Vec3 } from './liveTiltMath';
import './fieldkit.css';

import { DEG_PER_RAD as DEG } from '../../present/units';
/** No reading this long after starting: the device has no orientation sensor (ms). */
const NO_SENSOR_MS = 2500;

type SensorState = 'off' | 'asking' | 'waiting' | 'live' | 'none' | 'denied';

type PermissionCapable = { requestPermission?: () => Promise<'granted' | 'denied'> };

/** A half dial: the needle at the angle now, marks at the operating line, the lift and the tip each way. */
function Dial({ label, valueRad, pos, neg, posWord, negWord, testId, reading }: { label: string; valueRad: number | null; pos: AxisLimits; neg: AxisLimits; posWord: string; negWord: string; testId: string; reading: AxisReading | null }) {
  const R = 70, cx = 90, cy = 84;
  const span = Math.max(pos.tipRad, neg.tipRad, 30 / DEG);
  // + to the right of the dial for roll (right side down) and for pitch (nose down).
  const at = (rad: number, r = R) => {
    const a = (Math.max(-span, Math.min(span, rad)) / span) * (Math.PI / 2);
    return [cx + r * Math.sin(a), cy - r * Math.cos(a)] as const;
  };
  const tick = (rad: number, colour: string, w = 2) => {
    const [x1, y1] = at(rad, R - 10);
    const [x2, y2] = at(rad, R + 4);
    return <line x1={x1} y1={y1} x2={x2} y2={y2} stroke={colour} strokeWidth={w} />;
  };
  const [nx, ny] = at(valueRad ?? 0, R - 6);
  return (
    <div className="dial">
      <svg viewBox="0 0 180 100" width="180" height="100" role="img" aria-label={`${label} dial`}>
        <path d={`M ${cx - R} ${cy} A ${R} ${R} 0 0 1 ${cx + R} ${cy}`} fill="none" stroke="#bbb" strokeWidth={6} />
        {tick(pos.operatingRad, '#0b7a35')}
        {tick(-neg.operatingRad, '#0b7a35')}
        {tick(pos.liftRad, '#D55E00')}
        {tick(-neg.liftRad, '#D55E00')}
        {tick(pos.tipRad, '#c0392b', 3)}
        {tick(-neg.tipRad, '#c0392b', 3)}
        {valueRad !== null ? <line x1={cx} y1={cy} x2={nx} y2={ny} stroke="#000" strokeWidth={3} /> : null}
        <text x={6} y={98} fontSize="9">
          {negWord}
        </text>
        <text x={174} y={98} fontSize="9" textAnchor="end">
          {posWord}
        </text>
      </svg>
      <div className="reading" data-testid={testId}>
        {reading ? `${(reading.angleRad * DEG).toFixed(1)}° ${reading.toward === 'level' ? '(level)' : reading.toward}` : '–'}
      </div>
      <div className="fineprint">{label}</div>
    </div>
  );
}

/**
 * Live tilt: on a phone or tablet mounted in the vehicle, the orientation sensor gives the vehicle's
 * roll and pitch now (after a zero taken on level ground), shown against this build's slopes from
 * level at which a wheel lifts and it tips, for the side it leans toward; the margin left and a
 * warning past the operating line. Says so where no sensor exists or the browser refuses it.
 */
export function LiveTilt() {
  const store = usePlumbStore();
  const vehicle = usePlumb((s) => s.scenario.vehicle);
  const [state, setState] = useState<SensorState>('off');
  const [mount, setMount] = useState<Mount>('flat-top-forward');
  const [gravity, setGravity] = useState<Vec3 | null>(null);
  const [zero, setZero] = useState<Vec3 | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const listening = useRef<((e: DeviceOrientationEvent) => void) | null>(null);

  // This build's limits each way (a level tilt table: the slope from level), as on the limit card.
  // Worked out only once the sensor is started (four tilt sweeps), and again when the vehicle changes.
  const active = state !== 'off';
  const limits = useMemo(() => {
    if (!active) return null;
    const c = cardFor(store.getState().scenario, 'as given', vehicle, null);
    const d = Object.fromEntries(c.directions.map((x) => [x.name, x]));
    const lim = (n: string): AxisLimits => {
      const x = d[n];
      const tip = x.tip ? x.tip.angleRad : 89 / DEG;
      return { liftRad: x.lift ? x.lift.angleRad : tip, tipRad: tip, operatingRad: x.operatingRad };
    };
    return { left: lim('leftDown'), right: lim('rightDown'), nose: lim('noseDown'), tail: lim('tailDown') };
  }, [active, vehicle, store]);

  const stop = () => {
    if (listening.current) window.removeEventListener('deviceorientation', listening.current);
    listening.current = null;
    if (timer.current) clearTimeout(timer.current);
  };
  useEffect(() => stop, []);

  const start = async () => {
    stop();
    if (typeof window === 'undefined' || !('DeviceOrientationEvent' in window)) {
      setState('none');
      return;
    }
    const DOE = (window as unknown as { DeviceOrientationEvent: PermissionCapable }).DeviceOrientationEvent;
    if (typeof DOE.requestPermission === 'function') {
      setState('asking');
      try {
        if ((await DOE.requestPermission()) !== 'granted') {
          setState('denied');
          return;
        }
      } catch {
        setState('denied');
        return;
      }
    }
    setState('waiting');
    const on = (e: DeviceOrientationEvent) => {
      if (e.beta === null || e.gamma === null) return;
      if (timer.current) clearTimeout(timer.current);
      setGravity(gravityInDevice(e.beta, e.gamma));
      setState('live');
    };
    listening.current = on;
    window.addEventListener('deviceorientation', on);
    timer.current = setTimeout(() => setState((s) => (s === 'waiting' ? 'none' : s)), NO_SENSOR_MS);
  };

  const axes = zero ? vehicleAxes(zero, mount) : null;
  const tilt = gravity && axes ? vehicleTilt(gravity, axes) : null;
  const roll = tilt && limits ? readAxis(tilt.rollRad, 'roll', limits.right, limits.left) : null;
  const pitch = tilt && limits ? readAxis(tilt.pitchRad, 'pitch', limits.nose, limits.tail) : null;
  const worst = roll && pitch ? (roll.toLiftRad <= pitch.toLiftRad ? roll : pitch) : null;
  const past = (roll?.pastOperating ?? false) || (pitch?.pastOperating ?? false);

  return (
    <section className="panel live-tilt" aria-labelledby="tilt-live-h">
      <details>
        <summary>
          <h2 id="tilt-live-h">Live tilt (phone or tablet in the vehicle)</h2>
        </summary>
        <p className="hint">
          Mount the device firmly, stop on level ground, start the sensor and zero it there. The readout is the vehicle's roll and pitch from that zero, against this
          build's slopes at which a wheel lifts and it tips.
        </p>
        <div className="row">
          <label className="field">
            <span className="field-label">The device is mounted</span>
            <select value={mount} data-testid="tilt-live-mount" onChange={(e) => setMount(e.target.value as Mount)}>
              <option value="flat-top-forward">lying flat, its top edge toward the front</option>
              <option value="upright-facing-driver">upright, its screen toward the driver</option>
            </select>
          </label>
        </div>
        <div className="buttons">
          <button type="button" data-testid="tilt-live-start" onClick={() => void start()}>
            {state === 'live' ? 'Restart the sensor' : 'Start the tilt sensor'}
          </button>
          <button type="button" data-testid="tilt-live-zero" disabled={!gravity || state !== 'live'} onClick={() => setZero(gravity)}>
            Zero here on level ground
          </button>
        </div>
        <p className="hint" data-testid="tilt-live-status">
          {state === 'off' && 'The sensor is off.'}
          {state === 'asking' && 'Asking the browser for the motion sensor…'}
          {state === 'waiting' && 'Waiting for the sensor…'}
          {state === 'none' && 'No tilt sensor on this device (or the browser gives no readings): the live readout needs a phone or tablet.'}
          {state === 'denied' && 'The browser refused the motion sensor. Allow motion and orientation access for this site in its settings, then start again.'}
          {state === 'live' && !zero && 'Sensor on. Stop on level ground and press "Zero here on level ground".'}
          {state === 'live' && zero && !axes && 'The front of the vehicle cannot be told from this mount and zero: choose the other mount, or zero again.'}
          {state === 'live' && axes && 'Live.'}
        </p>
        {limits ? (
        <div className="dials">
          <Dial label="Roll (side to side), from the zero" valueRad={tilt ? tilt.rollRad : null} pos={limits.right} neg={limits.left} posWord="right down" negWord="left down" testId="tilt-live-roll" reading={roll} />
          <Dial label="Pitch (nose and tail), from the zero" valueRad={tilt ? tilt.pitchRad : null} pos={limits.nose} neg={limits.tail} posWord="nose down" negWord="tail down" testId="tilt-live-pitch" reading={pitch} />
        </div>
        ) : (
          <div className="dials">
            <div className="reading" data-testid="tilt-live-roll">–</div>
            <div className="reading" data-testid="tilt-live-pitch">–</div>
          </div>
        )}
        <p className={past ? 'warning' : undefined} data-testid="tilt-live-margin" data-past-operating={past ? 'true' : 'false'} data-to-lift-deg={worst ? worst.toLiftRad * DEG : ''}>
          {worst
            ? `${past ? 'PAST THE OPERATING LINE. ' : ''}Margin left: ${(worst.toLiftRad * DEG).toFixed(1)}° to the first wheel lift and ${(worst.toTipRad * DEG).toFixed(1)}° to the tip (${worst.toward === 'level' ? 'level' : worst.toward}).`
            : 'Margin: start the sensor and zero it.'}
        </p>
        {limits ? (
        <p className="fineprint">
          Limits each way (slope from level, this build): left {(limits.left.liftRad * DEG).toFixed(1)}° lift / {(limits.left.tipRad * DEG).toFixed(1)}° tip; right{' '}
          {(limits.right.liftRad * DEG).toFixed(1)}° / {(limits.right.tipRad * DEG).toFixed(1)}°; nose {(limits.nose.liftRad * DEG).toFixed(1)}° /{' '}
          {(limits.nose.tipRad * DEG).toFixed(1)}°; tail {(limits.tail.liftRad * DEG).toFixed(1)}° / {(limits.tail.tipRad * DEG).toFixed(1)}°. Green marks: the operating
          line (common practice, at most 15°). Each axis is read against its own limit; a slope at an angle to both is worse than either alone. Quasi-static estimates
          on firm ground: bumps, soft edges and motion take the real margin down; keep to the vehicle maker's limits.
        </p>
        ) : null}
      </details>
    </section>
  );
}
