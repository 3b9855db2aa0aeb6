/**
 * Build options: a base vehicle plus modifications, each turned into the physical change it causes,
 * and builds compared side by side (SSF, tilt-table lift and tip each way, the weakest direction,
 * the obstacle pass headline, CG height), each as a value and its change from the first build.
 * Every build's lift and tip come from the same tilt sweep (tilt.ts: the end of the stable
 * equilibrium branch, bracketed to 0.01°), on a level table, so the angles are from level and the
 * changes compare like with like.
 *
 * How each modification is modelled (say so wherever results are shown):
 * - Tyre diameter (new radius r'): everything rides higher by Δr = r' − r: the CG as weighed
 *   (unsprung masses included), the payload, the body outline and the roll centres. The wheel and
 *   tyre mass change is not modelled (edit the unsprung masses if known).
 * - Suspension lift Δ: the sprung mass and what rides on it (payload, body outline) rise by Δ; the
 *   unsprung masses stay, so the CG as weighed rises by Δ · m_sprung / m. Spring rates, travel and
 *   roll-centre heights are kept: give new travel under `travel` if shocks or stops changed.
 * - Body lift Δ: only the body rises (cab, bed, what rides in or on them: the payload and the roof),
 *   the frame, axles and drivetrain stay, and so do the belly and bumpers (frame-mounted). The body
 *   is taken as bodyMassShare of the sprung mass (default 0.35, an estimate: common practice puts
 *   the body shell at about a third of a body-on-frame 4×4's sprung mass; from memory), so the CG
 *   rises by Δ · share · m_sprung / m.
 * - Wheel fitment (common practice, REFERENCES "Wheel fitment"): overall wheel width ≈ rim width +
 *   1 in; backspacing = (rim width + 1 in)/2 + offset; the tyre centre-line sits `offset` inboard
 *   of the hub face, so fitting a wheel of lower offset (or a spacer of s) moves each tyre out by the
 *   difference (or by s) and widens that axle's track by twice it.
 * - Payload items: added as given (heights as installed on the build).
 * - Anti-roll bars: disconnected (0) or a new stiffness.
 * - Travel: new bump and droop from ride height (longer shocks, bump stops).
 */
import type { AxleSuspension, PathSpec, PayloadItem, Pose, Terrain, Tilt, Vehicle, WheelName } from '../model/types';
import { buildModel } from '../solver/equilibrium';
import { M_PER_IN } from '../scenario/units';
import { passOutcome, runPass, type PassOutcome, type PassResult } from './pass';
import { CARDINALS, cardinalLimits, stabilityRose, tipAngleOf, liftAngleOf, type CardinalLimits, type CardinalName } from './rose';

/** Overall wheel width over the rim width (common practice: 1 in, for the bead flanges). */
export const WHEEL_WIDTH_OVER_RIM_M = M_PER_IN;
/** Body share of the sprung mass for a body lift. @default 0.35 (estimate, from memory) */
export const DEFAULT_BODY_MASS_SHARE = 0.35;
/** Most builds compared at once. */
export const MAX_BUILDS = 6;

/** A wheel as the trade states it, in SI: rim width, and offset or backspacing. */
export interface WheelFitment {
  readonly rimWidthM: number;
  /** Offset: hub face outboard of the rim centre-line (m, + outboard). Give this or backspacingM. */
  readonly offsetM?: number;
  /** Backspacing: hub face to the inner edge of the wheel (m). */
  readonly backspacingM?: number;
}

export interface BuildWheels {
  /** @default 'both' */
  readonly axle?: 'front' | 'rear' | 'both';
  /** The wheels the base vehicle's track was measured on (needed with `fitted`). */
  readonly stock?: WheelFitment;
  readonly fitted?: WheelFitment;
  /** Spacer thickness per side (m). @default 0 */
  readonly spacerM?: number;
}

export interface AxleTravel {
  readonly bumpM?: number;
  readonly droopM?: number;
}

export interface BuildSpec {
  readonly name: string;
  readonly lift?: {
    readonly suspensionM?: number;
    readonly bodyM?: number;
    /** Share of the sprung mass that is body (rises with a body lift). @default 0.35 */
    readonly bodyMassShare?: number;
  };
  /** New tyres: unloaded radius, and optionally width and stiffness (both axles). */
  readonly tyre?: { readonly radiusM: number; readonly widthM?: number; readonly stiffnessNPerM?: number };
  readonly wheels?: BuildWheels;
  readonly payload?: readonly PayloadItem[];
  /** Anti-roll bars: 'disconnected' or a stiffness (N·m/rad). */
  readonly antiRoll?: { readonly front?: 'disconnected' | number; readonly rear?: 'disconnected' | number };
  readonly travel?: { readonly front?: AxleTravel; readonly rear?: AxleTravel };
}

