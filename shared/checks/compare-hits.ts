/**
 * Comparing the hits of one probe line with the hits a check expects there. Pure functions
 * on plain data, shared by the server (runs) and the client (showing a diff).
 */
import type { Hit } from '../geometry'

/** How far a hit may be from the expected one and still be the same hit. Both are ≥ 0. */
export interface HitTolerance {
  /** Distance between the points, in path units. */
  readonly point: number
  /** Difference of the segment parameter t (and of tEnd for overlaps). */
  readonly t: number
}

/** Which properties of a paired hit must also agree. */
export interface HitMatchRules {
  readonly matchKinds: boolean
  readonly matchWinding: boolean
}

/**
 * - `missing`: an expected hit with no actual hit on its segment left to pair with;
 * - `extra`: an actual hit that no expected hit paired with;
 * - `moved`: a pair on the same segment beyond the tolerance;
 * - `kind` / `winding`: a pair (in or beyond tolerance) whose kind or winding differs, when the rules ask.
 */
export type HitDifferenceKind = 'missing' | 'extra' | 'moved' | 'kind' | 'winding'

export const HIT_DIFFERENCE_KINDS: readonly HitDifferenceKind[] = ['missing', 'extra', 'moved', 'kind', 'winding']

export interface HitDifference {
  readonly kind: HitDifferenceKind
  readonly expected: Hit | null
  readonly actual: Hit | null
  /** Distance between the two points of a pair; null for missing and extra. */
  readonly distance: number | null
  /** |Δt| of a pair (for two overlaps the larger of |Δt| and |ΔtEnd|); null for missing and extra. */
  readonly tError: number | null
}

interface Pairing {
  readonly expectedIndex: number
  readonly actualIndex: number
  readonly distance: number
  readonly tError: number
}

function measurePair(expected: Hit, actual: Hit): { distance: number; tError: number } {
  const distance = Math.hypot(actual.point[0] - expected.point[0], actual.point[1] - expected.point[1])
  let tError = Math.abs(actual.t - expected.t)
  if (expected.tEnd !== undefined && actual.tEnd !== undefined) tError = Math.max(tError, Math.abs(actual.tEnd - expected.tEnd))
  return { distance, tError }
}

/**
 * Greedy pairing, nearest points first: every candidate pair on the same segment that `accept`
 * admits, sorted by distance (then |Δt|, then index, so the result is deterministic), taken
 * while both of its hits are still free.
 */
function pairNearest(
  expected: readonly Hit[],
  actual: readonly Hit[],
  freeExpected: boolean[],
  freeActual: boolean[],
  accept: (distance: number, tError: number) => boolean,
): Pairing[] {
  const candidates: Pairing[] = []
  expected.forEach((e, i) => {
    if (!freeExpected[i]) return
    actual.forEach((a, j) => {
      if (!freeActual[j] || a.segment !== e.segment) return
      const { distance, tError } = measurePair(e, a)
      if (accept(distance, tError)) candidates.push({ expectedIndex: i, actualIndex: j, distance, tError })
    })
  })
  candidates.sort((p, q) => p.distance - q.distance || p.tError - q.tError || p.expectedIndex - q.expectedIndex || p.actualIndex - q.actualIndex)
  const taken: Pairing[] = []
  for (const c of candidates) {
    if (!freeExpected[c.expectedIndex] || !freeActual[c.actualIndex]) continue
    freeExpected[c.expectedIndex] = false
    freeActual[c.actualIndex] = false
    taken.push(c)
  }
  return taken
}

function assertTolerance(tolerance: HitTolerance): void {
  for (const key of ['point', 't'] as const) {
    const value = tolerance[key]
    if (!Number.isFinite(value) || value < 0) throw new RangeError(`tolerance.${key} must be a finite number ≥ 0, got ${value}`)
  }
}

