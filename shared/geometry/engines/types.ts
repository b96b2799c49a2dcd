/**
 * One interface for every engine that intersects a probe line with a cubic Bézier, so the
 * closed form and the numeric methods can be compared on the same pairs.
 */

export type EngineName = 'closed-form' | 'subdivision' | 'newton' | 'bezier-js' | 'mathjs'

export interface IntersectionEngine {
  readonly name: EngineName
  /** One sentence on the method, for reports. */
  readonly description: string
  /**
   * Parameters t ∈ [0, 1] where the cubic Bézier data[offset .. offset + 8) (x0, y0, …, x3, y3)
   * meets the probe line origin + s·direction with sMin ≤ s ≤ sMax (ray: 0, ∞; line: −∞, ∞;
   * segment: 0, 1). Writes them ascending into out (length ≥ 3) and returns the count.
   * A cubic lying along the line yields 0 (an overlap is not a set of roots).
   */
  intersectCubic(
    data: ArrayLike<number>, offset: number,
    ox: number, oy: number, dx: number, dy: number,
    sMin: number, sMax: number,
    out: Float64Array,
  ): number
}
