/**
 * Inline SVG charts for the report: a line chart against distance with event markers, and a polar
 * chart of the stability rose. Plain SVG elements with presentation attributes (no scripts, no
 * external references), drawn in black and greys with dash patterns as well as colour so that a
 * black-and-white print still tells the lines apart.
 */
import { esc } from '../present/text';
import { fixed } from '../present/units';
import { extent, linearAxis } from '../present/scale';
export { WHEEL_STYLES } from '../present/palette';

/** One line of a chart. */
export interface Series {
  readonly label: string;
  readonly xs: readonly number[];
  readonly ys: readonly number[];
  readonly colour: string;
  /** SVG stroke-dasharray, '' for solid. */
  readonly dash: string;
}

/** A marker at one x (a vertical line with a short label), or a shaded band [x0, x1]. */
export interface ChartEvent {
  readonly x: number;
  readonly x1?: number;
  readonly label: string;
}

export interface LineChartOptions {
  readonly title: string;
  readonly xLabel: string;
  readonly yLabel: string;
  readonly width?: number;
  readonly height?: number;
  /** Horizontal reference lines with a label (e.g. zero margin). */
  readonly refLines?: readonly { readonly y: number; readonly label: string }[];
  readonly events?: readonly ChartEvent[];
  /** Force the y range to include these values. */
  readonly yInclude?: readonly number[];
}

