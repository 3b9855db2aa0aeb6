/**
 * Tyre and wheel sizes as the trade writes them, resolved to the model's SI fields.
 *
 * Tyre sizes (the designation of ISO 4000-1 and the ETRTO and Tire and Rim Association standards
 * books; the flotation form is the light-truck inch designation of the Tire and Rim Association):
 * - metric `W/AR R D`, optionally with a service prefix (`P`, `LT`) and a load/speed suffix:
 *   `315/70R17`, `LT285/75R16`, `P265/70R16 112T`, `285/75-16` (a bias tyre). W section width (mm),
 *   AR aspect ratio (section height as a percentage of W), D rim diameter (in). Overall diameter
 *   = D·25.4 + 2·W·AR/100 mm.
 * - flotation `OD x W R D`: `35x12.50R17`, `35x12.5-15`, `37X13.50R17LT`. OD overall diameter and W
 *   section width, both in inches, D rim diameter (in).
 * - a bare number, e.g. `35`: the trade's shorthand for the overall diameter in inches (common
 *   practice). It is not taken silently: the result asks whether the diameter is meant.
 *
 * Wheels: `17x9 -12` (rim diameter × rim width in inches, offset in mm; `ET-12`, `+25`, `offset 25`)
 * or `17x9 BS 4.5` (backspacing in inches). Backspacing (in) = (rim width + 1)/2 + offset (mm)/25.4:
 * common practice (the mounting face measured from the back edge of the rim, with about 1/2 in of
 * flange on each side; see REFERENCES.md "Wheel fitment").
 *
 * Pure: no I/O. Radii here are unloaded (half the overall diameter); the loaded radius is smaller by
 * the deflection under load, which the tyre model works out from the stiffness.
 */

const MM_PER_IN = 25.4;
const M_PER_IN = 0.0254;

/**
 * Vertical stiffness estimate for a light-truck or off-road tyre at road pressure (N/m): the middle
 * of the 250–450 kN/m range (from memory; REFERENCES.md "Tyres"). Aired down it is well under half.
 */
export const TYRE_STIFFNESS_ESTIMATE_N_PER_M = 350_000;
export const TYRE_STIFFNESS_ESTIMATE_SOURCE =
  'estimate: 350 kN/m, the middle of 250–450 kN/m for light-truck and off-road tyres at road pressure (from memory, not from this tyre; aired down it is well under half)';

/** Rim width plus this is the overall wheel width, in inches (common practice: ~1/2 in of flange each side). */
export const WHEEL_FLANGE_ALLOWANCE_IN = 1;

export type TyreSizeForm = 'metric' | 'flotation' | 'diameter';

export interface TyreSize {
  readonly form: TyreSizeForm;
  /** What was read, tidied (e.g. "LT285/75R16"). */
  readonly designation: string;
  /** Unloaded overall diameter (m). */
  readonly diameterM: number;
  /** Unloaded radius (m) = diameterM / 2. */
  readonly radiusM: number;
  /** Section width (m); null for a bare diameter. */
  readonly widthM: number | null;
  /** Rim diameter (in); null for a bare diameter. */
  readonly rimDiameterIn: number | null;
  /** Aspect ratio (section height / width, percent); metric sizes only. */
  readonly aspectRatioPercent: number | null;
  /** 'radial' (R), 'bias' (- or D), 'bias-belted' (B), or null when not stated. */
  readonly construction: 'radial' | 'bias' | 'bias-belted' | null;
  /** Service prefix: P (passenger), LT (light truck), or null. */
  readonly service: 'P' | 'LT' | null;
  /** Vertical stiffness estimate (N/m) and where it comes from. */
  readonly stiffnessNPerM: number;
  readonly stiffnessSource: string;
}

export type TyreSizeResult =
  | { readonly ok: true; readonly size: TyreSize }
  /** A bare number: the size it would be, and the question to put to the user before using it. */
  | { readonly ok: 'ask'; readonly question: string; readonly ifYes: TyreSize }
  | { readonly ok: false; readonly message: string };

/** Normalises a typed size: trims, upper-cases, unifies the multiplication sign and dashes, drops spaces around separators. */
function tidy(text: string): string {
  return text
    .trim()
    .toUpperCase()
    .replace(/[×*]/g, 'X')
    .replace(/[−–]/g, '-')
    .replace(/\s*([X/R-])\s*/g, '$1')
    .replace(/\s+/g, ' ');
}

