/**
 * ULP arithmetic for tests, written from the IEEE-754 bit layout (independent of the
 * solver's own helpers in shared/geometry/internal/float.ts).
 */
const view = new DataView(new ArrayBuffer(8))

/** The bits of x as an integer that grows with x across the whole line (−0 and +0 both 0). */
function orderedBits(x: number): bigint {
  view.setFloat64(0, x)
  const bits = view.getBigInt64(0)
  return bits < 0n ? -(bits & 0x7fffffffffffffffn) : bits
}

/** Number of doubles strictly between x and y, plus one (0 when equal). Finite inputs only. */
export function ulpDistance(x: number, y: number): number {
  if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError(`ulpDistance expects finite numbers, got ${x}, ${y}`)
  const d = orderedBits(x) - orderedBits(y)
  return Number(d < 0n ? -d : d)
}

/** The gap between |x| and the next larger double: 2^(e−52) for |x| in [2^e, 2^(e+1)), 2^-1074 below 2^-1022. */
export function ulpOf(x: number): number {
  view.setFloat64(0, Math.abs(x))
  const biased = Number((view.getBigUint64(0) >> 52n) & 0x7ffn)
  if (biased === 0x7ff) return Number.NaN
  return biased <= 1 ? 2 ** -1074 : 2 ** (biased - 1075)
}