/** Backspacing from rim width and offset (common practice): (rim + 1 in)/2 + offset. */
export function backspacingFromOffsetM(rimWidthM: number, offsetM: number): number {
  return (rimWidthM + WHEEL_WIDTH_OVER_RIM_M) / 2 + offsetM;
}

/** Offset from rim width and backspacing (the same rule solved for the offset). */
export function offsetFromBackspacingM(rimWidthM: number, backspacingM: number): number {
  return backspacingM - (rimWidthM + WHEEL_WIDTH_OVER_RIM_M) / 2;
}

function offsetOf(w: WheelFitment): number {
  if (w.offsetM !== undefined) return w.offsetM;
  if (w.backspacingM !== undefined) return offsetFromBackspacingM(w.rimWidthM, w.backspacingM);
  throw new Error('a wheel fitment needs offsetM or backspacingM');
}

/**
 * Change in an axle's track (m) from a wheel change and spacers: each tyre centre-line moves out
 * by (stock offset − fitted offset) + spacer, so the track grows by twice that.
 */
export function trackChangeM(w: BuildWheels): number {
  const spacer = w.spacerM ?? 0;
  let perSide = spacer;
  if (w.fitted) {
    if (!w.stock) throw new Error('wheels.fitted needs wheels.stock: the track is measured on the stock wheels');
    perSide += offsetOf(w.stock) - offsetOf(w.fitted);
  }
  return 2 * perSide;
}

/**
 * One modification as modelled, with the physical change it made, in SI numbers (the faces word
 * it in the reader's units: src/present/words.ts buildChangeWords).
 */
export type BuildChange =
  | { readonly kind: 'as-given' }
  | { readonly kind: 'tyres'; readonly radiusM: number; readonly riseM: number }
  | { readonly kind: 'suspension-lift'; readonly liftM: number; readonly sprungMassKg: number; readonly massKg: number; readonly cgRiseM: number }
  | { readonly kind: 'body-lift'; readonly liftM: number; readonly bodyShare: number; readonly bodyMassKg: number; readonly cgRiseM: number }
  | {
      readonly kind: 'wheels';
      readonly axle: 'front' | 'rear' | 'both';
      readonly rimWidthM: number | null;
      readonly offsetM: number | null;
      readonly stockOffsetM: number | null;
      readonly spacerM: number | null;
      readonly trackChangeM: number;
    }
  | { readonly kind: 'payload'; readonly labels: readonly string[]; readonly massKg: number }
  | { readonly kind: 'anti-roll'; readonly end: 'front' | 'rear'; readonly stiffnessNmPerRad: number | null }
  | { readonly kind: 'travel'; readonly end: 'front' | 'rear'; readonly bumpM: number; readonly droopM: number };

export const AS_GIVEN: readonly BuildChange[] = [{ kind: 'as-given' }];

export interface AppliedBuild {
  readonly name: string;
  readonly vehicle: Vehicle;
  /** Each modification, with the physical change it made (numbers; worded by the faces). */
  readonly changes: readonly BuildChange[];
}