const METRIC = /^(P|LT)? ?(\d{3})\/(\d{2,3})(ZR|R|D|B|-)(\d{2}(?:\.\d)?)(LT)?(?: .*)?$/;
const FLOTATION = /^(\d{2}(?:\.\d{1,2})?)X(\d{1,2}(?:\.\d{1,2})?)(R|D|B|-)(\d{2}(?:\.\d)?)(LT)?(?: .*)?$/;
const BARE = /^(\d{2}(?:\.\d{1,2})?)(?: ?(?:IN|INCH|INCHES|"))?$/;

function construction(code: string): TyreSize['construction'] {
  if (code === 'R' || code === 'ZR') return 'radial';
  if (code === 'B') return 'bias-belted';
  return 'bias';
}

function sized(fields: Omit<TyreSize, 'radiusM' | 'stiffnessNPerM' | 'stiffnessSource'>): TyreSize {
  return { ...fields, radiusM: fields.diameterM / 2, stiffnessNPerM: TYRE_STIFFNESS_ESTIMATE_N_PER_M, stiffnessSource: TYRE_STIFFNESS_ESTIMATE_SOURCE };
}

/** Plausible overall diameters for the vehicles Plumbline models (in): a check on typing, not a rule of the trade. */
const MIN_DIAMETER_IN = 18;
const MAX_DIAMETER_IN = 66;

/** Reads a tyre size as the trade writes it. */
export function parseTyreSize(text: string): TyreSizeResult {
  const t = tidy(text);
  if (t === '') return { ok: false, message: 'give a tyre size, e.g. 315/70R17, LT285/75R16 or 35x12.50R17' };
  let m = METRIC.exec(t);
  if (m) {
    const w = Number(m[2]);
    const ar = Number(m[3]);
    const rim = Number(m[5]);
    if (ar < 20 || ar > 110) return { ok: false, message: `aspect ratio ${ar} is outside 20–110 (the section height as a percentage of the width)` };
    const service = m[1] === 'P' ? 'P' : m[1] === 'LT' || m[6] === 'LT' ? 'LT' : null;
    const diameterMm = rim * MM_PER_IN + (2 * w * ar) / 100;
    return {
      ok: true,
      size: sized({
        form: 'metric',
        designation: `${service ?? ''}${w}/${ar}${m[4] === '-' ? '-' : m[4]}${m[5]}`,
        diameterM: diameterMm / 1000,
        widthM: w / 1000,
        rimDiameterIn: rim,
        aspectRatioPercent: ar,
        construction: construction(m[4]),
        service,
      }),
    };
  }
  m = FLOTATION.exec(t);
  if (m) {
    const od = Number(m[1]);
    const w = Number(m[2]);
    const rim = Number(m[4]);
    if (od <= rim) return { ok: false, message: `the overall diameter ${od} in must exceed the rim diameter ${rim} in (flotation sizes read diameter x width R rim)` };
    if (w >= od) return { ok: false, message: `the section width ${w} in must be less than the overall diameter ${od} in` };
    return {
      ok: true,
      size: sized({
        form: 'flotation',
        designation: `${m[1]}x${m[2]}${m[3]}${m[4]}${m[5] ? 'LT' : ''}`,
        diameterM: od * M_PER_IN,
        widthM: w * M_PER_IN,
        rimDiameterIn: rim,
        aspectRatioPercent: null,
        construction: construction(m[3]),
        service: m[5] ? 'LT' : null,
      }),
    };
  }
  m = BARE.exec(t);
  if (m) {
    const od = Number(m[1]);
    if (od < MIN_DIAMETER_IN || od > MAX_DIAMETER_IN) {
      return { ok: false, message: `${od}: a bare number is read as the overall diameter in inches, and ${od} in is outside ${MIN_DIAMETER_IN}–${MAX_DIAMETER_IN} in` };
    }
    const ifYes = sized({
      form: 'diameter',
      designation: `${m[1]} in`,
      diameterM: od * M_PER_IN,
      widthM: null,
      rimDiameterIn: null,
      aspectRatioPercent: null,
      construction: null,
      service: null,
    });
    return {
      ok: 'ask',
      question: `Is ${m[1]} the overall diameter in inches (${(od * MM_PER_IN).toFixed(1)} mm, radius ${((od * MM_PER_IN) / 2).toFixed(1)} mm)? The width stays as it is; give the full size (e.g. ${m[1]}x12.50R17) to set it too.`,
      ifYes,
    };
  }
  return { ok: false, message: `"${text.trim()}" is not a tyre size: write it as 315/70R17, LT285/75R16, 35x12.50R17 or 35x12.5-15` };
}

export interface WheelSize {
  /** Rim (bead seat) diameter (in). */
  readonly rimDiameterIn: number;
  /** Rim width between the flanges (in). */
  readonly rimWidthIn: number;
  /** Offset: mounting face from the rim centre-line, positive toward the outside (mm). */
  readonly offsetMm: number;
  /** Backspacing: mounting face from the back edge of the rim (in), = (rimWidthIn + 1)/2 + offsetMm/25.4 (common practice). */
  readonly backspacingIn: number;
  /** Which of the two was typed (the other is worked out). */
  readonly given: 'offset' | 'backspacing';
  /** In SI for the build form's WheelFitment. */
  readonly rimWidthM: number;
  readonly offsetM: number;
  readonly backspacingM: number;
}

export type WheelSizeResult = { readonly ok: true; readonly wheel: WheelSize } | { readonly ok: false; readonly message: string };

/** Backspacing (in) from rim width (in) and offset (mm): common practice (REFERENCES.md "Wheel fitment"). */
export function backspacingInOf(rimWidthIn: number, offsetMm: number): number {
  return (rimWidthIn + WHEEL_FLANGE_ALLOWANCE_IN) / 2 + offsetMm / MM_PER_IN;
}

/** Offset (mm) from rim width (in) and backspacing (in): the inverse of backspacingInOf. */
export function offsetMmOf(rimWidthIn: number, backspacingIn: number): number {
  return (backspacingIn - (rimWidthIn + WHEEL_FLANGE_ALLOWANCE_IN) / 2) * MM_PER_IN;
}

const WHEEL = /^(\d{2}(?:\.\d)?)X(\d{1,2}(?:\.\d{1,2})?)J?(?: (.*))?$/;

/** Reads a wheel as `17x9 -12`, `17x9 ET-12`, `17x9 offset +25`, `17x8.5 BS 4.5` or `17x9 backspacing 4.5 in`. */
export function parseWheelSize(text: string): WheelSizeResult {
  const t = text.trim().toUpperCase().replace(/[×*]/g, 'X').replace(/[−–]/g, '-').replace(/\s*X\s*/g, 'X').replace(/\s+/g, ' ');
  const m = WHEEL.exec(t);
  if (!m) return { ok: false, message: `"${text.trim()}" is not a wheel size: write it as 17x9 -12 (offset in mm) or 17x9 BS 4.5 (backspacing in inches)` };
  const rimD = Number(m[1]);
  const rimW = Number(m[2]);
  if (rimW < 4 || rimW > 16) return { ok: false, message: `rim width ${rimW} in is outside 4–16 in` };
  const rest = (m[3] ?? '').trim();
  const bs = /^(?:BS|BACKSPACING|BACKSPACE|BACK SPACING) ?(\d{1,2}(?:\.\d{1,3})?) ?(?:IN|INCH|INCHES|")?$/.exec(rest);
  const off = /^(?:ET|OFFSET)? ?([+-]?\d{1,3}(?:\.\d)?) ?(?:MM)?$/.exec(rest);
  let offsetMm: number;
  let backspacingIn: number;
  let given: WheelSize['given'];
  if (bs) {
    backspacingIn = Number(bs[1]);
    if (backspacingIn <= 0 || backspacingIn >= rimW + WHEEL_FLANGE_ALLOWANCE_IN) {
      return { ok: false, message: `backspacing ${backspacingIn} in must lie within the wheel's ${rimW + WHEEL_FLANGE_ALLOWANCE_IN} in overall width` };
    }
    offsetMm = offsetMmOf(rimW, backspacingIn);
    given = 'backspacing';
  } else if (off) {
    offsetMm = Number(off[1]);
    if (Math.abs(offsetMm) > 150) return { ok: false, message: `offset ${offsetMm} mm is outside ±150 mm` };
    backspacingIn = backspacingInOf(rimW, offsetMm);
    given = 'offset';
  } else {
    return { ok: false, message: 'give the offset in mm (e.g. 17x9 -12 or ET-12) or the backspacing in inches (e.g. 17x9 BS 4.5)' };
  }
  return {
    ok: true,
    wheel: {
      rimDiameterIn: rimD,
      rimWidthIn: rimW,
      offsetMm,
      backspacingIn,
      given,
      rimWidthM: rimW * M_PER_IN,
      offsetM: offsetMm / 1000,
      backspacingM: backspacingIn * M_PER_IN,
    },
  };
}
