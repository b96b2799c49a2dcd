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
import { productError, sumError } from './float'

const sides = new Float64Array(4)

/** f = dx·(y − oy) − dy·(x − ox) within a few ulps of its exact value (finite, non-overflowing inputs). */
export function computeAccurateSide(x: number, y: number, ox: number, oy: number, dx: number, dy: number): number {
  const ex = x - ox
  const exError = sumError(x, -ox, ex)
  const ey = y - oy
  const eyError = sumError(y, -oy, ey)
  const p = dx * ey
  const q = dy * ex
  const head = p - q
  const tail = sumError(p, -q, head) + productError(dx, ey, p) - productError(dy, ex, q) + dx * eyError - dy * exError
  return head + tail
}

/** Newton steps of the polish: one usually suffices from a closed-form root; a second is accepted only if it helps. */
const POLISH_STEPS = 2

/**
 * Polishes a root t of g(t) = d × (P(t) − o) on the cubic Bézier data[offset .. offset + 8)
 * by Newton steps on g evaluated from accurate control-point sides (Bernstein form), each
 * accepted only when it lowers |g|. Used for roots near t = 0, where the closed form on
 * double sides loses relative accuracy.
 */
export function polishCubicRoot(
  data: ArrayLike<number>, offset: number, ox: number, oy: number, dx: number, dy: number, t: number,
): number {
  for (let i = 0; i < 4; i++) sides[i] = computeAccurateSide(data[offset + 2 * i], data[offset + 2 * i + 1], ox, oy, dx, dy)
  const f0 = sides[0], f1 = sides[1], f2 = sides[2], f3 = sides[3]
  const g = (x: number): number => {
    const u = 1 - x
    return u * u * u * f0 + 3 * u * x * (u * f1 + x * f2) + x * x * x * f3
  }
  let root = t
  let value = g(root)
  for (let step = 0; step < POLISH_STEPS && value !== 0; step++) {
    const u = 1 - root
    const slope = 3 * (u * u * (f1 - f0) + 2 * u * root * (f2 - f1) + root * root * (f3 - f2))
    if (slope === 0) break
    const next = root - value / slope
    const nextValue = g(next)
    if (!(Math.abs(nextValue) < Math.abs(value))) break
    root = next
    value = nextValue
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

/**
 * Refines, in place, the ascending roots[0 .. count) in [0, 1] of the cubic with double
 * sides f0..f3 where the closed form on those sides is least accurate (near t = 0, or a
 * small slope), keeping them clamped to [0, 1] and ascending.
 */
export function refineCubicRoots(
  data: ArrayLike<number>, offset: number, ox: number, oy: number, dx: number, dy: number,
  f0: number, f1: number, f2: number, f3: number, roots: Float64Array, count: number,
): void {
  const scale = Math.max(Math.abs(f0), Math.abs(f1), Math.abs(f2), Math.abs(f3))
  let polished = false
  for (let i = 0; i < count; i++) {
    const t = roots[i], u = 1 - t
    const slope = 3 * (u * u * (f1 - f0) + 2 * u * t * (f2 - f1) + t * t * (f3 - f2))
    if ((t > 0 && t < NEAR_START) || Math.abs(slope) < ILL_CONDITIONED * scale) {
      roots[i] = Math.min(1, Math.max(0, polishCubicRoot(data, offset, ox, oy, dx, dy, t)))
      polished = true
    }
  }
  if (!polished) return
  for (let i = 1; i < count; i++) {
    const t = roots[i]
    let j = i - 1
    while (j >= 0 && roots[j] > t) { roots[j + 1] = roots[j]; j-- }
    roots[j + 1] = t
  }
}