/**
 * The differences between the hits one probe line is expected to have and the hits it has.
 * Hits pair only on the same segment. First, pairs within the tolerance (distance ≤
 * tolerance.point and |Δt| ≤ tolerance.t, both inclusive) are taken greedily, nearest points
 * first; then the hits left over pair the same way at any distance, and each such pair is
 * `moved`. What is still unpaired is `missing` (expected) or `extra` (actual). Every pair is
 * also compared on kind and winding when the rules say so. The differences come in the
 * order of their hits along the probe (s of the expected hit, else of the actual one);
 * identical lists give []. RangeError for a negative or non-finite tolerance.
 * @example compareHits([hitAt(5, 0)], [hitAt(5.5, 0)], { point: 0.1, t: 1 }, rules) // [{ kind: 'moved', distance: 0.5, … }]
 */
export function compareHits(
  expected: readonly Hit[],
  actual: readonly Hit[],
  tolerance: HitTolerance,
  rules: HitMatchRules,
): HitDifference[] {
  assertTolerance(tolerance)
  const freeExpected = expected.map(() => true)
  const freeActual = actual.map(() => true)
  const close = pairNearest(expected, actual, freeExpected, freeActual, (d, dt) => d <= tolerance.point && dt <= tolerance.t)
  const moved = pairNearest(expected, actual, freeExpected, freeActual, () => true)
  const found: Array<HitDifference & { at: number }> = []
  const add = (kind: HitDifferenceKind, e: Hit | null, a: Hit | null, distance: number | null, tError: number | null) =>
    found.push({ kind, expected: e, actual: a, distance, tError, at: (e ?? a as Hit).s })
  for (const [pairs, isMoved] of [[close, false], [moved, true]] as const) {
    for (const p of pairs) {
      const e = expected[p.expectedIndex], a = actual[p.actualIndex]
      if (isMoved) add('moved', e, a, p.distance, p.tError)
      if (rules.matchKinds && e.kind !== a.kind) add('kind', e, a, p.distance, p.tError)
      if (rules.matchWinding && e.winding !== a.winding) add('winding', e, a, p.distance, p.tError)
    }
  }
  expected.forEach((e, i) => freeExpected[i] && add('missing', e, null, null, null))
  actual.forEach((a, j) => freeActual[j] && add('extra', null, a, null, null))
  // Array.prototype.sort is stable, so differences at one s keep the order they were found in.
  found.sort((p, q) => p.at - q.at)
  return found.map(({ at: _at, ...difference }) => difference)
}

/** How many differences of each kind a list has (every kind present, 0 when none). */
export function countDifferences(differences: readonly { readonly kind: HitDifferenceKind }[]): Record<HitDifferenceKind, number> {
  const counts = { missing: 0, extra: 0, moved: 0, kind: 0, winding: 0 }
  for (const d of differences) counts[d.kind]++
  return counts
}

/** A short summary of differences for people, e.g. "1 moved, 2 missing"; "no differences" for none. */
export function describeDifferences(differences: readonly { readonly kind: HitDifferenceKind }[]): string {
  const counts = countDifferences(differences)
  const words: Record<HitDifferenceKind, string> = { missing: 'missing', extra: 'extra', moved: 'moved', kind: 'changed kind', winding: 'changed winding' }
  const parts = HIT_DIFFERENCE_KINDS.filter((k) => counts[k] > 0).map((k) => `${counts[k]} ${words[k]}`)
  return parts.length ? parts.join(', ') : 'no differences'
}

/**
 * Why a check result failed, for people: its error when it could not be computed, else its
 * differences summarised ("1 moved, 2 missing"), or only their number when the list was cut.
 */
export function describeCheckOutcome(result: {
  readonly error: string | null
  readonly differences: readonly { readonly kind: HitDifferenceKind }[]
  readonly differenceCount: number
}): string {
  if (result.error !== null) return result.error
  return result.differences.length === result.differenceCount ? describeDifferences(result.differences) : `${result.differenceCount} differences`
}
