/**
 * Accurate signed distances of control points and the Newton polish that uses them.
 *
 * The double value of f = dx·(y − oy) − dy·(x − ox) carries an absolute error of a few ε
 * times |d|·max(|x|, |ox|, |y|, |oy|) (the differences and products round). A root near
 * t = 0 is about −f0/g′(0), so when the start point lies close to the line that error is
 * large relative to t, and t loses many ulps in every method that starts from double f.
 * Here the differences and products are taken error-free (Knuth's TwoSum, Dekker's
 * product), so each f is the correctly rounded value up to a few ulps of f itself.
 */
import { evaluateBernsteinCubic, evaluateBernsteinCubicSlope, writeFour } from './bernstein-cubic-fast'
import { SPLITTER } from './float'

/** Newton steps of the polish: one usually suffices from a closed-form root; a second is accepted only if it helps. */
const POLISH_STEPS = 2

/** Accurate sides of the cubic being refined (module-level scratch, filled by {@link computeAccurateSidesInto}). */
const sides = new Float64Array(4)

/**
 * The four accurate control-point sides f = dx·(y − oy) − dy·(x − ox) of the cubic Bézier
 * data[offset .. offset + 8) for probe = (ox, oy, dx, dy), each within a few ulps of its exact
 * value (finite, non-overflowing inputs), into out. The error-free transformations of
 * float.ts (sumError: Knuth's TwoSum; productError: Dekker's product) are written out here so
 * that the loop makes no calls: a double passed to a call V8 does not inline is boxed.
 */
export function computeAccurateSidesInto(data: ArrayLike<number>, offset: number, probe: Float64Array, out: Float64Array): void {
  const ox = probe[0]!, oy = probe[1]!, dx = probe[2]!, dy = probe[3]!
  let split = SPLITTER * dx
  const dxHigh = split - (split - dx), dxLow = dx - dxHigh
  split = SPLITTER * dy
  const dyHigh = split - (split - dy), dyLow = dy - dyHigh
  for (let i = 0; i < 4; i++) {
    const x = data[offset + 2 * i]!, y = data[offset + 2 * i + 1]!
    // ex + exError = x − ox and ey + eyError = y − oy exactly (TwoSum)
    const ex = x - ox
    let virtual = ex - x
    const exError = (x - (ex - virtual)) + (-ox - virtual)
    const ey = y - oy
    virtual = ey - y
    const eyError = (y - (ey - virtual)) + (-oy - virtual)
    // p + pError = dx·ey and q + qError = dy·ex exactly (Dekker)
    const p = dx * ey, q = dy * ex
    split = SPLITTER * ey
    const eyHigh = split - (split - ey), eyLow = ey - eyHigh
    split = SPLITTER * ex
    const exHigh = split - (split - ex), exLow = ex - exHigh
    const pError = dxLow * eyLow - (((p - dxHigh * eyHigh) - dxLow * eyHigh) - dxHigh * eyLow)
    const qError = dyLow * exLow - (((q - dyHigh * exHigh) - dyLow * exHigh) - dyHigh * exLow)
    // head + headError = p − q exactly (TwoSum); the rest is small and summed in double
    const head = p - q
    virtual = head - p
    const headError = (p - (head - virtual)) + (-q - virtual)
    out[i] = head + (headError + pError - qError + dx * eyError - dy * exError)
  }
}

/**
 * An accepted step below this relative size ends the polish: the next could only remove an
 * error of order step²·|g″/g′|, below an ulp unless the root is so ill-conditioned that its
 * error allowance is far larger (as LAST_STEP_SIZE in solve-cubic.ts).
 */
const LAST_STEP_SIZE = 2 ** -30

/**
 * Newton steps from t on the cubic with (accurate) Bernstein coefficients f0..f3, each
 * accepted only when it lowers |g|. Used for roots near t = 0, where the closed form on
 * double sides loses relative accuracy, and for ill-conditioned roots.
 */
function polishOnSides(f0: number, f1: number, f2: number, f3: number, t: number): number {
  let root = t
  let value = evaluateBernsteinCubic(f0, f1, f2, f3, root)
  for (let step = 0; step < POLISH_STEPS && value !== 0; step++) {
    const slope = evaluateBernsteinCubicSlope(f0, f1, f2, f3, root)
    if (slope === 0) break
    const change = value / slope
    const next = root - change
    const nextValue = evaluateBernsteinCubic(f0, f1, f2, f3, next)
    if (!(Math.abs(nextValue) < Math.abs(value))) break
    root = next
    value = nextValue
    if (Math.abs(change) <= LAST_STEP_SIZE * Math.abs(root)) break
  }
  return root
}