/** A line chart as an <svg> element string. */
export function lineChart(series: readonly Series[], o: LineChartOptions): string {
  const W = o.width ?? 640;
  const H = o.height ?? 260;
  const m = { l: 58, r: 14, t: 26, b: 40 };
  const pw = W - m.l - m.r;
  const ph = H - m.t - m.b;
  // Bounds in one pass over each series (no spread of large arrays into Math.min/max).
  let xmin = Infinity, xmax = -Infinity;
  for (const s of series) {
    for (let i = 0; i < s.xs.length; i++) {
      const x = s.xs[i];
      if (!Number.isFinite(x) || !Number.isFinite(s.ys[i])) continue;
      if (x < xmin) xmin = x;
      if (x > xmax) xmax = x;
    }
  }
  if (!Number.isFinite(xmin)) { xmin = 0; xmax = 1; }
  let [ymin, ymax] = extent(series.map((s) => s.ys), o.yInclude ?? []);
  if (ymax - ymin < 1e-9) { ymax += 0.5; ymin -= 0.5; }
  const pad = 0.05 * (ymax - ymin);
  ymin -= pad;
  ymax += pad;
  const xAxis = linearAxis(xmin, xmax, m.l, m.l + pw, 8, false);
  const yAxis = linearAxis(ymin, ymax, m.t + ph, m.t, 5, false);
  xmin = xAxis.domain[0];
  xmax = xAxis.domain[1];
  const X = (x: number) => xAxis.scale(x);
  const Y = (y: number) => yAxis.scale(y);
  const parts: string[] = [];
  parts.push(`<svg class="chart" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}" role="img" aria-label="${esc(o.title)}">`);
  parts.push(`<text x="${m.l}" y="16" class="ct">${esc(o.title)}</text>`);
  // Events first, under the lines.
  for (const e of o.events ?? []) {
    if (e.x1 !== undefined) {
      const x0 = X(Math.max(xmin, e.x)), x1 = X(Math.min(xmax, e.x1));
      parts.push(`<rect x="${fixed(x0, 1)}" y="${m.t}" width="${fixed(Math.max(1, x1 - x0), 1)}" height="${ph}" fill="#000" fill-opacity="0.06"/>`);
    }
  }
  const xt = xAxis.ticks;
  const yt = yAxis.ticks;
  for (const v of yt) {
    parts.push(`<line x1="${m.l}" x2="${m.l + pw}" y1="${fixed(Y(v), 1)}" y2="${fixed(Y(v), 1)}" stroke="#ddd" stroke-width="0.6"/>`);
    parts.push(`<text x="${m.l - 5}" y="${fixed(Y(v) + 3.5, 1)}" text-anchor="end" class="tk">${yAxis.label(v)}</text>`);
  }
  for (const v of xt) {
    parts.push(`<line y1="${m.t}" y2="${m.t + ph}" x1="${fixed(X(v), 1)}" x2="${fixed(X(v), 1)}" stroke="#eee" stroke-width="0.6"/>`);
    parts.push(`<text x="${fixed(X(v), 1)}" y="${m.t + ph + 13}" text-anchor="middle" class="tk">${xAxis.label(v)}</text>`);
  }
  for (const r of o.refLines ?? []) {
    if (r.y < ymin || r.y > ymax) continue;
    parts.push(`<line x1="${m.l}" x2="${m.l + pw}" y1="${fixed(Y(r.y), 1)}" y2="${fixed(Y(r.y), 1)}" stroke="#000" stroke-width="0.8"/>`);
    parts.push(`<text x="${m.l + pw - 2}" y="${fixed(Y(r.y) - 3, 1)}" text-anchor="end" class="tk">${esc(r.label)}</text>`);
  }
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${pw}" height="${ph}" fill="none" stroke="#555" stroke-width="0.8"/>`);
  for (const s of series) {
    const pts: string[] = [];
    for (let i = 0; i < s.xs.length; i++) {
      if (!Number.isFinite(s.xs[i]) || !Number.isFinite(s.ys[i])) continue;
      pts.push(`${fixed(X(s.xs[i]), 1)},${fixed(Y(s.ys[i]), 1)}`);
    }
    if (pts.length === 0) continue;
    const dash = s.dash ? ` stroke-dasharray="${s.dash}"` : '';
    parts.push(`<polyline points="${pts.join(' ')}" fill="none" stroke="${s.colour}" stroke-width="1.6"${dash}/>`);
  }
  let labelRow = 0;
  for (const e of o.events ?? []) {
    if (e.x1 !== undefined || e.x < xmin || e.x > xmax) continue;
    const x = fixed(X(e.x), 1);
    parts.push(`<line x1="${x}" x2="${x}" y1="${m.t}" y2="${m.t + ph}" stroke="#000" stroke-width="0.8" stroke-dasharray="3 2"/>`);
    parts.push(`<text x="${fixed(X(e.x) + 3, 1)}" y="${m.t + 10 + 10 * (labelRow++ % 4)}" class="ev">${esc(e.label)}</text>`);
  }
  // Legend under the x label.
  let lx = m.l;
  const ly = H - 6;
  for (const s of series) {
    const dash = s.dash ? ` stroke-dasharray="${s.dash}"` : '';
    parts.push(`<line x1="${lx}" x2="${lx + 22}" y1="${ly - 3}" y2="${ly - 3}" stroke="${s.colour}" stroke-width="1.6"${dash}/>`);
    parts.push(`<text x="${lx + 26}" y="${ly}" class="tk">${esc(s.label)}</text>`);
    lx += 34 + 6.2 * s.label.length;
  }
  parts.push(`<text x="${m.l + pw}" y="${ly}" text-anchor="end" class="tk">${esc(o.xLabel)}</text>`);
  parts.push(`<text transform="translate(12 ${m.t + ph / 2}) rotate(-90)" text-anchor="middle" class="tk">${esc(o.yLabel)}</text>`);
  parts.push('</svg>');
  return parts.join('');
}

/** One ring of the polar chart: directions (rad, vehicle frame CCW from the nose) and angles (deg). */
export interface PolarSeries {
  readonly label: string;
  readonly directionsRad: readonly number[];
  readonly valuesDeg: readonly (number | null)[];
  readonly colour: string;
  readonly dash: string;
  /** Fill the area under the curve lightly. */
  readonly fill?: boolean;
}

/**
 * Polar chart of the rose seen from above, nose up: a direction θ (counter-clockwise from the
 * nose, so left side down is to the left) at radius = the angle in degrees. A null value (no
 * event up to the largest tilt) is drawn at the outer ring.
 */