/** The base vehicle with the build's modifications applied (the inputs are not changed). */
export function applyBuild(base: Vehicle, build: BuildSpec): AppliedBuild {
  let v: Vehicle = base;
  const changes: BuildChange[] = [];
  const unsprung = () => v.unsprungMassFrontKg + v.unsprungMassRearKg;
  const raise = (dz: number, what: { payload: boolean; belly: boolean; roof: boolean; rollCentres: boolean }) => {
    v = {
      ...v,
      payload: what.payload ? v.payload.map((p) => ({ ...p, heightM: p.heightM + dz })) : v.payload,
      body: {
        ...v.body,
        bellyClearanceM: v.body.bellyClearanceM + (what.belly ? dz : 0),
        frontBumperClearanceM: v.body.frontBumperClearanceM + (what.belly ? dz : 0),
        rearBumperClearanceM: v.body.rearBumperClearanceM + (what.belly ? dz : 0),
        roofHeightM: v.body.roofHeightM + (what.roof ? dz : 0),
      },
      suspensionFront: what.rollCentres ? { ...v.suspensionFront, rollCentreHeightM: v.suspensionFront.rollCentreHeightM + dz } : v.suspensionFront,
      suspensionRear: what.rollCentres ? { ...v.suspensionRear, rollCentreHeightM: v.suspensionRear.rollCentreHeightM + dz } : v.suspensionRear,
    };
  };

  if (build.tyre) {
    const t = build.tyre;
    const dF = t.radiusM - v.tyreFront.radiusM;
    const dR = t.radiusM - v.tyreRear.radiusM;
    const d = 0.5 * (dF + dR);
    const tyre = (old: Vehicle['tyreFront']) => ({
      radiusM: t.radiusM,
      widthM: t.widthM ?? old.widthM,
      stiffnessNPerM: t.stiffnessNPerM ?? old.stiffnessNPerM,
    });
    v = { ...v, tyreFront: tyre(v.tyreFront), tyreRear: tyre(v.tyreRear), cg: { ...v.cg, heightM: v.cg.heightM + d } };
    raise(d, { payload: true, belly: true, roof: true, rollCentres: true });
    changes.push({ kind: 'tyres', radiusM: t.radiusM, riseM: d });
  }
  const lift = build.lift;
  if (lift?.suspensionM) {
    const d = lift.suspensionM;
    const ms = v.massKg - unsprung();
    const dh = (d * ms) / v.massKg;
    v = { ...v, cg: { ...v.cg, heightM: v.cg.heightM + dh } };
    raise(d, { payload: true, belly: true, roof: true, rollCentres: false });
    changes.push({ kind: 'suspension-lift', liftM: d, sprungMassKg: ms, massKg: v.massKg, cgRiseM: dh });
  }
  if (lift?.bodyM) {
    const d = lift.bodyM;
    const share = lift.bodyMassShare ?? DEFAULT_BODY_MASS_SHARE;
    const ms = v.massKg - unsprung();
    const dh = (d * share * ms) / v.massKg;
    v = { ...v, cg: { ...v.cg, heightM: v.cg.heightM + dh } };
    raise(d, { payload: true, belly: false, roof: true, rollCentres: false });
    changes.push({ kind: 'body-lift', liftM: d, bodyShare: share, bodyMassKg: share * ms, cgRiseM: dh });
  }
  if (build.wheels) {
    const w = build.wheels;
    const axle = w.axle ?? 'both';
    const dT = trackChangeM(w);
    v = {
      ...v,
      trackFrontM: v.trackFrontM + (axle !== 'rear' ? dT : 0),
      trackRearM: v.trackRearM + (axle !== 'front' ? dT : 0),
    };
    changes.push({
      kind: 'wheels',
      axle,
      rimWidthM: w.fitted ? w.fitted.rimWidthM : null,
      offsetM: w.fitted ? offsetOf(w.fitted) : null,
      stockOffsetM: w.fitted && w.stock ? offsetOf(w.stock) : null,
      spacerM: w.spacerM ? w.spacerM : null,
      trackChangeM: dT,
    });
  }
  if (build.payload && build.payload.length > 0) {
    const kg = build.payload.reduce((s, p) => s + p.massKg, 0);
    v = { ...v, payload: [...v.payload, ...build.payload] };
    changes.push({ kind: 'payload', labels: build.payload.map((p) => p.label), massKg: kg });
  }
  if (build.antiRoll) {
    const set = (s: AxleSuspension, x: 'disconnected' | number | undefined): AxleSuspension =>
      x === undefined ? s : { ...s, antiRollNmPerRad: x === 'disconnected' ? 0 : x };
    v = { ...v, suspensionFront: set(v.suspensionFront, build.antiRoll.front), suspensionRear: set(v.suspensionRear, build.antiRoll.rear) };
    for (const end of ['front', 'rear'] as const) {
      const x = build.antiRoll[end];
      if (x !== undefined) changes.push({ kind: 'anti-roll', end, stiffnessNmPerRad: x === 'disconnected' ? null : x });
    }
  }
  if (build.travel) {
    const set = (s: AxleSuspension, t: AxleTravel | undefined): AxleSuspension =>
      t === undefined ? s : { ...s, bumpM: t.bumpM ?? s.bumpM, droopM: t.droopM ?? s.droopM };
    v = { ...v, suspensionFront: set(v.suspensionFront, build.travel.front), suspensionRear: set(v.suspensionRear, build.travel.rear) };
    for (const end of ['front', 'rear'] as const) {
      const t = build.travel[end];
      if (t) {
        const s = end === 'front' ? v.suspensionFront : v.suspensionRear;
        changes.push({ kind: 'travel', end, bumpM: s.bumpM, droopM: s.droopM });
      }
    }
  }
  if (changes.length === 0) changes.push({ kind: 'as-given' });
  return { name: build.name, vehicle: { ...v, name: `${base.name} (${build.name})` }, changes };
}

