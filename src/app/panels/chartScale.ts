/** Axis helpers shared by the hand-written SVG charts. */

/** A round tick step (1, 2 or 5 times a power of ten) at or above `raw`. */
export function niceStep(raw: number): number {
  if (!(raw > 0)) return 1;
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  const m = raw / p;
  return (m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10) * p;
}

/** A tick label: four significant figures, no trailing zeros. */
export function fmt(v: number): string {
  return Number(v.toPrecision(4)).toString();
}
