/** Small helpers shared by the geometry tests. */
import { expect } from 'vitest'
import { parsePathData } from '../../../shared/geometry/index'
import type { NormalisedPath } from '../../../shared/geometry/index'

/** Parses path data that the test knows to be valid. */
export function pathOf(pathData: string): NormalisedPath {
  const result = parsePathData(pathData)
  if (!result.ok) throw new Error(`test path did not parse: ${result.error.message}`)
  return result.path
}

/** Asserts |actual − expected| ≤ tolerance, printing both on failure. */
export function expectClose(actual: number, expected: number, tolerance: number, label = ''): void {
  const error = Math.abs(actual - expected)
  if (!(error <= tolerance)) {
    throw new Error(`${label} expected ${expected} ± ${tolerance}, got ${actual} (error ${error})`)
  }
  expect(error).toBeLessThanOrEqual(tolerance)
}

/** Distance from (x, y) to the line through (ox, oy) with direction (dx, dy). */
export function distanceToLine(x: number, y: number, ox: number, oy: number, dx: number, dy: number): number {
  return Math.abs(dx * (y - oy) - dy * (x - ox)) / Math.hypot(dx, dy)
}