/** Total CG height with the payload, and the mean track. */
export function totalCgHeightM(v: Vehicle): number {
  let m = v.massKg;
  let mz = v.massKg * v.cg.heightM;
  for (const p of v.payload) {
    m += p.massKg;
    mz += p.massKg * p.heightM;
  }
  return mz / m;
}

/** Static Stability Factor T/(2h) (NHTSA; NRC/TRB SR 265), with the mean track and the total CG height. */
export function staticStabilityFactor(v: Vehicle): number {
  return (0.5 * (v.trackFrontM + v.trackRearM)) / (2 * totalCgHeightM(v));
}

/** Number fields of a build's comparison row; null where it does not apply (no lift before the tip, no path). */
export interface BuildMetrics {
  readonly ssf: number;
  readonly cgHeightM: number;
  readonly trackMeanM: number;
  readonly noseDownLiftRad: number | null;
  readonly noseDownTipRad: number | null;
  readonly leftDownLiftRad: number | null;
  readonly leftDownTipRad: number | null;
  readonly tailDownLiftRad: number | null;
  readonly tailDownTipRad: number | null;
  readonly rightDownLiftRad: number | null;
  readonly rightDownTipRad: number | null;
  readonly weakestDownhillRad: number;
  readonly weakestTipRad: number;
  readonly passFirstUnloadM: number | null;
  readonly passFirstLiftM: number | null;
  readonly passTipM: number | null;
  readonly passMinForceAngleRad: number | null;
  readonly passMinEnergyM: number | null;
  readonly passMinClearanceM: number | null;
}

export type MetricName = keyof BuildMetrics;

export interface BuildRow {
  readonly name: string;
  readonly changes: readonly BuildChange[];
  readonly vehicle: Vehicle;
  readonly metrics: BuildMetrics;
  /** metrics − the first build's metrics (null where either is null). */
  readonly change: { readonly [K in MetricName]: number | null };
  readonly cardinals: CardinalLimits;
  readonly passFirstUnloadWheel: WheelName | null;
  readonly passFirstLiftWheel: WheelName | null;
  /**
   * How the build's pass ends (passOutcome: tips, hangs up on a part of the underbody, slides, or
   * stands all along), and the first slide (it may come before a hang-up, which then leads); null
   * without a path.
   */
  readonly passEnd: { readonly outcome: PassOutcome; readonly firstSlide: PassResult['firstSlide'] } | null;
  /** Lift and tip bands from the CG-height tolerance, when one was given. */
  readonly band: CgBand | null;
}

export interface CompareOptions {
  /** Terrain and path for the pass headline; no pass when path is null. */
  readonly terrain?: Terrain;
  readonly path?: PathSpec | null;
  readonly friction?: number;
  readonly lightShare?: number;
  /** Tilt-table setting for the pass (the scenario's tilt, as the pass command runs it). @default none */
  readonly tilt?: Tilt;
  /** Rose direction spacing (rad). @default 5° */
  readonly roseStepRad?: number;
  /** CG-height tolerance (m) for the lift and tip bands. @default none */
  readonly cgToleranceM?: number;
  /** Called after each build. */
  readonly onProgress?: (done: number, total: number) => void;
}

const LEVEL: Terrain = { features: [] };
const ORIGIN: Pose = { xM: 0, yM: 0, headingRad: 0 };

/** Compares up to six builds of one base vehicle: tilt table on level ground, pass on the given terrain. */
export function compareBuilds(base: Vehicle, builds: readonly BuildSpec[], opts: CompareOptions = {}): BuildRow[] {
  if (builds.length === 0) throw new Error('compareBuilds: no builds');
  if (builds.length > MAX_BUILDS) throw new Error(`compareBuilds: at most ${MAX_BUILDS} builds, got ${builds.length}`);
  const applied = builds.map((b) => applyBuild(base, b));
  return compareVehicles(applied, opts);
}

