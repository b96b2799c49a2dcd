/**
 * Types and sign conventions of the geometry core, stated once.
 *
 * Coordinates are the path's own: SVG user units with y growing downwards. A probe's
 * points are `origin + s·direction`; a segment's points are `P(t)` with 0 ≤ t ≤ 1.
 * The winding sign of a hit is the sign of `direction × tangent = dx·ty − dy·tx`.
 */

/** One real root of a polynomial with its multiplicity (1, 2 or 3). */
export interface Root {
  readonly t: number
  readonly multiplicity: 1 | 2 | 3
}

/** The answer of the cubic solver, shaped as the public computation API returns it. */
export interface CubicSolution {
  /** Effective degree after negligible leading coefficients are dropped. */
  readonly degree: 0 | 1 | 2 | 3
  /** True when all four coefficients are zero: every t solves it. */
  readonly identicallyZero: boolean
  /** 18abcd − 4b³d + b²c² − 4ac³ − 27a²d² for degree 3, b² − 4ac for degree 2, else null. */
  readonly discriminant: number | null
  /** Distinct real roots, ascending. */
  readonly roots: readonly Root[]
}
