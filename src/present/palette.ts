/**
 * Colours: the load colour map and the one wheel palette, shared by the 3D view, the app's charts
 * and the report. Pure: no React, three or DOM.
 *
 * The load colour map is viridis (van der Walt & Smith, matplotlib 2.0 default, 2015) as
 * d3-scale-chromatic gives it: perceptually uniform in CAM02-UCS lightness and readable with the
 * common colour-vision deficiencies, so it prints as a monotonic grey too.
 */
import { interpolateViridis } from 'd3-scale-chromatic';

/** Share of the static load (on the one basis, see units.ts OF_STATIC_NOTE) at the top of the colour map. */
export const LOAD_COLOUR_MAX_SHARE = 2;

function clamp01(t: number): number {
  return Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0));
}

/** CSS colour ("#rrggbb") of the colour map at t in [0, 1]. */
export function loadColourAt(t: number): string {
  return interpolateViridis(clamp01(t));
}

/** CSS colour for a share of the static load: 0 (lifted) dark, 1 (as on level ground) mid, 2 and over bright. */
export function loadShareColour(share: number | null): string {
  return loadColourAt(share === null ? 0 : share / LOAD_COLOUR_MAX_SHARE);
}

/** sRGB components (0…1) at t in [0, 1], written into `out` (no allocation: for per-frame use). */
export function loadColourRGB(t: number, out: [number, number, number]): [number, number, number] {
  const hex = interpolateViridis(clamp01(t));
  const v = parseInt(hex.slice(1, 7), 16);
  out[0] = ((v >> 16) & 255) / 255;
  out[1] = ((v >> 8) & 255) / 255;
  out[2] = (v & 255) / 255;
  return out;
}

/** Colour-map stops for a legend gradient (CSS colours at t = i/(n−1)). */
export function loadColourStops(n = 10): string[] {
  const out: string[] = [];
  for (let i = 0; i < n; i++) out.push(loadColourAt(i / (n - 1)));
  return out;
}

/**
 * The one wheel palette, FL, FR, RL, RR: Okabe & Ito (2008) colour-blind-safe colours (blue,
 * vermillion, bluish green, orange), each with its own dash so that colour is never alone and a
 * black-and-white print still tells the lines apart.
 */
export const WHEEL_STYLES: readonly { readonly colour: string; readonly dash: string }[] = [
  { colour: '#0072B2', dash: '' },
  { colour: '#D55E00', dash: '6 3' },
  { colour: '#009E73', dash: '2 3' },
  { colour: '#E69F00', dash: '9 3 2 3' },
];
export const WHEEL_COLOURS: readonly string[] = WHEEL_STYLES.map((s) => s.colour);
export const WHEEL_DASHES: readonly string[] = WHEEL_STYLES.map((s) => s.dash);

/** Single-line charts: margins and the like. */
export const MARGIN_COLOUR = '#0b3d91';
export const ENERGY_COLOUR = '#6b3e00';