/** Compares vehicles already built (e.g. one per scenario file). */
export function compareVehicles(applied: readonly AppliedBuild[], opts: CompareOptions = {}): BuildRow[] {
  if (applied.length > MAX_BUILDS) throw new Error(`compare: at most ${MAX_BUILDS} builds, got ${applied.length}`);
  const rows: Omit<BuildRow, 'change'>[] = [];
  for (let i = 0; i < applied.length; i++) {
    const a = applied[i];
    const v = a.vehicle;
    const table = buildModel(v, LEVEL);
    const cardinals = cardinalLimits(table, ORIGIN, { friction: opts.friction });
    const rose = stabilityRose(table, ORIGIN, { stepRad: opts.roseStepRad, friction: opts.friction });
    const maxA = rose.maxAngleRad;
    const card = (n: CardinalName) => cardinals[n];
    const lift = (n: CardinalName) => card(n).firstLift?.angleRad ?? null;
    const tipA = (n: CardinalName) => card(n).tip?.angleRad ?? null;
    let pass: ReturnType<typeof runPass> | null = null;
    if (opts.path && opts.terrain) {
      pass = runPass(buildModel(v, opts.terrain), opts.path, { friction: opts.friction, lightShare: opts.lightShare, tilt: opts.tilt });
    }
    const metrics: BuildMetrics = {
      ssf: staticStabilityFactor(v),
      cgHeightM: totalCgHeightM(v),
      trackMeanM: 0.5 * (v.trackFrontM + v.trackRearM),
      noseDownLiftRad: lift('noseDown'),
      noseDownTipRad: tipA('noseDown'),
      leftDownLiftRad: lift('leftDown'),
      leftDownTipRad: tipA('leftDown'),
      tailDownLiftRad: lift('tailDown'),
      tailDownTipRad: tipA('tailDown'),
      rightDownLiftRad: lift('rightDown'),
      rightDownTipRad: tipA('rightDown'),
      weakestDownhillRad: rose.weakest.downhillRad,
      weakestTipRad: tipAngleOf(rose.weakest, maxA),
      passFirstUnloadM: pass?.firstUnload?.distanceM ?? null,
      passFirstLiftM: pass?.firstLift?.distanceM ?? null,
      passTipM: pass?.tip?.distanceM ?? null,
      passMinForceAngleRad: pass?.minMargin?.forceAngleRad ?? null,
      passMinEnergyM: pass?.minMargin?.energyM ?? null,
      passMinClearanceM: pass?.minClearance?.clearanceM ?? null,
    };
    rows.push({
      name: a.name,
      changes: a.changes,
      vehicle: v,
      metrics,
      cardinals,
      passFirstUnloadWheel: pass?.firstUnload?.wheel ?? null,
      passFirstLiftWheel: pass?.firstLift?.wheel ?? null,
      passEnd: pass ? { outcome: passOutcome(pass), firstSlide: pass.firstSlide } : null,
      band: opts.cgToleranceM ? cgBand(v, opts.cgToleranceM, { friction: opts.friction }) : null,
    });
    opts.onProgress?.(i + 1, applied.length);
  }
  const first = rows[0].metrics;
  return rows.map((r) => {
    const change = {} as Record<MetricName, number | null>;
    for (const k of Object.keys(r.metrics) as MetricName[]) {
      const a = r.metrics[k];
      const b = first[k];
      change[k] = a === null || b === null ? null : a - b;
    }
    return { ...r, change };
  });
}

export interface CgBandDirection {
  /** First-lift angle at the high and the low end of the CG band (rad; the tip angle when no wheel lifts first). */
  readonly liftRad: readonly [atHigh: number, atLow: number];
  readonly tipRad: readonly [atHigh: number, atLow: number];
}

export interface CgBand {
  readonly toleranceM: number;
  /** CG heights (as weighed) at the two ends (m). */
  readonly heightsM: readonly [high: number, low: number];
  readonly directions: { readonly [K in CardinalName]: CgBandDirection };
}

/**
 * The band of tilt-table lift and tip angles for a CG height known only to ± toleranceM, by
 * solving at both ends of the band (the vehicle's CG as weighed moved up and down).
 */
export function cgBand(vehicle: Vehicle, toleranceM: number, opts: { readonly friction?: number } = {}): CgBand {
  const at = (dh: number) => {
    const v = { ...vehicle, cg: { ...vehicle.cg, heightM: vehicle.cg.heightM + dh } };
    return cardinalLimits(buildModel(v, LEVEL), ORIGIN, { friction: opts.friction });
  };
  const hi = at(toleranceM);
  const lo = at(-toleranceM);
  const directions = {} as Record<CardinalName, CgBandDirection>;
  const maxA = (89 * Math.PI) / 180;
  for (const [name] of CARDINALS) {
    directions[name] = {
      liftRad: [liftAngleOf(hi[name], maxA), liftAngleOf(lo[name], maxA)],
      tipRad: [tipAngleOf(hi[name], maxA), tipAngleOf(lo[name], maxA)],
    };
  }
  return { toleranceM, heightsM: [vehicle.cg.heightM + toleranceM, vehicle.cg.heightM - toleranceM], directions };
}