export function polarChart(
  series: readonly PolarSeries[],
  o: { readonly title: string; readonly maxDeg: number; readonly rings: readonly { readonly deg: number; readonly label: string; readonly strong?: boolean }[]; readonly size?: number },
): string {
  const S = o.size ?? 360;
  const c = S / 2;
  const R = S / 2 - 34;
  const P = (thetaRad: number, deg: number): [number, number] => {
    const r = (Math.min(deg, o.maxDeg) / o.maxDeg) * R;
    return [c - r * Math.sin(thetaRad), c + 10 - r * Math.cos(thetaRad)];
  };
  const parts: string[] = [];
  parts.push(`<svg class="chart" viewBox="0 0 ${S} ${S + 36}" width="${S}" height="${S + 36}" role="img" aria-label="${esc(o.title)}">`);
  parts.push(`<text x="6" y="14" class="ct">${esc(o.title)}</text>`);
  for (const ring of o.rings) {
    const r = (ring.deg / o.maxDeg) * R;
    parts.push(
      `<circle cx="${c}" cy="${c + 10}" r="${fixed(r, 1)}" fill="none" stroke="${ring.strong ? '#000' : '#bbb'}" stroke-width="${ring.strong ? 1 : 0.6}"${ring.strong ? ' stroke-dasharray="4 2"' : ''}/>`,
    );
    // Labels along the direction 30° right of the nose, clear of the curves' usual crowding at the axes.
    const [lx0, ly0] = P(-Math.PI / 6, ring.deg);
    parts.push(`<text x="${fixed(lx0 + 2, 1)}" y="${fixed(ly0 - 2, 1)}" class="tk">${esc(ring.label)}</text>`);
  }
  for (let k = 0; k < 12; k++) {
    const [x, y] = P((k * Math.PI) / 6, o.maxDeg);
    parts.push(`<line x1="${c}" y1="${c + 10}" x2="${fixed(x, 1)}" y2="${fixed(y, 1)}" stroke="#e4e4e4" stroke-width="0.6"/>`);
  }
  const names: readonly [number, string][] = [[0, 'nose down'], [Math.PI / 2, 'left down'], [Math.PI, 'tail down'], [1.5 * Math.PI, 'right down']];
  for (const [t, n] of names) {
    const [x, y] = P(t, o.maxDeg * 1.1);
    parts.push(`<text x="${fixed(x, 1)}" y="${fixed(y + 4, 1)}" text-anchor="middle" class="tk">${n}</text>`);
  }
  for (const s of series) {
    const pts: string[] = [];
    for (let i = 0; i < s.directionsRad.length; i++) {
      const v = s.valuesDeg[i];
      const [x, y] = P(s.directionsRad[i], v === null ? o.maxDeg : v);
      pts.push(`${fixed(x, 1)},${fixed(y, 1)}`);
    }
    if (pts.length === 0) continue;
    const dash = s.dash ? ` stroke-dasharray="${s.dash}"` : '';
    const fill = s.fill ? `fill="${s.colour}" fill-opacity="0.08"` : 'fill="none"';
    parts.push(`<polygon points="${pts.join(' ')}" ${fill} stroke="${s.colour}" stroke-width="1.6"${dash}/>`);
  }
  // A plan outline of a vehicle at the centre, nose up.
  parts.push(`<rect x="${c - 7}" y="${c + 10 - 13}" width="14" height="26" rx="3" fill="#fff" stroke="#000" stroke-width="0.8"/>`);
  parts.push(`<path d="M${c - 5} ${c + 10 - 8} L${c} ${c + 10 - 12} L${c + 5} ${c + 10 - 8}" fill="none" stroke="#000" stroke-width="0.8"/>`);
  let lx = 6;
  for (const s of series) {
    const dash = s.dash ? ` stroke-dasharray="${s.dash}"` : '';
    parts.push(`<line x1="${lx}" x2="${lx + 22}" y1="${S + 27}" y2="${S + 27}" stroke="${s.colour}" stroke-width="1.6"${dash}/>`);
    parts.push(`<text x="${lx + 26}" y="${S + 30}" class="tk">${esc(s.label)}</text>`);
    lx += 36 + 6.2 * s.label.length;
  }
  parts.push('</svg>');
  return parts.join('');
}