/**
 * Roots below this are polished on accurate sides: their ulp is below ε/16, while the
 * rounding of double sides leaves an absolute error of a few ε.
 */
const NEAR_START = 1 / 8
/**
 * Roots where |g′(t)| is below this fraction of max|f| are polished too: the power-basis
 * rounding (≈ 8ε·max|f|) then costs more than 32ε in t, i.e. over 64 ulps near t = 1.
 */
const ILL_CONDITIONED = 1 / 4

/** Probe (ox, oy, dx, dy) and double sides handed over by {@link refineCubicRoots} (module-level scratch). */
const probeScratch = new Float64Array(4)
const sidesScratch = new Float64Array(4)

/**
 * Refines, in place, the ascending roots[0 .. count) in [0, 1] of the cubic with double
 * sides f0..f3 where the closed form on those sides is least accurate (near t = 0, or a
 * small slope), keeping them clamped to [0, 1] and ascending.
 */
export function refineCubicRoots(
  data: ArrayLike<number>, offset: number, ox: number, oy: number, dx: number, dy: number,
  f0: number, f1: number, f2: number, f3: number, roots: Float64Array, count: number,
): void {
  if (count === 0) return
  writeFour(probeScratch, ox, oy, dx, dy)
  writeFour(sidesScratch, f0, f1, f2, f3)
  refineCubicRootsOnSides(data, offset, probeScratch, sidesScratch, roots, count)
}

/**
 * {@link refineCubicRoots} with the probe (ox, oy, dx, dy) and the double sides f0..f3 in
 * typed arrays, so that the hot loop boxes no doubles. Only the check runs here; the rarer
 * polish is a function of its own.
 */
export function refineCubicRootsOnSides(
  data: ArrayLike<number>, offset: number, probe: Float64Array, doubleSides: Float64Array, roots: Float64Array, count: number,
): void {
  let needed = 0
  for (let i = 0; i < count; i++) needed |= needsAccuratePolish(doubleSides, roots[i]!)
  if (needed !== 0) polishOnAccurateSides(data, offset, probe, doubleSides, roots, count)
}

/**
 * 1 when root t of the cubic with double sides f0..f3 is near t = 0 or ill-conditioned (see
 * NEAR_START, ILL_CONDITIONED), else 0; computed without branches (0/1 flags, and max|f| as
 * (x + y + |x − y|)/2, which is the larger up to an ulp: ample for a threshold).
 */
function needsAccuratePolish(doubleSides: Float64Array, t: number): number {
  const f0 = doubleSides[0]!, f1 = doubleSides[1]!, f2 = doubleSides[2]!, f3 = doubleSides[3]!
  const m0 = Math.abs(f0), m1 = Math.abs(f1), m2 = Math.abs(f2), m3 = Math.abs(f3)
  const m01 = m0 + m1 + Math.abs(m0 - m1), m23 = m2 + m3 + Math.abs(m2 - m3)
  const limit = 0.25 * ILL_CONDITIONED * (m01 + m23 + Math.abs(m01 - m23))
  return (+(t > 0) & +(t < NEAR_START)) | +(Math.abs(evaluateBernsteinCubicSlope(f0, f1, f2, f3, t)) < limit)
}

/** Polishes the roots that need it on the accurate sides (computed once), clamped to [0, 1], then re-sorts. */
function polishOnAccurateSides(
  data: ArrayLike<number>, offset: number, probe: Float64Array, doubleSides: Float64Array, roots: Float64Array, count: number,
): void {
  computeAccurateSidesInto(data, offset, probe, sides)
  for (let i = 0; i < count; i++) {
    const t = roots[i]!
    if (needsAccuratePolish(doubleSides, t) !== 0) roots[i] = Math.min(1, Math.max(0, polishOnSides(sides[0]!, sides[1]!, sides[2]!, sides[3]!, t)))
  }
  for (let i = 1; i < count; i++) {
    const t = roots[i]!
    let j = i - 1
    while (j >= 0 && roots[j]! > t) { roots[j + 1] = roots[j]!; j-- }
    roots[j + 1] = t
  }
}
