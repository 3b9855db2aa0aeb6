/**
 * Filled ground: whether a tyre stands where an imported height grid was filled in (the import's
 * Laplace fill put a height where the source had none), so its load rests on a guessed height.
 *
 * The rule follows the terrain field's own bilinear sampling (terrain/field.ts: cell of the point,
 * the grid's edge values held outside it): the ground at (x, y) is filled ground when a node that
 * carries a non-zero bilinear weight there is marked filled. Inside a cell that is any of its four
 * corners; on a node, that node alone; outside the grid, the held edge node(s). A height partly made
 * of a guess counts as a guess (the cautious side). The point asked about is the centre of pressure
 * of each loaded tyre's contact (WheelResult.contactPointWorld); a lifted tyre stands on nothing.
 *
 * Every analysis reports it the same way: pose (a caution), pass (per station and as spans along the
 * path per wheel), rose and heading sweep (the spot's tyres), line sweep (per line).
 */
import type { SolveResult, Terrain, WheelName } from '../model/types';
import { WHEEL_NAMES } from '../model/types';

/** One grid's mask in the form the lookup needs (plain numbers, no feature object). */
interface MaskedGrid {
  readonly x0: number;
  readonly y0: number;
  readonly spacing: number;
  readonly cols: number;
  readonly rows: number;
  readonly mask: Uint8Array;
}

/** The filled-node masks of a terrain's imported grids; built once per terrain, queries allocate nothing. */
export class FilledGround {
  private constructor(private readonly grids: readonly MaskedGrid[]) {}

  /**
   * The lookup for a terrain, or null when no grid of it carries a filled mask (then nothing stands on
   * filled ground and the callers skip the check). O(features): the masks are not scanned (an import
   * with nothing filled stores no mask: ground/feature.ts).
   */
  static of(terrain: Terrain): FilledGround | null {
    const grids: MaskedGrid[] = [];
    for (const f of terrain.features) {
      if (f.type !== 'grid' || !f.filledMask || f.filledMask.length !== f.cols * f.rows) continue;
      grids.push({ x0: f.originM[0], y0: f.originM[1], spacing: f.spacingM, cols: f.cols, rows: f.rows, mask: f.filledMask });
    }
    return grids.length > 0 ? new FilledGround(grids) : null;
  }

  /** Whether the ground height at (x, y) (terrain frame, m) takes a non-zero share from a filled node. */
  at(xM: number, yM: number): boolean {
    for (const g of this.grids) if (filledIn(g, xM, yM)) return true;
    return false;
  }

  /**
   * The wheels (bit k for WHEEL_NAMES[k]) whose loaded tyre's centre of pressure stands on filled
   * ground; 0 when none. Lifted tyres are left out.
   */
  wheelBits(r: Pick<SolveResult, 'wheels'>): number {
    let bits = 0;
    for (let k = 0; k < r.wheels.length && k < 4; k++) {
      const w = r.wheels[k];
      if (w.lifted) continue;
      if (this.at(w.contactPointWorld[0], w.contactPointWorld[1])) bits |= 1 << k;
    }
    return bits;
  }
}

/** The bilinear rule of TerrainField's grid sampling, asking the mask instead of the heights. */
function filledIn(g: MaskedGrid, x: number, y: number): boolean {
  const { cols, rows, mask } = g;
  let fx = (x - g.x0) / g.spacing;
  let fy = (y - g.y0) / g.spacing;
  if (!(fx > 0)) fx = 0;
  else if (fx > cols - 1) fx = cols - 1;
  if (!(fy > 0)) fy = 0;
  else if (fy > rows - 1) fy = rows - 1;
  let c0 = Math.floor(fx);
  let r0 = Math.floor(fy);
  if (c0 > cols - 2) c0 = cols - 2;
  if (r0 > rows - 2) r0 = rows - 2;
  if (c0 < 0) c0 = 0;
  if (r0 < 0) r0 = 0;
  const tx = fx - c0;
  const ty = fy - r0;
  // Corner weights: (1 − tx)(1 − ty), tx(1 − ty), (1 − tx)ty, tx·ty; a corner counts when its weight is > 0.
  const left = tx < 1;
  const right = tx > 0;
  const low = ty < 1;
  const high = ty > 0;
  const a = r0 * cols + c0;
  const b = a + cols;
  return (
    (left && low && mask[a] !== 0) ||
    (right && low && mask[a + 1] !== 0) ||
    (left && high && mask[b] !== 0) ||
    (right && high && mask[b + 1] !== 0)
  );
}

const NO_WHEELS: readonly WheelName[] = Object.freeze([]);

/** The wheel names in a bit set from wheelBits, in the order FL, FR, RL, RR (one shared empty list for none). */
export function filledWheelNames(bits: number): readonly WheelName[] {
  if (bits === 0) return NO_WHEELS;
  const out: WheelName[] = [];
  for (let k = 0; k < 4; k++) if (bits & (1 << k)) out.push(WHEEL_NAMES[k]);
  return out;
}

/** The wheels of one solve standing on filled ground (none when the terrain has no filled nodes). */
export function wheelsOnFilledGround(terrain: Terrain, r: Pick<SolveResult, 'wheels'>): readonly WheelName[] {
  const fg = FilledGround.of(terrain);
  return fg ? filledWheelNames(fg.wheelBits(r)) : [];
}

/** A stretch of a pass over which one wheel stands on filled ground. */
export interface FilledGroundSpan {
  readonly wheel: WheelName;
  /** First station where the wheel stands on filled ground, and its distance along the path (m). */
  readonly startStation: number;
  readonly startDistanceM: number;
  /** Last such station and its distance (m); the span is closed at the last station solved. */
  readonly endStation: number;
  readonly endDistanceM: number;
}

/**
 * The spans per wheel from per-station wheel bits (stationBits[i] for station i at distancesM[i]),
 * ordered by their start, then by wheel.
 */
export function filledGroundSpans(stationBits: ArrayLike<number>, distancesM: ArrayLike<number>): FilledGroundSpan[] {
  const spans: FilledGroundSpan[] = [];
  const n = stationBits.length;
  for (let k = 0; k < 4; k++) {
    let start = -1;
    for (let i = 0; i <= n; i++) {
      const on = i < n && (stationBits[i] & (1 << k)) !== 0;
      if (on && start < 0) start = i;
      else if (!on && start >= 0) {
        spans.push({ wheel: WHEEL_NAMES[k], startStation: start, startDistanceM: distancesM[start], endStation: i - 1, endDistanceM: distancesM[i - 1] });
        start = -1;
      }
    }
  }
  return spans.sort((p, q) => p.startStation - q.startStation || WHEEL_NAMES.indexOf(p.wheel) - WHEEL_NAMES.indexOf(q.wheel));
}
