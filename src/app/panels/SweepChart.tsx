import { WHEEL_NAMES, type TiltSweepResult, type UnitSystem } from '../../core';
import { fmt, niceStep } from './chartScale';
import { DEG_PER_RAD, forceUnit, forceValue } from '../format';
import { WHEEL_COLOURS, WHEEL_DASHES } from '../../view/colormap';

export interface SweepChartProps {
  sweep: TiltSweepResult;
  units: UnitSystem;
  /** The tilt set now (rad), drawn as a thin line. */
  currentRad?: number;
  width?: number;
  height?: number;
}

/** The four normal tyre loads against tilt, plain SVG, with the first lift and the tip marked. */
export function SweepChart({ sweep, units, currentRad, width = 360, height = 210 }: SweepChartProps) {
  const pad = { l: 46, r: 12, t: 12, b: 34 };
  const samples = [...sweep.samples].filter((s) => s.status === 'converged').sort((a, b) => a.angleRad - b.angleRad);
  const xMax = Math.max(1, Math.ceil(Math.max(...samples.map((s) => s.angleRad * DEG_PER_RAD), sweep.tip ? sweep.tip.angleRad * DEG_PER_RAD : 0) / 5) * 5);
  let yMaxRaw = 0;
  for (const s of samples) for (const l of s.loadsN) yMaxRaw = Math.max(yMaxRaw, forceValue(l, units));
  const yStep = niceStep(yMaxRaw / 4);
  const yMax = Math.max(yStep, Math.ceil(yMaxRaw / yStep) * yStep);
  const W = width - pad.l - pad.r;
  const H = height - pad.t - pad.b;
  const X = (deg: number) => pad.l + (deg / xMax) * W;
  const Y = (v: number) => pad.t + H - (v / yMax) * H;
  const xTicks: number[] = [];
  const xs = xMax <= 20 ? 5 : 10;
  for (let d = 0; d <= xMax + 1e-9; d += xs) xTicks.push(d);
  const yTicks: number[] = [];
  for (let v = 0; v <= yMax + 1e-9; v += yStep) yTicks.push(v);
  const lift = sweep.firstLift ? sweep.firstLift.angleRad * DEG_PER_RAD : null;
  const tip = sweep.tip ? sweep.tip.angleRad * DEG_PER_RAD : null;
  return (
    <svg
      className="chart"
      viewBox={`0 0 ${width} ${height}`}
      width="100%"
      role="img"
      aria-label="Normal load on each tyre against tilt angle"
      data-testid="sweep-chart"
    >
      <rect x={pad.l} y={pad.t} width={W} height={H} fill="#fff" stroke="#999" />
      {yTicks.map((v) => (
        <g key={`y${v}`}>
          <line x1={pad.l} x2={pad.l + W} y1={Y(v)} y2={Y(v)} stroke="#e3e3e3" />
          <text x={pad.l - 4} y={Y(v) + 4} textAnchor="end" fontSize="10">
            {fmt(v)}
          </text>
        </g>
      ))}
      {xTicks.map((d) => (
        <g key={`x${d}`}>
          <line x1={X(d)} x2={X(d)} y1={pad.t} y2={pad.t + H} stroke="#eeeeee" />
          <text x={X(d)} y={pad.t + H + 13} textAnchor="middle" fontSize="10">
            {d}°
          </text>
        </g>
      ))}
      <text x={pad.l + W / 2} y={height - 4} textAnchor="middle" fontSize="10">
        Tilt angle
      </text>
      <text x={10} y={pad.t + H / 2} fontSize="10" textAnchor="middle" transform={`rotate(-90 10 ${pad.t + H / 2})`}>
        Normal load ({forceUnit(units)})
      </text>
      {WHEEL_NAMES.map((name, i) => (
        <polyline
          key={name}
          fill="none"
          stroke={WHEEL_COLOURS[i]}
          strokeWidth={2}
          strokeDasharray={WHEEL_DASHES[i] || undefined}
          points={samples.map((s) => `${X(s.angleRad * DEG_PER_RAD).toFixed(1)},${Y(forceValue(s.loadsN[i], units)).toFixed(1)}`).join(' ')}
        />
      ))}
      {lift !== null ? (
        <g>
          <line x1={X(lift)} x2={X(lift)} y1={pad.t} y2={pad.t + H} stroke="#000" strokeDasharray="4 2" />
          <text x={X(lift) - 3} y={pad.t + 11} textAnchor="end" fontSize="10" fontWeight="bold">
            {sweep.firstLift?.wheel} lifts {lift.toFixed(1)}°
          </text>
        </g>
      ) : null}
      {tip !== null ? (
        <g>
          <line x1={X(tip)} x2={X(tip)} y1={pad.t} y2={pad.t + H} stroke="#000" strokeWidth={2} />
          <text x={X(tip) - 3} y={pad.t + 24} textAnchor="end" fontSize="10" fontWeight="bold">
            tips {tip.toFixed(1)}°
          </text>
        </g>
      ) : null}
      {currentRad !== undefined && currentRad * DEG_PER_RAD <= xMax ? (
        <line x1={X(currentRad * DEG_PER_RAD)} x2={X(currentRad * DEG_PER_RAD)} y1={pad.t} y2={pad.t + H} stroke="#777" />
      ) : null}
      {WHEEL_NAMES.map((name, i) => (
        <g key={`k${name}`} transform={`translate(${pad.l + 8 + i * 48}, ${pad.t + H - 10})`}>
          <line x1={0} x2={16} y1={0} y2={0} stroke={WHEEL_COLOURS[i]} strokeWidth={2} strokeDasharray={WHEEL_DASHES[i] || undefined} />
          <text x={19} y={4} fontSize="10">
            {name}
          </text>
        </g>
      ))}
    </svg>
  );
}
