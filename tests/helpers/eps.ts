/**
 * Tolerances of the core verification suite, in one place (EXAMPLES.md §8). Each says what it
 * bounds and why it is that size.
 */

const DEG = Math.PI / 180;

/** Tip and lift angles of a rigid vehicle against the closed forms (SSF, Gillespie ch. 2): 0.05°. */
export const EPS_TIP_RAD = 0.05 * DEG;
/** Tip angle of a wide rigid tyre against the outer-tread-edge pivot estimate: 0.1°. */
export const EPS_WIDE_TIP_RAD = 0.1 * DEG;
/** Force-angle margin through the solver against (tip angle − tilt): 0.1°. */
export const EPS_FORCE_ANGLE_RAD = 0.1 * DEG;
/** Axle loads on a grade against Gillespie ch. 2, as a fraction of the weight: 0.5 %. */
export const EPS_GRADE_LOAD_FRACTION = 0.005;
/** Compliant tip angle against the small-angle tilt-table estimate (REFERENCES "Compliance lowers the limit"): 1.5°. */
export const EPS_COMPLIANT_TIP_RAD = 1.5 * DEG;
/** Residual bound of a converged solve (issue requirement): forces 1e-6·W, moments 1e-6·W·L. */
export const EPS_RESIDUAL_REL = 1e-6;
/** Loads that must agree between equivalent solves, as a fraction of the weight. */
export const EPS_LOAD_REL = 1e-6;
/** Closed-form margins on a box (REFERENCES "Tip-over margins"), printed to 4 decimals: half a unit of the last place. */
export const EPS_MARGIN_M = 5e-5;
export const EPS_MARGIN_ANGLE_RAD = 0.005 * DEG;
/** Tyre vertical stiffness after calibration, relative: 2 %. */
export const EPS_TYRE_STIFFNESS_REL = 0.02;
/** Terrain heights against hand values (m): exact arithmetic up to rounding. */
export const EPS_HEIGHT_M = 1e-12;
/** Terrain gradient against central finite differences, relative (to max(1, |g|)). */
export const EPS_GRADIENT_REL = 1e-6;
