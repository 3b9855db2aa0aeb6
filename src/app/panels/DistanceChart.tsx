import type { MouseEvent } from 'react';
import { extent, linearAxis } from '../../present/scale';

export interface DistanceSeries {
  readonly label: string;
  readonly colour: string;
  /** SVG dash pattern, '' for solid. */
  readonly dash?: string;
  /** One value per distance (display units); null leaves a gap. */
  readonly values: readonly (number | null)[];
}

export interface DistanceMark {
  /** Distance along the path (display units). */
  readonly x: number;
  readonly label: string;
  /** Drawn heavier (the tip, the first lift). */
  readonly strong?: boolean;
}

export interface DistanceChartProps {
  /** Distances of the stations (display units), ascending. */
  distances: readonly number[];
  series: readonly DistanceSeries[];
  yLabel: string;
  xUnit: string;
  marks?: readonly DistanceMark[];
  /** Distance of the station shown now. */
  current?: number;
  /** Fixed y range; otherwise from the data (with 0 included when includeZero). */
  yRange?: readonly [min: number, max: number];
  includeZero?: boolean;
  /** A click on the plot: the distance under the pointer. */
  onPick?: (x: number) => void;
  /** A click on an event mark: its index in marks. */
  onMark?: (index: number) => void;
  testId?: string;
  width?: number;
  height?: number;
}

/** Values against distance along the path, plain SVG, with the events as clickable marks. */
export function DistanceChart({
  distances,
  series,
  yLabel,
  xUnit,
  marks = [],
  current,
  yRange,
  includeZero = true,
  onPick,
  onMark,
  testId,
  width = 380,
  height = 150,
}: DistanceChartProps) {
  const pad = { l: 46, r: 10, t: 14, b: 28 };
  const W = width - pad.l - pad.r;
  const H = height - pad.t - pad.b;
  const x0 = distances.length > 0 ? distances[0] : 0;
  const x1 = distances.length > 1 ? distances[distances.length - 1] : x0 + 1;
  // A fixed range as given; otherwise the data's, rounded out to whole ticks.
  const [dlo, dhi] = yRange ?? extent(series.map((s) => s.values), includeZero ? [0] : []);
  const yAxis = linearAxis(dlo, dhi, pad.t + H, pad.t, 4, !yRange);
  const [lo, hi] = yAxis.domain;
  const xAxis = linearAxis(x0, x1, pad.l, pad.l + W, 6, false);
  const X = (x: number) => xAxis.scale(x);
  const Y = (v: number) => yAxis.scale(v);
  const xTicks = xAxis.ticks;
  const yTicks = yAxis.ticks;
  const pick = (e: MouseEvent<SVGRectElement>) => {
    if (!onPick) return;
    const box = e.currentTarget.getBoundingClientRect();
    const f = (e.clientX - box.left) / box.width;
    onPick(x0 + Math.min(1, Math.max(0, f)) * (x1 - x0));
  };
  const path = (vals: readonly (number | null)[]) => {
    let d = '';
    let pen = false;
    for (let i = 0; i < distances.length; i++) {
      const v = vals[i];
      if (v === null || v === undefined || !Number.isFinite(v)) {
        pen = false;
        continue;
      }
      const c = Math.min(hi, Math.max(lo, v));
      d += `${pen ? 'L' : 'M'}${X(distances[i]).toFixed(1)},${Y(c).toFixed(1)}`;
      pen = true;
    }
    return d;
  };
  return (
    <svg className="chart" viewBox={`0 0 ${width} ${height}`} width="100%" role="img" aria-label={`${yLabel} against distance along the path`} data-testid={testId}>
      <rect x={pad.l} y={pad.t} width={W} height={H} fill="#fff" stroke="#999" />
      {yTicks.map((v) => (
        <g key={`y${v}`}>
          <line x1={pad.l} x2={pad.l + W} y1={Y(v)} y2={Y(v)} stroke={Math.abs(v) < 1e-9 ? '#bbb' : '#ececec'} />
          <text x={pad.l - 4} y={Y(v) + 3.5} textAnchor="end" fontSize="10">
            {yAxis.label(v)}
          </text>
        </g>
      ))}
      {xTicks.map((x) => (
        <g key={`x${x}`}>
          <line x1={X(x)} x2={X(x)} y1={pad.t} y2={pad.t + H} stroke="#f0f0f0" />
          <text x={X(x)} y={pad.t + H + 12} textAnchor="middle" fontSize="10">
            {xAxis.label(x)}
          </text>
        </g>
      ))}
      <text x={pad.l + W} y={height - 3} textAnchor="end" fontSize="10">
        distance along the path ({xUnit})
      </text>
      <text x={pad.l} y={10} fontSize="10" fontWeight="600">
        {yLabel}
      </text>
      {series.map((s) => (
        <path key={s.label} d={path(s.values)} fill="none" stroke={s.colour} strokeWidth={1.8} strokeDasharray={s.dash || undefined} />
      ))}
      {current !== undefined ? <line x1={X(current)} x2={X(current)} y1={pad.t} y2={pad.t + H} stroke="#000" strokeWidth={1.5} /> : null}
      {onPick ? <rect x={pad.l} y={pad.t} width={W} height={H} fill="transparent" style={{ cursor: 'crosshair' }} onClick={pick} /> : null}
      {marks.map((m, i) => (
        <g
          key={`m${i}`}
          className="chart-mark"
          role="button"
          tabIndex={0}
          aria-label={`Go to: ${m.label}`}
          style={{ cursor: 'pointer' }}
          onClick={() => onMark?.(i)}
          onKeyDown={(e) => {
            if (e.key === 'Enter' || e.key === ' ') onMark?.(i);
          }}
        >
          <title>{m.label}</title>
          {/* A wide, invisible band along the mark, so it is easy to hit. */}
          <line x1={X(m.x)} x2={X(m.x)} y1={pad.t} y2={pad.t + H} stroke="transparent" strokeWidth={9} />
          <line x1={X(m.x)} x2={X(m.x)} y1={pad.t} y2={pad.t + H} stroke="#000" strokeDasharray={m.strong ? undefined : '3 3'} strokeWidth={m.strong ? 1.5 : 1} />
          <path d={`M${X(m.x) - 5},${pad.t - 1}L${X(m.x) + 5},${pad.t - 1}L${X(m.x)},${pad.t + 7}Z`} fill={m.strong ? '#000' : '#fff'} stroke="#000" />
        </g>
      ))}
      {series.length > 1
        ? series.map((s, i) => (
            <g key={`k${s.label}`} transform={`translate(${pad.l + 6 + i * Math.min(90, W / series.length)}, ${pad.t + H - 8})`}>
              <line x1={0} x2={14} y1={0} y2={0} stroke={s.colour} strokeWidth={2} strokeDasharray={s.dash || undefined} />
              <text x={17} y={3.5} fontSize="10">
                {s.label}
              </text>
            </g>
          ))
        : null}
    </svg>
  );
}
