/**
 * Tolerances of the probe–path intersection, each relative to the magnitude L of the
 * coordinates involved (the largest |coordinate| of the path and the probe's origin).
 */

/**
 * A point P is on the probe when |direction × (P − origin)| ≤ ON_PROBE_REL · |direction| · L.
 * Derivation: the cross product of two differences carries ≤ 3ε·|d|·L of rounding and a
 * Bézier or arc point evaluated at t carries ≤ ~4ε·L more; 2^-46 = 64ε leaves a factor ~9.
 */
export const ON_PROBE_REL = 2 ** -46

/**
 * Roots of a segment's polynomial up to ROOT_T_SLACK outside [0, 1] are clamped in.
 * Derivation: a well-conditioned root from the closed form is within a few hundred ε of
 * its exact value; 2^-40 ≈ 4096ε covers that and stays far below any meaningful t.
 */
export const ROOT_T_SLACK = 2 ** -40

/**
 * A hit counts as inside a probe's range [sMin, sMax] when it is outside by at most
 * PROBE_END_REL · L / |direction| in s (and is then clamped onto the range); the same
 * distance PROBE_END_REL · L decides that a point lies on a path's boundary.
 * Derivation: s of a meeting point is a projection of a point carrying ~4ε·L of error, so
 * a probe ending exactly at a vertex sees it within ~8ε·L; 2^-40 ≈ 4096ε is ample and still
 * 1e-12 relative.
 */
export const PROBE_END_REL = 2 ** -40
