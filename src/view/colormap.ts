/**
 * Viridis colour scale (van der Walt & Smith, matplotlib 2.0 default, 2015): perceptually uniform
 * in CAM02-UCS lightness and readable with the common colour-vision deficiencies. Ten stops at
 * t = i/9, the sRGB values of R's viridisLite `viridis(10)` (from memory), linearly interpolated
 * between stops in sRGB, which keeps the lightness monotonic.
 */
export const VIRIDIS_STOPS: readonly string[] = [
  '#440154', '#482878', '#3e4a89', '#31688e', '#26828e', '#1f9e89', '#35b779', '#6ece58', '#b5de2b', '#fde725',
];

const STOPS_RGB: readonly (readonly [number, number, number])[] = VIRIDIS_STOPS.map((h) => [
  parseInt(h.slice(1, 3), 16) / 255,
  parseInt(h.slice(3, 5), 16) / 255,
  parseInt(h.slice(5, 7), 16) / 255,
]);

const _out: [number, number, number] = [0, 0, 0];

/** sRGB components (0…1) at t in [0, 1]. Returns a shared array: copy it before the next call. */
export function viridisRGB(t: number): readonly [number, number, number] {
  const u = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0)) * (STOPS_RGB.length - 1);
  const i = Math.min(STOPS_RGB.length - 2, Math.floor(u));
  const f = u - i;
  const a = STOPS_RGB[i];
  const b = STOPS_RGB[i + 1];
  _out[0] = a[0] + (b[0] - a[0]) * f;
  _out[1] = a[1] + (b[1] - a[1]) * f;
  _out[2] = a[2] + (b[2] - a[2]) * f;
  return _out;
}

/** CSS colour at t in [0, 1]. */
export function viridisCss(t: number): string {
  const [r, g, b] = viridisRGB(t);
  return `rgb(${Math.round(r * 255)} ${Math.round(g * 255)} ${Math.round(b * 255)})`;
}

/**
 * Okabe & Ito (2008) colour-blind-safe categorical colours, one per wheel FL, FR, RL, RR
 * (blue, vermillion, bluish green, orange); lines also differ in dash so colour is never alone.
 */
export const WHEEL_COLOURS: readonly string[] = ['#0072B2', '#D55E00', '#009E73', '#E69F00'];
export const WHEEL_DASHES: readonly string[] = ['', '6 3', '2 3', '9 3 2 3'];
