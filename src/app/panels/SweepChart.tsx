import { WHEEL_NAMES, type TiltSweepResult, type UnitSystem } from '../../core';
import { linearAxis } from '../../present/scale';
import { radToDeg, toDisplay, unitSymbol } from '../../present/units';
import { WHEEL_COLOURS, WHEEL_DASHES } from '../../present/palette';

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
  const samples = sweep.samples.filter((s) => s.status === 'converged').sort((a, b) => a.angleRad - b.angleRad);
  let degMax = sweep.tip ? radToDeg(sweep.tip.angleRad) : 0;
  let yMaxRaw = 0;
  for (const s of samples) {
    degMax = Math.max(degMax, radToDeg(s.angleRad));
    for (const l of s.loadsN) if (l !== null) yMaxRaw = Math.max(yMaxRaw, toDisplay('force', l, units));
  }
  const W = width - pad.l - pad.r;
  const H = height - pad.t - pad.b;
  const xAxis = linearAxis(0, Math.max(1, degMax), pad.l, pad.l + W, 6);
  const yAxis = linearAxis(0, yMaxRaw, pad.t + H, pad.t, 4);
  const xMax = xAxis.domain[1];
  const X = (deg: number) => xAxis.scale(deg);
  const Y = (v: number) => yAxis.scale(v);
  const xTicks = xAxis.ticks;
  const yTicks = yAxis.ticks;
  const lift = sweep.firstLift ? radToDeg(sweep.firstLift.angleRad) : null;
  const tip = sweep.tip ? radToDeg(sweep.tip.angleRad) : null;
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
            {yAxis.label(v)}
          </text>
        </g>
      ))}
      {xTicks.map((d) => (
        <g key={`x${d}`}>
          <line x1={X(d)} x2={X(d)} y1={pad.t} y2={pad.t + H} stroke="#eeeeee" />
          <text x={X(d)} y={pad.t + H + 13} textAnchor="middle" fontSize="10">
            {xAxis.label(d)}°
          </text>
        </g>
      ))}
      <text x={pad.l + W / 2} y={height - 4} textAnchor="middle" fontSize="10">
        Tilt angle from level
      </text>
      <text x={10} y={pad.t + H / 2} fontSize="10" textAnchor="middle" transform={`rotate(-90 10 ${pad.t + H / 2})`}>
        Normal load ({unitSymbol('force', units)})
      </text>
      {WHEEL_NAMES.map((name, i) => (
        <polyline
          key={name}
          fill="none"
          stroke={WHEEL_COLOURS[i]}
          strokeWidth={2}
          strokeDasharray={WHEEL_DASHES[i] || undefined}
          points={samples
            .filter((s) => s.loadsN[i] !== null)
            .map((s) => `${X(radToDeg(s.angleRad)).toFixed(1)},${Y(toDisplay('force', s.loadsN[i] as number, units)).toFixed(1)}`)
            .join(' ')}
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
      {currentRad !== undefined && radToDeg(currentRad) <= xMax ? (
        <line x1={X(radToDeg(currentRad))} x2={X(radToDeg(currentRad))} y1={pad.t} y2={pad.t + H} stroke="#777" />
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
